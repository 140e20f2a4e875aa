import { execFileSync } from 'node:child_process';
import { mkdirSync, readdirSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client, DEMO } from '../../support/http';
import { makeWav } from '../../support/takes';
import { startExtraServer } from '../../support/testServices';

// A real full disk: a 2 MiB tmpfs as the storage folder of a second server from the same build, on local-disk storage.
const smallDisk = path.resolve(process.env.TAKEPROOF_TEST_DIR ?? 'var/test', 'small-disk');
let server: Awaited<ReturnType<typeof startExtraServer>> | null = null;

beforeAll(async () => {
  mkdirSync(smallDisk, { recursive: true });
  execFileSync('mount', ['-t', 'tmpfs', '-o', 'size=2m', 'tmpfs', smallDisk]);
  server = await startExtraServer(Number(process.env.PORT ?? 3100) + 40, { STORAGE_DRIVER: 'local', STORAGE_DIR: smallDisk });
});

afterAll(() => {
  server?.child.kill('SIGTERM');
  try {
    execFileSync('umount', [smallDisk]);
  } catch {
    // already unmounted
  }
});

function filesOnSmallDisk(): string[] {
  const out: string[] = [];
  const walk = (dir: string) => {
    for (const e of readdirSync(dir, { withFileTypes: true })) {
      if (e.isDirectory()) walk(path.join(dir, e.name));
      else out.push(e.name);
    }
  };
  walk(smallDisk);
  return out;
}

describe('fault drill: the disk fills up during an upload', () => {
  it('refuses the upload with 507 and a plain message, and keeps no partial file and no take', async () => {
    const client = new Client(server!.url);
    await client.signIn(DEMO.engineer);
    const created = await client.fetch('/api/sessions', { method: 'POST', json: { title: 'Full disk drill' } });
    const { id: sessionId } = await created.json();
    const form = new FormData();
    form.append('file', new Blob([new Uint8Array(makeWav({ seconds: 30, seed: 777 }))]), 'long-take.wav');
    const response = await client.fetch(`/api/sessions/${sessionId}/takes`, { method: 'POST', body: form });
    expect(response.status).toBe(507);
    expect((await response.json()).message).toMatch(/storage is full/);
    expect(filesOnSmallDisk()).toEqual([]);
    const takes = await (await client.fetch(`/api/sessions/${sessionId}/takes`)).json();
    expect(takes.takes).toEqual([]);
    // A file that fits still goes in.
    const small = new FormData();
    small.append('file', new Blob([new Uint8Array(makeWav({ seconds: 1, seed: 778 }))]), 'short-take.wav');
    expect((await client.fetch(`/api/sessions/${sessionId}/takes`, { method: 'POST', body: small })).status).toBe(201);
  });
});
