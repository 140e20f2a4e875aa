import type { Readable } from 'node:stream';

/** A byte range, both ends inclusive, as in an HTTP Range header. */
export interface ByteRange {
  start: number;
  end?: number;
}

/**
 * Where take files and their waveform files live. Callers only see keys;
 * a driver decides where the bytes go (an S3-compatible bucket, or local disk).
 */
export interface StorageDriver {
  /** Writes the stream under `key`; the object appears only once every byte is written. */
  put(key: string, body: Readable): Promise<{ bytes: number }>;
  /** Streams the object, or the part of it in `range`. */
  getRange(key: string, range?: ByteRange): Readable;
  /** Size of the object, or null when there is none. */
  stat(key: string): Promise<{ bytes: number } | null>;
  delete(key: string): Promise<void>;
  /** Every stored key (for the consistency check); unfinished writes are not listed. */
  list(): AsyncIterable<string>;
  /** Writes begun and not finished (an upload in flight, or one that died), as readable descriptions. */
  unfinishedWrites(): AsyncIterable<string>;
}
