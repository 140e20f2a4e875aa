import { beforeAll, describe, expect, it } from 'vitest';
import { signedInAll, type Client, type DemoPerson } from '../support/http';

let as: Record<DemoPerson | 'anonymous', Client>;

beforeAll(async () => {
  as = await signedInAll();
});

// Every page whose data only studio managers may read (lib/auth/policy.ts).
const MANAGER_PAGES = ['/fleet', '/recorders', '/specs', '/specs/new', '/team', '/audit', '/outbox'];

describe('manager pages opened by another role', () => {
  for (const path of MANAGER_PAGES) {
    it(`${path}: 403 with a plain explanation and a way back for a producer and an engineer; 200 for a manager`, async () => {
      for (const person of ['producer', 'engineer'] as const) {
        const response = await as[person].fetch(path);
        expect(response.status, `${person} on ${path}`).toBe(403);
        const html = await response.text();
        expect(html).toContain('Only studio managers can see this page');
        // The page is rendered from the server's payload: its words are in the answer; the browser test checks what shows.
        expect(html).toContain('Back to the overview');
      }
      expect((await as.manager.fetch(path)).status).toBe(200);
    });
  }
});
