import { GetObjectCommand, HeadObjectCommand, S3Client, paginateListObjectsV2 } from '@aws-sdk/client-s3';
import { createHash } from 'node:crypto';
import type { Readable } from 'node:stream';
import { expect } from 'vitest';

/**
 * The test run's bucket, reached through the AWS SDK with the S3_* settings the app runs with:
 * what a studio's own tooling would see, independent of Takeproof's storage code.
 */
export const bucket = process.env.S3_BUCKET ?? 'takeproof-test';
export const s3 = new S3Client({
  endpoint: process.env.S3_ENDPOINT,
  region: process.env.S3_REGION ?? 'us-east-1',
  forcePathStyle: process.env.S3_FORCE_PATH_STYLE !== 'false',
  credentials: { accessKeyId: process.env.S3_ACCESS_KEY_ID ?? '', secretAccessKey: process.env.S3_SECRET_ACCESS_KEY ?? '' },
  requestChecksumCalculation: 'WHEN_REQUIRED',
  responseChecksumValidation: 'WHEN_REQUIRED',
});

/** Every key in the bucket with its size. */
export async function listObjects(): Promise<Map<string, number>> {
  const objects = new Map<string, number>();
  for await (const page of paginateListObjectsV2({ client: s3 }, { Bucket: bucket })) {
    for (const o of page.Contents ?? []) if (o.Key) objects.set(o.Key, Number(o.Size ?? 0));
  }
  return objects;
}

/** The first `length` bytes of an object (fewer if it is shorter); null if it is gone. */
export async function objectHead(key: string, length: number): Promise<Buffer | null> {
  try {
    const answer = await s3.send(new GetObjectCommand({ Bucket: bucket, Key: key, Range: `bytes=0-${length - 1}` }));
    return Buffer.from(await answer.Body!.transformToByteArray());
  } catch {
    return null;
  }
}

/** SHA-256 (hex) of a whole object, streamed. */
export async function objectSha256(key: string): Promise<string> {
  const answer = await s3.send(new GetObjectCommand({ Bucket: bucket, Key: key }));
  const hash = createHash('sha256');
  for await (const chunk of answer.Body as Readable) hash.update(chunk as Buffer);
  return hash.digest('hex');
}

export async function objectExists(key: string): Promise<boolean> {
  try {
    await s3.send(new HeadObjectCommand({ Bucket: bucket, Key: key }));
    return true;
  } catch {
    return false;
  }
}

export async function storedKeys(): Promise<Set<string>> {
  return new Set((await listObjects()).keys());
}

/**
 * Objects that appeared since `before` and begin with the first bytes of one of `sent`: what a refused or
 * cut-off upload left behind. The worker and other test files write into the same bucket meanwhile,
 * so only the content tells one test's leftovers apart.
 */
async function leftoversOf(before: Set<string>, sent: Buffer[]): Promise<string[]> {
  const probes = sent.filter((bytes) => bytes.length > 0).map((bytes) => bytes.subarray(0, Math.min(bytes.length, 4096)));
  const left: string[] = [];
  for (const key of await storedKeys()) {
    if (before.has(key)) continue;
    const head = await objectHead(key, 4096);
    if (head && head.length > 0 && probes.some((probe) => probe.subarray(0, head.length).equals(head.subarray(0, probe.length)))) left.push(key);
  }
  return left;
}

/** Waits (bounded) until nothing of `sent` is left in the bucket. */
export async function expectNothingKept(before: Set<string>, sent: Buffer[]) {
  const until = Date.now() + 15_000;
  let left = await leftoversOf(before, sent);
  while (left.length > 0 && Date.now() < until) {
    await new Promise((r) => setTimeout(r, 100));
    left = await leftoversOf(before, sent);
  }
  expect(left).toEqual([]);
}
