import { beforeAll, describe, expect, it } from 'vitest';
import { signedInAll, type Client, type DemoPerson } from '../support/http';
import type { AuditEntry } from '@/lib/audit/views';

let as: Record<DemoPerson | 'anonymous', Client>;
let engineerId: number;
const created: number[] = [];
const stamp = Date.now().toString(36);
/** The UTC days the probe sessions were created on (two when the set-up runs across midnight). */
let firstDay: string;
let lastDay: string;
const utcDay = () => new Date().toISOString().slice(0, 10);

type Entry = AuditEntry;

async function audit(client: Client, query: string) {
  const response = await client.fetch(`/api/audit${query}`);
  return { status: response.status, body: await response.json() };
}

beforeAll(async () => {
  as = await signedInAll();
  const users = (await (await as.manager.fetch('/api/users')).json()).users as { id: number; email: string }[];
  engineerId = users.find((u) => u.email === 'engineer@demo.test')!.id;
  // 52 sessions by the engineer (more than one page of 50), then a change by the manager.
  firstDay = utcDay();
  for (let i = 0; i < 52; i++) {
    const r = await as.engineer.fetch('/api/sessions', { method: 'POST', json: { title: `Audit probe ${stamp} #${i}` } });
    created.push((await r.json()).id);
  }
  lastDay = utcDay();
  await as.manager.fetch(`/api/sessions/${created[0]}`, { method: 'PATCH', json: { notes: 'Checked.' } });
});

describe('GET /api/audit', () => {
  it('filters by action and person, newest first, 50 a page', async () => {
    const first = await audit(as.manager, `?action=session.create&actorId=${engineerId}`);
    expect(first.status).toBe(200);
    const events = first.body.events as Entry[];
    expect(first.body.pageSize).toBe(50);
    expect(events).toHaveLength(50);
    expect(first.body.total).toBeGreaterThanOrEqual(52);
    expect(events.every((e) => e.action === 'session.create' && e.actor?.id === engineerId && e.actor.name === 'Ines Varga')).toBe(true);
    for (let i = 1; i < events.length; i++) {
      expect(Date.parse(events[i - 1].at) > Date.parse(events[i].at) || (events[i - 1].at === events[i].at && events[i - 1].id > events[i].id)).toBe(true);
    }
    const second = await audit(as.manager, `?action=session.create&actorId=${engineerId}&page=2`);
    const ids = new Set(events.map((e) => e.id));
    expect((second.body.events as Entry[]).some((e) => ids.has(e.id))).toBe(false);
    expect(second.body.events.length).toBeGreaterThanOrEqual(2);
    // Other test files create sessions as the engineer meanwhile, so page on until all of ours were seen,
    // and check that ours come newest first among the rest.
    const seen = [...events, ...second.body.events].map((e: Entry) => e.subjectId);
    for (let page = 3; page <= 20 && !created.every((id) => seen.includes(id)); page++) {
      seen.push(...((await audit(as.manager, `?action=session.create&actorId=${engineerId}&page=${page}`)).body.events as Entry[]).map((e) => e.subjectId));
    }
    const ours = seen.filter((id) => id !== null && created.includes(id));
    expect(ours).toEqual([...created].reverse());
  });

  it('filters by object type and by date range', async () => {
    const updates = await audit(as.manager, '?action=session.update&subjectType=session');
    expect((updates.body.events as Entry[]).some((e) => e.subjectId === created[0] && e.actor?.name === 'Maren Lindqvist')).toBe(true);
    const users = await audit(as.manager, '?subjectType=user');
    expect((users.body.events as Entry[]).every((e) => e.subjectType === 'user')).toBe(true);

    const inRange = await audit(as.manager, `?action=session.create&from=${firstDay}&to=${lastDay}`);
    expect(inRange.body.total).toBeGreaterThanOrEqual(52);
    const past = await audit(as.manager, '?from=2020-01-01&to=2020-01-31');
    expect(past.status).toBe(200);
    expect(past.body).toMatchObject({ total: 0, events: [] });
    const nothing = await audit(as.manager, '?action=no.such.action');
    expect(nothing.body.total).toBe(0);
  });

  it('refuses bad filters with field errors', async () => {
    const backwards = await audit(as.manager, '?from=2026-12-05&to=2026-12-01');
    expect(backwards.status).toBe(400);
    expect(backwards.body.fields).toEqual({ to: ['The start date is after the end date'] });
    const badDate = await audit(as.manager, '?from=yesterday');
    expect(badDate.status).toBe(400);
    expect(badDate.body.fields.from).toEqual(['Use a date like 2026-12-02']);
  });

  it('is for managers only and shows each studio only its own events', async () => {
    expect((await audit(as.anonymous, '')).status).toBe(401);
    expect((await audit(as.engineer, '')).status).toBe(403);
    expect((await audit(as.producer, '')).body.error).toBe('forbidden:audit:view');
    const theirs = await audit(as.outsider, '?action=session.create');
    expect(theirs.status).toBe(200);
    expect((theirs.body.events as Entry[]).some((e) => created.includes(e.subjectId!))).toBe(false);
    const byEngineer = await audit(as.outsider, `?actorId=${engineerId}`);
    expect(byEngineer.body.total).toBe(0);
  });

  it('renders the audit log page with the filters applied', async () => {
    const page = await as.manager.fetch(`/audit?action=session.update&subjectType=session`);
    expect(page.status).toBe(200);
    const html = await page.text();
    expect(html).toContain('Audit log');
    // In words: the object by its title, the action as a phrase, never a code or a database id.
    expect(html).toContain(`“Audit probe ${stamp} #0”`);
    expect(html).not.toContain(`“Audit probe ${stamp} #1”`);
    expect(html).toContain('Changed a session');
    expect(html).toContain('changed notes');
    expect(html).not.toContain('>session.update<');
    expect(html).not.toContain(`#${created[0]}<`);
  });
});
