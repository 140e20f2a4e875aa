import { createHash } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import * as tus from 'tus-js-client';
import { db } from '@/lib/db/connection.server';
import { Take } from '@/models';
import { objectSha256 } from '../support/bucket';
import { BASE_URL, signedIn, type Client } from '../support/http';
import { makeWav, newSession, waitForTake } from '../support/takes';

// Resumable uploads follow the tus protocol 1.0.0 (tus.io: creation, HEAD for the offset, PATCH
// from it); the client side here is the protocol's own JavaScript client, tus-js-client.
let engineer: Client;
let sessionId: number;
const take = makeWav({ seconds: 20, seed: 7701 });
const sha256 = createHash('sha256').update(take).digest('hex');
const half = Math.floor(take.length / 2);

function tusOptions(client: Client, extra: Partial<tus.UploadOptions>): tus.UploadOptions {
  return {
    endpoint: `${BASE_URL}/api/sessions/${sessionId}/uploads`,
    headers: { cookie: client.cookieHeader(), origin: BASE_URL },
    metadata: { filename: 'cliff-path-walk.wav', sha256 },
    retryDelays: [],
    storeFingerprintForResuming: false,
    ...extra,
  };
}

/** Runs one tus upload until it succeeds, fails, or `stopAfterBytes` are acknowledged (then it is abandoned as a dropped connection would). */
function run(client: Client, extra: Partial<tus.UploadOptions>, stopAfterBytes = Infinity) {
  return new Promise<{ url: string | null; sentInThisRun: number; body: string | null; error: Error | null }>((resolve) => {
    let sentInThisRun = 0;
    const upload: tus.Upload = new tus.Upload(
      take,
      tusOptions(client, {
        ...extra,
        onChunkComplete: (chunk) => {
          sentInThisRun += chunk;
          if (sentInThisRun >= stopAfterBytes) void upload.abort().then(() => resolve({ url: upload.url, sentInThisRun, body: null, error: null }));
        },
        onSuccess: (payload) => resolve({ url: upload.url, sentInThisRun, body: payload.lastResponse.getBody(), error: null }),
        onError: (error) => resolve({ url: upload.url, sentInThisRun, body: null, error }),
      }),
    );
    upload.start();
  });
}

beforeAll(async () => {
  db();
  engineer = await signedIn('engineer');
  sessionId = await newSession(engineer, 'Resumable uploads — cliff path walk');
});
afterAll(async () => {
  await db().close();
});

describe('resumable uploads (tus)', () => {
  it('resumes an upload cut off half way, sends only the missing half, and ends in one verified take', async () => {
    const first = await run(engineer, { chunkSize: half }, half);
    expect(first.error).toBeNull();
    expect(first.sentInThisRun).toBe(half);
    expect(first.url).toMatch(new RegExp(`/api/sessions/${sessionId}/uploads/[0-9a-f]{32}$`));

    // The server kept the first half: HEAD answers its offset (tus 1.0.0 §HEAD).
    const head = await engineer.fetch(new URL(first.url!).pathname, { method: 'HEAD', headers: { 'tus-resumable': '1.0.0' } });
    expect(head.status).toBe(200);
    expect(head.headers.get('upload-offset')).toBe(String(half));
    expect(head.headers.get('upload-length')).toBe(String(take.length));

    const resumed = await run(engineer, { uploadUrl: first.url, chunkSize: take.length });
    expect(resumed.error).toBeNull();
    expect(resumed.sentInThisRun).toBe(take.length - half);
    const created = JSON.parse(resumed.body!).takes[0];
    expect(created.sha256).toBe(sha256);
    expect(created.bytes).toBe(take.length);
    const row = await Take.findByPk(created.id, { rejectOnEmpty: true });
    expect(await objectSha256(row.storageKey)).toBe(sha256);
    expect((await waitForTake(engineer, created.id)).status).toBe('measured');
    // The finished upload is gone from the resumable store.
    const after = await engineer.fetch(new URL(first.url!).pathname, { method: 'HEAD', headers: { 'tus-resumable': '1.0.0' } });
    expect(after.status).toBe(404);
  });

  it('keeps an unfinished upload to the person and session that started it', async () => {
    const started = await run(engineer, { chunkSize: half, metadata: { filename: 'private.wav' } }, half);
    const pathname = new URL(started.url!).pathname;
    const manager = await signedIn('manager');
    const outsider = await signedIn('outsider');
    const producer = await signedIn('producer');
    const headAs = (client: Client) => client.fetch(pathname, { method: 'HEAD', headers: { 'tus-resumable': '1.0.0' } });
    expect((await headAs(manager)).status).toBe(404);
    expect((await headAs(outsider)).status).toBe(404);
    expect((await headAs(producer)).status).toBe(403);
    const patch = await outsider.fetch(pathname, {
      method: 'PATCH',
      headers: { 'tus-resumable': '1.0.0', 'upload-offset': String(half), 'content-type': 'application/offset+octet-stream', origin: BASE_URL },
      body: new Uint8Array(take.subarray(half)),
    });
    expect(patch.status).toBe(404);
    expect((await headAs(engineer)).headers.get('upload-offset')).toBe(String(half));
  });

  it('refuses a finished upload whose bytes do not match the SHA-256 it was sent with, keeping no take', async () => {
    const result = await run(engineer, { metadata: { filename: 'wrong-sum.wav', sha256: '0'.repeat(64) } });
    expect(result.error).not.toBeNull();
    expect(String(result.error)).toMatch(/not the 0{64} it was sent with/);
    const takes = (await (await engineer.fetch(`/api/sessions/${sessionId}/takes`)).json()).takes;
    expect(takes.filter((t: { originalName: string }) => t.originalName === 'wrong-sum.wav')).toEqual([]);
  });

  it('refuses a PATCH that is not application/offset+octet-stream (tus 1.0.0 §PATCH) and appends nothing', async () => {
    const started = await run(engineer, { chunkSize: half, metadata: { filename: 'typed.wav' } }, half);
    const pathname = new URL(started.url!).pathname;
    const response = await engineer.fetch(pathname, {
      method: 'PATCH',
      headers: { 'tus-resumable': '1.0.0', 'upload-offset': String(half), 'content-type': 'application/json', origin: BASE_URL },
      body: '{"not":"audio"}',
    });
    expect([400, 415]).toContain(response.status);
    const head = await engineer.fetch(pathname, { method: 'HEAD', headers: { 'tus-resumable': '1.0.0' } });
    expect(head.headers.get('upload-offset')).toBe(String(half));
  });
});
