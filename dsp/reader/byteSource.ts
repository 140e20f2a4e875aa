import type { Readable } from 'node:stream';

/**
 * Pull-style access to a Node Readable: read or skip an exact number of bytes
 * without holding more than the stream's current chunk. Memory stays bounded
 * by the stream's own chunk size whatever the file length.
 */
export class ByteSource {
  private readonly chunks: AsyncIterator<Buffer | string>;
  private current: Buffer | null = null;
  private currentOffset = 0;
  private ended = false;
  /** Bytes consumed (read or skipped) since the start of the stream. */
  position = 0;

  constructor(readable: Readable, startPosition = 0) {
    this.chunks = readable[Symbol.asyncIterator]();
    this.position = startPosition;
  }

  /** Loads the next non-empty chunk; false at end of stream. */
  private async refill(): Promise<boolean> {
    while (!this.ended) {
      const next = await this.chunks.next();
      if (next.done) {
        this.ended = true;
        return false;
      }
      const value = next.value;
      const chunk = typeof value === 'string' ? Buffer.from(value, 'latin1') : value;
      if (chunk.length > 0) {
        this.current = chunk;
        this.currentOffset = 0;
        return true;
      }
    }
    return false;
  }

  /**
   * Copies up to `byteCount` bytes into `target` starting at `targetOffset`.
   * @returns bytes copied; fewer than asked only at end of stream.
   */
  async readInto(target: Uint8Array, targetOffset: number, byteCount: number): Promise<number> {
    let copied = 0;
    while (copied < byteCount) {
      if (this.current === null || this.currentOffset >= this.current.length) {
        if (!(await this.refill())) break;
      }
      const chunk = this.current!;
      const take = Math.min(byteCount - copied, chunk.length - this.currentOffset);
      target.set(chunk.subarray(this.currentOffset, this.currentOffset + take), targetOffset + copied);
      this.currentOffset += take;
      copied += take;
    }
    this.position += copied;
    return copied;
  }

  /** Reads exactly `byteCount` bytes, or fewer at end of stream. */
  async read(byteCount: number): Promise<Buffer> {
    const target = Buffer.alloc(byteCount);
    const got = await this.readInto(target, 0, byteCount);
    return got === byteCount ? target : target.subarray(0, got);
  }

  /**
   * Discards up to `byteCount` bytes (may exceed 2^32).
   * @returns bytes skipped; fewer than asked only at end of stream.
   */
  async skip(byteCount: number): Promise<number> {
    let skipped = 0;
    while (skipped < byteCount) {
      if (this.current === null || this.currentOffset >= this.current.length) {
        if (!(await this.refill())) break;
      }
      const take = Math.min(byteCount - skipped, this.current!.length - this.currentOffset);
      this.currentOffset += take;
      skipped += take;
    }
    this.position += skipped;
    return skipped;
  }

  /** Stops pulling from the stream (lets the stream release its file handle). */
  async close(): Promise<void> {
    if (!this.ended && this.chunks.return) await this.chunks.return();
    this.ended = true;
  }
}
