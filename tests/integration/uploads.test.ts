import http from 'node:http';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { db } from '@/lib/db/connection.server';
import { BASE_URL, signedInAll, type Client, type DemoPerson } from '../support/http';
import { Take } from '@/models';
import { expectNothingKept, storedKeys } from '../support/bucket';
import { makeWav, newSession, uploadTakes, waitForTake } from '../support/takes';

let as: Record<DemoPerson | 'anonymous', Client>;
let sessionId: number;

async function takeCount(): Promise<number> {
  return (await (await as.engineer.fetch(`/api/sessions/${sessionId}/takes`)).json()).takes.length;
}

beforeAll(async () => {
  db(); // the models, on the test database
  as = await signedInAll();
  sessionId = await newSession(as.engineer, 'Upload checks — lighthouse interviews');
});
afterAll(async () => {
  await db().close();
});

describe('POST /api/sessions/:id/takes', () => {
  it('takes several WAV files in one request, stores them with their SHA-256 and measures each', async () => {
    const a = makeWav({ seconds: 3, seed: 11 });
    const b = makeWav({ seconds: 2, seed: 12, channels: 1, bits: 16 });
    const { status, body } = await uploadTakes(as.engineer, sessionId, [
      { name: 'scene-01-take-1.wav', bytes: a },
      { name: 'scene-01-take-2.wav', bytes: b },
    ]);
    expect(status).toBe(201);
    expect(body.takes).toHaveLength(2);
    expect(body.takes.map((t: { originalName: string }) => t.originalName)).toEqual(['scene-01-take-1.wav', 'scene-01-take-2.wav']);
    expect(body.takes[0].bytes).toBe(a.length);
    const { createHash } = await import('node:crypto');
    expect(body.takes[0].sha256).toBe(createHash('sha256').update(a).digest('hex'));
    for (const t of body.takes) expect(['queued', 'measuring', 'measured']).toContain(t.status);

    const first = await waitForTake(as.engineer, body.takes[0].id);
    expect(first.status).toBe('measured');
    expect(first.progress).toBe(100);
    expect(['pass', 'warn', 'fail']).toContain(first.verdict);
    expect(first.decision).toBe('pending');
    expect(first.report.file).toMatchObject({ sampleRate: 48000, bitsPerSample: 24, channels: 2, frames: 3 * 48000 });
    expect(first.format).toEqual({ sampleRate: 48000, bitsPerSample: 24, channels: 2, encoding: 'pcm' });
    const second = await waitForTake(as.engineer, body.takes[1].id);
    expect(second.report.file).toMatchObject({ bitsPerSample: 16, channels: 1 });
    // The summary column agrees with the report it came from.
    expect(second.effectiveBits).toBe(second.report.resolution.effectiveBits);
  });

  it('refuses a file that is not a WAV with 415 and a plain message, keeping nothing', async () => {
    const before = await takeCount();
    const filesBefore = await storedKeys();
    const notes = Buffer.from('Interview notes, not audio. '.repeat(100));
    const { status, body } = await uploadTakes(as.engineer, sessionId, [{ name: 'notes.txt', bytes: notes }]);
    expect(status).toBe(415);
    expect(body.message).toMatch(/“notes\.txt” is not a WAV file/);
    expect(await takeCount()).toBe(before);
    await expectNothingKept(filesBefore, [notes]);
  });

  it('keeps nothing from a request whose second file is refused', async () => {
    const before = await takeCount();
    const filesBefore = await storedKeys();
    const good = makeWav({ seconds: 1, seed: 21 });
    const bad = Buffer.from('RIFX0000WAVE-not-really');
    const { status } = await uploadTakes(as.engineer, sessionId, [
      { name: 'good.wav', bytes: good },
      { name: 'bad.wav', bytes: bad },
    ]);
    expect(status).toBe(415);
    expect(await takeCount()).toBe(before);
    await expectNothingKept(filesBefore, [good, bad]);
  });

  it('refuses a file over the size limit with 413', async () => {
    const limit = Number(process.env.UPLOAD_MAX_BYTES ?? 134217728);
    const big = Buffer.alloc(limit + 1024);
    makeWav({ seconds: 0.01 }).copy(big);
    const filesBefore = await storedKeys();
    const { status, body } = await uploadTakes(as.engineer, sessionId, [{ name: 'too-long-room-tone.wav', bytes: big }]);
    expect(status).toBe(413);
    expect(body.message).toMatch(/larger than/);
    await expectNothingKept(filesBefore, [big]);
  });

  it('refuses the same file twice in a session with 409 naming the take it already is', async () => {
    const bytes = makeWav({ seconds: 1, seed: 31 });
    const first = await uploadTakes(as.engineer, sessionId, [{ name: 'ferry-horn.wav', bytes }]);
    expect(first.status).toBe(201);
    const again = await uploadTakes(as.engineer, sessionId, [{ name: 'ferry-horn-copy.wav', bytes }]);
    expect(again.status).toBe(409);
    expect(again.body.message).toContain('“ferry-horn.wav”');
    expect(again.body.existingTakeId).toBe(first.body.takes[0].id);
    // The same file is welcome in another session.
    const other = await newSession(as.engineer, 'Second look at the ferry');
    expect((await uploadTakes(as.engineer, other, [{ name: 'ferry-horn.wav', bytes }])).status).toBe(201);
  });

  it('leaves no take and no file behind when the upload is cut off', async () => {
    const before = await takeCount();
    const filesBefore = await storedKeys();
    const cookie = as.engineer.cookieHeader();
    const boundary = 'takeproofcutoff';
    const head = Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="cut.wav"\r\nContent-Type: audio/wav\r\n\r\n`);
    const wav = makeWav({ seconds: 20, seed: 41 });
    await new Promise<void>((resolve) => {
      const url = new URL(`/api/sessions/${sessionId}/takes`, BASE_URL);
      const request = http.request(url, {
        method: 'POST',
        headers: { cookie, origin: new URL(BASE_URL).origin, 'content-type': `multipart/form-data; boundary=${boundary}`, 'content-length': head.length + wav.length + 100 },
      });
      request.on('error', () => resolve());
      request.on('response', () => resolve());
      request.write(head);
      request.write(wav.subarray(0, wav.length / 2), () => {
        setTimeout(() => {
          request.destroy();
          resolve();
        }, 300);
      });
    });
    // The server notices the dropped connection and removes the half-written file.
    await expectNothingKept(filesBefore, [wav]);
    expect(await takeCount()).toBe(before);
  });

  it('stores a hostile file name harmlessly: shown without control characters, never used as a path', async () => {
    const hostile = `../../etc/passwd\t\r\n<script>alert(1)</script>${'x'.repeat(500)}.wav`;
    const filesBefore = await storedKeys();
    const { status, body } = await uploadTakes(as.engineer, sessionId, [{ name: hostile, bytes: makeWav({ seconds: 0.5, seed: 91 }) }]);
    expect(status, JSON.stringify(body)).toBe(201);
    const name: string = body.takes[0].originalName;
    // eslint-disable-next-line no-control-regex -- the check looks for control characters
    expect(name).not.toMatch(/[\u0000-\u001f]/);
    expect(name.length).toBeLessThanOrEqual(512);
    // (FormData sends CR LF as %0D%0A, as browsers do.)
    expect(name.slice(0, 50)).toBe('../../etc/passwd%0D%0A<script>alert(1)</script>xxx');
    // The stored object got a generated key, whatever the name said. The worker may be writing this take's
    // waveform file (or another test's objects) meanwhile, so look at this take's own keys.
    const take = await Take.findByPk(body.takes[0].id, { rejectOnEmpty: true });
    expect(take.storageKey).toMatch(/^takes\/\d{4}\/\d{2}\/[0-9a-f-]{36}\.wav$/);
    const appeared = [...(await storedKeys())].filter((key) => !filesBefore.has(key));
    expect(appeared).toContain(take.storageKey);
    // Nothing named after the upload was written anywhere under storage.
    expect(appeared.filter((key) => key !== take.storageKey && !key.startsWith('takes/') && !key.startsWith('peaks/'))).toEqual([]);
    // The session page shows it as text, not markup.
    const html = await (await as.engineer.fetch(`/sessions/${sessionId}`)).text();
    expect(html).not.toContain('<script>alert(1)</script>');
    expect(html).toContain('&lt;script&gt;alert(1)&lt;/script&gt;');
  });

  it('refuses a multipart header with raw control characters in plain words', async () => {
    const { status, body } = await uploadTakes(as.engineer, sessionId, [{ name: 'bell\u0007.wav', bytes: makeWav({ seconds: 0.5, seed: 92 }) }]);
    expect(status).toBe(400);
    expect(body.message).toMatch(/rename the file/);
  });

  it('answers 401 signed out, 403 for a producer and 404 for another studio', async () => {
    const file = [{ name: 'x.wav', bytes: makeWav({ seconds: 0.5, seed: 51 }) }];
    expect((await uploadTakes(as.anonymous, sessionId, file)).status).toBe(401);
    expect((await uploadTakes(as.producer, sessionId, file)).status).toBe(403);
    expect((await uploadTakes(as.outsider, sessionId, file)).status).toBe(404);
    expect((await uploadTakes(as.manager, sessionId, file)).status).toBe(201);
  });

  it('refuses a recorder of another studio as a field error', async () => {
    const { status, body } = await uploadTakes(as.outsider, await newSession(as.outsider, 'Outside session'), [{ name: 'y.wav', bytes: makeWav({ seconds: 0.5, seed: 61 }) }], { recorderId: '1' });
    expect(status).toBe(400);
    expect(body.fields.recorderId).toBeDefined();
  });
});

describe('recorder matching', () => {
  it('assigns a take to the recorder whose match text is in its BWF originator fields', async () => {
    const { bextBody, encodeSamples, wavFile } = await import('../support/wavWriter');
    const noise = Array.from({ length: 2 }, (_, c) => Float64Array.from({ length: 24000 }, (_, i) => 0.05 * Math.sin(i * (0.05 + c * 0.01))));
    const bytes = wavFile({ sampleRate: 48000, channels: 2, coding: 'pcm24' }, encodeSamples(noise, 'pcm24'), {
      chunksBeforeFmt: [{ id: 'bext', body: bextBody({ description: 'Scene 4, take 2', originator: 'CORVID FR-8', originatorReference: 'FR8-2207-0042' }) }],
    });
    const { status, body } = await uploadTakes(as.engineer, sessionId, [{ name: 'field-kit-take.wav', bytes }]);
    expect(status).toBe(201);
    expect(body.takes[0].recorderId).toBeNull();
    const take = await waitForTake(as.engineer, body.takes[0].id);
    // The demo studio's "Field kit 2" matches "CORVID FR-8".
    expect(take.recorderLabel).toBe('Field kit 2');
    expect(take.report.bext.originator).toBe('CORVID FR-8');
  });

  it('keeps the recorder the engineer picked, whatever the file says', async () => {
    const recorders = await (await as.manager.fetch('/api/recorders')).json();
    const booth = recorders.recorders.find((r: { label: string }) => r.label === 'Booth A interface');
    const { body } = await uploadTakes(as.engineer, sessionId, [{ name: 'booth-take.wav', bytes: makeWav({ seconds: 0.5, seed: 93 }) }], { recorderId: String(booth.id) });
    expect((await waitForTake(as.engineer, body.takes[0].id)).recorderLabel).toBe('Booth A interface');
  });
});

describe('takes API', () => {
  it('shows a take to its studio only, and lets engineers and managers queue it again', async () => {
    const { body } = await uploadTakes(as.engineer, sessionId, [{ name: 'pickup.wav', bytes: makeWav({ seconds: 1, seed: 71 }) }]);
    const id = body.takes[0].id;
    await waitForTake(as.engineer, id);
    expect((await as.producer.fetch(`/api/takes/${id}`)).status).toBe(200);
    expect((await as.outsider.fetch(`/api/takes/${id}`)).status).toBe(404);
    expect((await as.anonymous.fetch(`/api/takes/${id}`)).status).toBe(401);
    expect((await as.producer.fetch(`/api/takes/${id}/remeasure`, { method: 'POST' })).status).toBe(403);
    expect((await as.outsider.fetch(`/api/takes/${id}/remeasure`, { method: 'POST' })).status).toBe(404);
    const again = await as.engineer.fetch(`/api/takes/${id}/remeasure`, { method: 'POST' });
    expect(again.status).toBe(202);
    expect((await again.json()).status).toBe('queued');
    expect((await waitForTake(as.engineer, id)).status).toBe('measured');
  });

  it('ends a take the analyzer cannot read as unreadable with its message', async () => {
    // A RIFF/WAVE header with no fmt chunk: accepted at the door, refused by the analyzer.
    const broken = Buffer.concat([Buffer.from('RIFF'), Buffer.from([100, 0, 0, 0]), Buffer.from('WAVEdata'), Buffer.from([8, 0, 0, 0]), Buffer.alloc(8)]);
    const { status, body } = await uploadTakes(as.engineer, sessionId, [{ name: 'no-format.wav', bytes: broken }]);
    expect(status).toBe(201);
    const take = await waitForTake(as.engineer, body.takes[0].id);
    expect(take.status).toBe('unreadable');
    expect(take.error).toMatch(/fmt/i);
    expect(take.report).toBeNull();
  });
});
