import { DeleteObjectCommand, PutObjectCommand } from '@aws-sdk/client-s3';
import { createHash, randomUUID } from 'node:crypto';
import { readdirSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { db } from '@/lib/db/connection.server';
import { checkStorage } from '@/lib/storage/check.server';
import { Take } from '@/models';
import { bucket, listObjects, objectSha256, s3 } from '../support/bucket';
import { BASE_URL, signedIn, type Client } from '../support/http';
import { makeWav, newSession, uploadTakes, waitForTake } from '../support/takes';

// Takes live in the S3 bucket named by the S3_* settings; this file looks at that bucket through
// the AWS SDK on its own (tests/support/bucket.ts), as a studio's tooling would.
let engineer: Client;
let take: Take;
const bytes = makeWav({ seconds: 4, seed: 4401 });
const sha256 = createHash('sha256').update(bytes).digest('hex');

function filesBelow(dir: string): string[] {
  try {
    return readdirSync(dir, { recursive: true, withFileTypes: true }).filter((e) => e.isFile()).map((e) => e.name);
  } catch {
    return [];
  }
}

beforeAll(async () => {
  db();
  engineer = await signedIn('engineer');
  const sessionId = await newSession(engineer, 'Object storage — harbour ambience');
  const { status, body } = await uploadTakes(engineer, sessionId, [{ name: 'harbour-ambience.wav', bytes }]);
  if (status !== 201) throw new Error(`upload answered ${status}: ${JSON.stringify(body)}`);
  take = await Take.findByPk(body.takes[0].id, { rejectOnEmpty: true });
});
afterAll(async () => {
  await db().close();
});

describe('takes in the S3 bucket', () => {
  it('keeps an uploaded take as one object of the right size and SHA-256, and nothing on local disk', async () => {
    const objects = await listObjects();
    expect(objects.get(take.storageKey)).toBe(bytes.length);
    expect(await objectSha256(take.storageKey)).toBe(sha256);
    expect(take.sha256).toBe(sha256);
    // STORAGE_DIR is only read by `npm run storage:migrate` now.
    expect(filesBelow(path.resolve(process.env.STORAGE_DIR ?? 'var/storage'))).toEqual([]);
  });

  it('measures the take from the bucket and keeps its waveform file there', async () => {
    const measured = await waitForTake(engineer, take.id);
    expect(measured.status).toBe('measured');
    expect(measured.report.file).toMatchObject({ sampleRate: 48000, channels: 2, frames: 4 * 48000 });
    await take.reload();
    expect(take.peaksKey).toBeTruthy();
    expect((await listObjects()).has(take.peaksKey!)).toBe(true);
    const peaks = await engineer.fetch(`/api/takes/${take.id}/peaks?buckets=200`);
    expect(peaks.status).toBe(200);
  });

  it('serves a byte range for playback straight from the bucket (RFC 9110 §14)', async () => {
    const response = await engineer.fetch(`/api/takes/${take.id}/audio`, { headers: { range: 'bytes=1000-5095' } });
    expect(response.status).toBe(206);
    expect(response.headers.get('content-range')).toBe(`bytes 1000-5095/${bytes.length}`);
    expect(Buffer.from(await response.arrayBuffer()).equals(bytes.subarray(1000, 5096))).toBe(true);
    const tail = await engineer.fetch(`/api/takes/${take.id}/audio`, { headers: { range: `bytes=-100` } });
    expect(Buffer.from(await tail.arrayBuffer()).equals(bytes.subarray(bytes.length - 100))).toBe(true);
  });

  it('still serves ranges after many HEADs and abandoned reads: each read gives its connection to the bucket back', async () => {
    // The SDK keeps a bounded pool of connections to the bucket; a read that is never finished must not hold one.
    for (let i = 0; i < 120; i++) expect((await engineer.fetch(`/api/takes/${take.id}/audio`, { method: 'HEAD' })).status).toBe(200);
    for (let i = 0; i < 60; i++) {
      const stop = new AbortController();
      await engineer.fetch(`/api/takes/${take.id}/audio`, { signal: stop.signal });
      stop.abort();
    }
    // The signal only keeps a hang from stalling the suite; the answer itself is what is checked.
    const response = await engineer.fetch(`/api/takes/${take.id}/audio`, { headers: { range: 'bytes=0-99' }, signal: AbortSignal.timeout(30_000) });
    expect(response.status).toBe(206);
    expect(Buffer.from(await response.arrayBuffer()).equals(bytes.subarray(0, 100))).toBe(true);
  });

  it('measures the take again from the bucket with the same result', async () => {
    const first = await waitForTake(engineer, take.id);
    const again = await engineer.fetch(`/api/takes/${take.id}/remeasure`, { method: 'POST', headers: { origin: BASE_URL } });
    expect(again.status).toBe(202);
    const second = await waitForTake(engineer, take.id);
    expect(second.status).toBe('measured');
    expect(second.integratedLufs).toBe(first.integratedLufs);
    expect(second.truePeakDbtp).toBe(first.truePeakDbtp);
  });

  it('lets the consistency check see a missing object and a stray one', async () => {
    const clean = await checkStorage();
    expect(clean.rowsWithoutFiles.map((r) => r.takeId)).not.toContain(take.id);
    expect(clean.filesWithoutRows).not.toContain(take.storageKey);

    const stray = `takes/stray/${randomUUID()}.wav`;
    await s3.send(new PutObjectCommand({ Bucket: bucket, Key: stray, Body: bytes.subarray(0, 64) }));
    const row = await Take.create({ ...take.get({ plain: true }), id: undefined, storageKey: `takes/missing/${randomUUID()}.wav`, sha256: createHash('sha256').update(randomUUID()).digest('hex'), peaksKey: null });
    try {
      const report = await checkStorage();
      expect(report.filesWithoutRows).toContain(stray);
      expect(report.rowsWithoutFiles).toContainEqual({ takeId: row.id, key: row.storageKey });
    } finally {
      await row.destroy();
      await s3.send(new DeleteObjectCommand({ Bucket: bucket, Key: stray }));
    }
  });
});
