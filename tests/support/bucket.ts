import { GetObjectCommand, HeadObjectCommand, S3Client, paginateListObjectsV2 } from '@aws-sdk/client-s3';
import { createHash } from 'node:crypto';
import type { Readable } from 'node:stream';

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
