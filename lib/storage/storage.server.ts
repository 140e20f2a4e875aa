import 'server-only';
import { randomUUID } from 'node:crypto';
import path from 'node:path';
import { env } from '@/lib/env.server';
import { LocalDiskStorage } from './localDisk.server';
import { S3Storage, s3Client } from './s3.server';
import type { Readable } from 'node:stream';
import type { ByteRange, StorageDriver } from './types';

export type { ByteRange, StorageDriver } from './types';

let driver: StorageDriver | undefined;

/** The configured storage driver: the S3 bucket (STORAGE_DRIVER=s3, the default) or local disk under STORAGE_DIR. */
export function storage(): StorageDriver {
  driver ??= env().STORAGE_DRIVER === 's3' ? bucketStorage() : diskStorage();
  return driver;
}

/** The bucket named by the S3_* settings. */
export function bucketStorage(): S3Storage {
  const config = env();
  return new S3Storage(s3Client(config), config.S3_BUCKET);
}

/** The folder STORAGE_DIR: the `local` driver, and where earlier versions kept every take. */
export function diskStorage(): LocalDiskStorage {
  return new LocalDiskStorage(path.resolve(env().STORAGE_DIR));
}

/**
 * An object (or a range of it) as a response body that opens the stored object only when the body
 * is really read, and closes it when the reader cancels. A HEAD answer, or a GET whose client is gone
 * before the body starts, then holds no file handle or connection to the bucket.
 */
export function storedBody(key: string, range?: ByteRange): ReadableStream<Uint8Array> {
  let source: Readable | undefined;
  let chunks: AsyncIterator<Buffer> | undefined;
  return new ReadableStream<Uint8Array>(
    {
      async pull(controller) {
        source ??= storage().getRange(key, range);
        chunks ??= source[Symbol.asyncIterator]();
        const { value, done } = await chunks.next();
        if (done) controller.close();
        else controller.enqueue(value);
      },
      cancel() {
        source?.destroy();
      },
    },
    { highWaterMark: 0 }, // no read ahead: nothing is opened until the first read
  );
}

/** Replaces the driver, e.g. with one that fails, to exercise error paths. */
export function setStorageDriver(next: StorageDriver | undefined): void {
  driver = next;
}

/** A fresh key for an uploaded take: generated, never derived from the file's name. */
export function newTakeKey(now = new Date()): string {
  const month = `${now.getUTCFullYear()}/${String(now.getUTCMonth() + 1).padStart(2, '0')}`;
  return `takes/${month}/${randomUUID()}.wav`;
}

/** A fresh key for an uploaded converter-check recording. */
export function newConverterCheckKey(now = new Date()): string {
  const month = `${now.getUTCFullYear()}/${String(now.getUTCMonth() + 1).padStart(2, '0')}`;
  return `converter-checks/${month}/${randomUUID()}.wav`;
}

/** The waveform peaks file that belongs to a take's audio key. */
export function peaksKeyFor(takeKey: string): string {
  return takeKey.replace(/^takes\//, 'peaks/').replace(/\.wav$/, '.peaks');
}
