import 'server-only';
import {
  AbortMultipartUploadCommand,
  DeleteObjectCommand,
  GetObjectCommand,
  HeadObjectCommand,
  ListMultipartUploadsCommand,
  S3Client,
  S3ServiceException,
  paginateListObjectsV2,
} from '@aws-sdk/client-s3';
import { Upload } from '@aws-sdk/lib-storage';
import { Readable, Transform, type TransformCallback } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import type { Env } from '@/lib/env.server';
import { AppError } from '@/lib/errors';
import type { ByteRange, StorageDriver } from './types';

/** Bytes per multipart part; with two parts in flight an upload holds about 3 parts in memory. */
const PART_BYTES = 8 * 1024 * 1024;
const PARTS_IN_FLIGHT = 2;

export function s3Client(config: Pick<Env, 'S3_ENDPOINT' | 'S3_REGION' | 'S3_ACCESS_KEY_ID' | 'S3_SECRET_ACCESS_KEY' | 'S3_FORCE_PATH_STYLE'>): S3Client {
  return new S3Client({
    region: config.S3_REGION,
    ...(config.S3_ENDPOINT ? { endpoint: config.S3_ENDPOINT } : {}),
    forcePathStyle: config.S3_FORCE_PATH_STYLE,
    // Without keys the SDK's own chain applies (AWS_* variables, instance roles).
    ...(config.S3_ACCESS_KEY_ID ? { credentials: { accessKeyId: config.S3_ACCESS_KEY_ID, secretAccessKey: config.S3_SECRET_ACCESS_KEY } } : {}),
    // Checksums only where the S3 API requires them: many S3-compatible services do not read the
    // newer streaming checksum trailers. Takeproof checks every take by its own SHA-256.
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
    requestHandler: { connectionTimeout: 5_000 },
  });
}

function isMissing(error: unknown): boolean {
  return error instanceof S3ServiceException && (error.name === 'NotFound' || error.name === 'NoSuchKey' || error.$metadata?.httpStatusCode === 404);
}

class ByteCounter extends Transform {
  bytes = 0;
  _transform(chunk: Buffer, _encoding: BufferEncoding, done: TransformCallback) {
    this.bytes += chunk.length;
    done(null, chunk);
  }
}

/**
 * One object (or a range of it) as a Node stream. The GET is sent on the first read, and
 * destroying the stream aborts it, so an unread or abandoned stream holds no connection.
 */
class ObjectStream extends Readable {
  private body: Readable | undefined;
  private requested = false;
  private readonly abort = new AbortController();

  constructor(private readonly client: S3Client, private readonly input: { Bucket: string; Key: string; Range?: string }) {
    super();
  }

  _read() {
    if (this.body) {
      this.body.resume();
      return;
    }
    if (this.requested) return;
    this.requested = true;
    this.client.send(new GetObjectCommand(this.input), { abortSignal: this.abort.signal }).then(
      (answer) => {
        const body = answer.Body as Readable;
        this.body = body;
        if (this.destroyed) return void body.destroy();
        body.on('data', (chunk: Buffer) => {
          if (!this.push(chunk)) body.pause();
        });
        body.on('end', () => this.push(null));
        body.on('error', (error) => this.destroy(error));
      },
      (error: unknown) => this.destroy(isMissing(error) ? new Error(`No stored object ${this.input.Key}`) : (error as Error)),
    );
  }

  _destroy(error: Error | null, done: (error?: Error | null) => void) {
    this.abort.abort();
    this.body?.destroy();
    done(error);
  }
}

/** Keeps objects in one bucket of an S3-compatible service, through the AWS SDK. */
export class S3Storage implements StorageDriver {
  constructor(private readonly client: S3Client, private readonly bucket: string) {}

  async put(key: string, body: Readable): Promise<{ bytes: number }> {
    // The body's own error (a refused or cut-off upload) is the one to report, not what the SDK makes of it.
    let bodyError: unknown;
    body.once('error', (error) => (bodyError ??= error));
    const counter = new ByteCounter();
    const piped = pipeline(body, counter).catch((error: unknown) => (bodyError ??= error));
    const upload = new Upload({
      client: this.client,
      params: { Bucket: this.bucket, Key: key, Body: counter },
      partSize: PART_BYTES,
      queueSize: PARTS_IN_FLIGHT,
      leavePartsOnError: true, // aborted below, so a service without AbortMultipartUpload still reports the real cause
    });
    try {
      await upload.done();
      await piped;
    } catch (error) {
      const cause = bodyError;
      counter.destroy();
      if (upload.uploadId) {
        await this.client.send(new AbortMultipartUploadCommand({ Bucket: this.bucket, Key: key, UploadId: upload.uploadId })).catch((abortError: Error) => {
          console.error(`Could not abort the unfinished upload of ${key}: ${abortError.message}`);
        });
      }
      if (cause) throw cause;
      console.error(`Storing ${key} failed: ${(error as Error).message}`);
      throw new AppError('unavailable:storage', 'Takeproof cannot reach its storage right now. Nothing was kept; try again in a moment.');
    }
    if (bodyError) throw bodyError;
    return { bytes: counter.bytes };
  }

  getRange(key: string, range?: ByteRange): Readable {
    const header = range ? `bytes=${range.start}-${range.end ?? ''}` : undefined;
    return new ObjectStream(this.client, { Bucket: this.bucket, Key: key, ...(header ? { Range: header } : {}) });
  }

  async stat(key: string): Promise<{ bytes: number } | null> {
    try {
      const head = await this.client.send(new HeadObjectCommand({ Bucket: this.bucket, Key: key }));
      return { bytes: Number(head.ContentLength ?? 0) };
    } catch (error) {
      if (isMissing(error)) return null;
      throw error;
    }
  }

  async delete(key: string): Promise<void> {
    await this.client.send(new DeleteObjectCommand({ Bucket: this.bucket, Key: key }));
  }

  async *list(): AsyncIterable<string> {
    for await (const page of paginateListObjectsV2({ client: this.client }, { Bucket: this.bucket })) {
      for (const object of page.Contents ?? []) if (object.Key) yield object.Key;
    }
  }

  async *unfinishedWrites(): AsyncIterable<string> {
    let answer;
    try {
      answer = await this.client.send(new ListMultipartUploadsCommand({ Bucket: this.bucket }));
    } catch (error) {
      // Some S3-compatible services (the local stand-in among them) do not list multipart uploads.
      if (error instanceof S3ServiceException && (error.name === 'NotImplemented' || error.$metadata?.httpStatusCode === 405)) return;
      throw error;
    }
    for (const upload of answer.Uploads ?? []) if (upload.Key) yield `${upload.Key} (multipart upload started ${upload.Initiated?.toISOString() ?? 'at an unknown time'})`;
  }
}
