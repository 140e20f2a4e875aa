import { readFileSync } from 'node:fs';
import http from 'node:http';
import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { expectNothingKept, storedKeys } from '../support/bucket';
import { BASE_URL, signedIn, type Client } from '../support/http';
import { makeWav, newSession, uploadTakes } from '../support/takes';

// What one multipart upload may hold, and how a short, refused or truncated one is answered:
// every refusal names what was refused, keeps nothing, and never escapes as an uncaught exception.
let engineer: Client;
let sessionId: number;
const serverLog = path.join(process.env.TAKEPROOF_TEST_DIR ?? 'var/test', 'server.log');

function uncaughtInLog(): number {
  return (readFileSync(serverLog, 'utf8').match(/uncaught/gi) ?? []).length;
}

async function takeCount(): Promise<number> {
  return (await (await engineer.fetch(`/api/sessions/${sessionId}/takes`)).json()).takes.length;
}

/** Sends a raw multipart body with chunked transfer encoding, ending it cleanly after `body`. */
function postChunked(body: Buffer, boundary: string): Promise<{ status: number; json: { error: string; message: string } }> {
  return new Promise((resolve, reject) => {
    const request = http.request(new URL(`/api/sessions/${sessionId}/takes`, BASE_URL), {
      method: 'POST',
      headers: { cookie: engineer.cookieHeader(), origin: BASE_URL, 'content-type': `multipart/form-data; boundary=${boundary}`, 'transfer-encoding': 'chunked' },
    });
    request.on('response', (res) => {
      let text = '';
      res.on('data', (d) => (text += d));
      res.on('end', () => resolve({ status: res.statusCode ?? 0, json: JSON.parse(text) }));
    });
    request.on('error', reject);
    request.end(body);
  });
}

beforeAll(async () => {
  engineer = await signedIn('engineer');
  sessionId = await newSession(engineer, 'Upload limits — tide pool recordings');
});

describe('upload limits', () => {
  it('refuses 51 files in one request, naming the limit, and keeps none of them', async () => {
    const before = await takeCount();
    const keysBefore = await storedKeys();
    const files = Array.from({ length: 51 }, (_, i) => ({ name: `tide-pool-${i + 1}.wav`, bytes: makeWav({ seconds: 0.05, seed: 5100 + i }) }));
    const { status, body } = await uploadTakes(engineer, sessionId, files);
    expect(status).toBe(400);
    expect(body.error).toBe('invalid:upload_files');
    expect(body.message).toMatch(/more than 50 files/);
    expect(await takeCount()).toBe(before);
    await expectNothingKept(keysBefore, files.map((f) => f.bytes));
  });

  it('refuses an upload whose form fields go over the limit instead of dropping the recorder', async () => {
    const before = await takeCount();
    const bytes = makeWav({ seconds: 0.2, seed: 5200 });
    const padding = Object.fromEntries(Array.from({ length: 20 }, (_, i) => [`note${i}`, 'x']));
    const { status, body } = await uploadTakes(engineer, sessionId, [{ name: 'rock-pool.wav', bytes }], { ...padding, recorderId: '1' });
    expect(status).toBe(400);
    expect(body.error).toBe('invalid:upload_fields');
    expect(body.message).toMatch(/more than 20 form fields/);
    expect(await takeCount()).toBe(before);
  });

  it('refuses a file sent under another field name, naming it, instead of dropping it', async () => {
    const form = new FormData();
    form.append('file', new Blob([new Uint8Array(makeWav({ seconds: 0.2, seed: 5300 }))]), 'kept.wav');
    form.append('attachment', new Blob([new Uint8Array(makeWav({ seconds: 0.2, seed: 5301 }))]), 'elsewhere.wav');
    const before = await takeCount();
    const response = await engineer.fetch(`/api/sessions/${sessionId}/takes`, { method: 'POST', body: form, headers: { origin: BASE_URL } });
    expect(response.status).toBe(400);
    expect((await response.json()).message).toMatch(/“elsewhere\.wav” was sent in the field `attachment`/);
    expect(await takeCount()).toBe(before);
  });

  it('answers uploads of 0 to 11 bytes, and one refused by its first bytes, plainly and without an uncaught exception', async () => {
    const uncaughtBefore = uncaughtInLog();
    const keysBefore = await storedKeys();
    const sent: Buffer[] = [];
    for (const length of [0, 1, 4, 11]) {
      const bytes = Buffer.from('shore-wash-short-file'.slice(0, length));
      sent.push(bytes);
      const { status, body } = await uploadTakes(engineer, sessionId, [{ name: `short-${length}.wav`, bytes }]);
      expect(status, `${length} bytes`).toBe(415);
      expect(body.message).toMatch(new RegExp(`“short-${length}\\.wav” is too short to be a WAV file`));
    }
    const notWav = Buffer.from('Field notes from the shore, not audio.'.repeat(50));
    sent.push(notWav);
    const refused = await uploadTakes(engineer, sessionId, [{ name: 'field-notes.wav', bytes: notWav }]);
    expect(refused.status).toBe(415);
    expect(refused.body.message).toMatch(/is not a WAV file/);
    await expectNothingKept(keysBefore, sent);
    expect(uncaughtInLog()).toBe(uncaughtBefore);
  });

  it('reports a chunked body that ends inside a file as cut short, not as a bad file name', async () => {
    const before = await takeCount();
    const boundary = 'takeproofshortbody';
    const head = Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="wave-break.wav"\r\nContent-Type: audio/wav\r\n\r\n`);
    const wav = makeWav({ seconds: 1, seed: 5400 });
    const { status, json } = await postChunked(Buffer.concat([head, wav.subarray(0, wav.length / 2)]), boundary);
    expect(status).toBe(400);
    expect(json.error).toBe('invalid:upload_truncated');
    expect(json.message).toMatch(/ended before its last part was complete/);
    expect(await takeCount()).toBe(before);
  });
});
