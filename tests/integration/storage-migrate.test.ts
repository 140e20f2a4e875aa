import { DeleteObjectCommand, GetObjectCommand } from '@aws-sdk/client-s3';
import { spawnSync } from 'node:child_process';
import { createHash, randomUUID } from 'node:crypto';
import { existsSync, mkdirSync, rmSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { db } from '@/lib/db/connection.server';
import { Take } from '@/models';
import { bucket, objectExists, objectSha256, s3 } from '../support/bucket';
import { signedIn } from '../support/http';
import { makeWav, newSession, uploadTakes, waitForTake } from '../support/takes';

// Takes kept on local disk by earlier versions: make that state from takes uploaded now (copy each
// object to a folder, remove it from the bucket), then run `npm run storage:migrate` on that folder.
const oldStorage = path.resolve(process.env.TAKEPROOF_TEST_DIR ?? 'var/test', `earlier-storage-${randomUUID()}`);
const sound = makeWav({ seconds: 2, seed: 6601 });
const damaged = makeWav({ seconds: 2, seed: 6602 });
let good: Take;
let bad: Take;
const stray = `takes/2019/07/${randomUUID()}.wav`;

async function moveToLocalDisk(key: string, bytes?: Buffer) {
  const answer = await s3.send(new GetObjectCommand({ Bucket: bucket, Key: key }));
  const file = path.join(oldStorage, key);
  mkdirSync(path.dirname(file), { recursive: true });
  writeFileSync(file, bytes ?? Buffer.from(await answer.Body!.transformToByteArray()));
  await s3.send(new DeleteObjectCommand({ Bucket: bucket, Key: key }));
}

function migrate() {
  const run = spawnSync('npm', ['run', '-s', 'storage:migrate'], { env: { ...process.env, STORAGE_DIR: oldStorage }, encoding: 'utf8' });
  return { status: run.status, out: run.stdout + run.stderr };
}

beforeAll(async () => {
  db();
  const engineer = await signedIn('engineer');
  const sessionId = await newSession(engineer, 'Storage move — lighthouse keeper interview');
  const { body } = await uploadTakes(engineer, sessionId, [
    { name: 'keeper-part-1.wav', bytes: sound },
    { name: 'keeper-part-2.wav', bytes: damaged },
  ]);
  for (const t of body.takes) await waitForTake(engineer, t.id);
  good = await Take.findByPk(body.takes[0].id, { rejectOnEmpty: true });
  bad = await Take.findByPk(body.takes[1].id, { rejectOnEmpty: true });
  await moveToLocalDisk(good.storageKey);
  await moveToLocalDisk(good.peaksKey!);
  // One bit flipped on the way: its SHA-256 no longer matches the one recorded at upload.
  const flipped = Buffer.from(damaged);
  flipped[flipped.length - 1] ^= 1;
  await moveToLocalDisk(bad.storageKey, flipped);
  mkdirSync(path.dirname(path.join(oldStorage, stray)), { recursive: true });
  writeFileSync(path.join(oldStorage, stray), makeWav({ seconds: 0.1, seed: 6603 }));
}, 150_000);

afterAll(async () => {
  rmSync(oldStorage, { recursive: true, force: true });
  await db().close();
});

describe('npm run storage:migrate', () => {
  it('moves verified takes and waveform files into the bucket and keeps what does not verify', async () => {
    const { status, out } = migrate();
    expect(status, out).toBe(1);
    expect(out).toMatch(new RegExp(`moved take ${good.id} \\(${sound.length} bytes, SHA-256 verified\\)`));
    expect(out).toContain(`moved waveform file of take ${good.id}`);
    expect(out).toMatch(new RegExp(`kept on local disk: ${bad.storageKey}: take ${bad.id}: the local file's SHA-256 [0-9a-f]{64} differs from the ${bad.sha256}`));
    expect(out).toContain(`no take refers to ${stray}`);
    expect(out).toMatch(/Moved 2 file\(s\) .*; 0 already in the bucket; 1 without a take left in place; 1 kept on local disk/);

    expect(await objectSha256(good.storageKey)).toBe(createHash('sha256').update(sound).digest('hex'));
    expect(await objectExists(good.peaksKey!)).toBe(true);
    expect(existsSync(path.join(oldStorage, good.storageKey))).toBe(false);
    expect(await objectExists(bad.storageKey)).toBe(false);
    expect(existsSync(path.join(oldStorage, bad.storageKey))).toBe(true);
    expect(existsSync(path.join(oldStorage, stray))).toBe(true);
  });

  it('is safe to run again: a copy already in the bucket is verified, not sent twice', async () => {
    // As if an earlier run stopped after the upload and before removing the local file.
    writeFileSync(path.join(oldStorage, good.storageKey), sound);
    const { status, out } = migrate();
    expect(status, out).toBe(1);
    expect(out).toContain(`take ${good.id} was already in the bucket (verified)`);
    expect(out).toMatch(/Moved 0 file\(s\) .*; 1 already in the bucket; 1 without a take left in place; 1 kept on local disk/);
    expect(existsSync(path.join(oldStorage, good.storageKey))).toBe(false);
    expect(await objectSha256(good.storageKey)).toBe(createHash('sha256').update(sound).digest('hex'));
  });
});
