import type { Readable } from 'node:stream';
import { openWav } from '../reader/wavReader';
import type { SampleBlock } from '../types';

/** Something fed the decoded blocks of one read of a recording. */
export interface BlockVisitor {
  /** Frame after which this visitor needs nothing more. */
  readonly endFrame: number;
  push(block: SampleBlock): void;
}

/** One read of a recording, feeding every visitor, stopping after the last frame any of them needs. */
export async function readPass(readable: Readable, visitors: BlockVisitor[]): Promise<void> {
  const opened = await openWav(readable);
  const end = Math.max(...visitors.map((visitor) => visitor.endFrame));
  for await (const block of opened.blocks()) {
    for (const visitor of visitors) visitor.push(block);
    if (block.startFrame + block.frames >= end) break;
  }
}

/** A stretch of one channel kept in memory. */
export interface AudioWindow {
  /** Recording frame of samples[0]. */
  firstFrame: number;
  samples: Float32Array;
}

/**
 * Keeps the frames [from, to) of each window for every channel (float32 is exact for 24-bit PCM
 * and float32 files; 32-bit PCM keeps 24 bits, far below any converter's noise).
 */
export class WindowCapture implements BlockVisitor {
  readonly endFrame: number;
  /** windows[channel][window] */
  readonly windows: AudioWindow[][];
  private readonly ranges: [number, number][];

  constructor(ranges: [number, number][], channels: number) {
    this.ranges = ranges.map(([from, to]) => [Math.max(0, from), Math.max(Math.max(0, from), to)]);
    this.endFrame = Math.max(...this.ranges.map(([, to]) => to));
    this.windows = Array.from({ length: channels }, () => this.ranges.map(([from, to]) => ({ firstFrame: from, samples: new Float32Array(to - from) })));
  }

  push(block: SampleBlock): void {
    const blockEnd = block.startFrame + block.frames;
    this.ranges.forEach(([from, to], w) => {
      const first = Math.max(from, block.startFrame);
      const last = Math.min(to, blockEnd);
      if (first >= last) return;
      this.windows.forEach((channelWindows, c) => {
        channelWindows[w].samples.set(block.channels[c].subarray(first - block.startFrame, last - block.startFrame), first - from);
      });
    });
  }
}

/** Samples this close to full scale count as clipped (the top code of 16-bit PCM and above). */
const CLIP_LEVEL = 1 - 2 ** -15;

/** Counts each channel's samples at full scale within each of a few frame ranges. */
export class ClipCounter implements BlockVisitor {
  readonly endFrame: number;
  /** counts[range][channel] */
  readonly counts: number[][];
  private readonly ranges: [number, number][];

  constructor(ranges: [number, number][], channels: number) {
    this.ranges = ranges;
    this.endFrame = Math.max(...ranges.map(([, to]) => to));
    this.counts = ranges.map(() => new Array<number>(channels).fill(0));
  }

  push(block: SampleBlock): void {
    const blockEnd = block.startFrame + block.frames;
    this.ranges.forEach(([from, to], r) => {
      const first = Math.max(from, block.startFrame) - block.startFrame;
      const last = Math.min(to, blockEnd) - block.startFrame;
      block.channels.forEach((x, c) => {
        let count = 0;
        for (let n = first; n < last; n++) if (Math.abs(x[n]) >= CLIP_LEVEL) count++;
        this.counts[r][c] += count;
      });
    });
  }
}
