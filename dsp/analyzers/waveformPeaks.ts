import { closeSync, openSync, readSync, rmSync, writeSync } from 'node:fs';
import type { Analyzer, AudioFormat, SampleBlock } from '../types';
import { encodePeaksHeader, PEAKS_HEADER_BYTES, PEAKS_LEVEL_ENTRY_BYTES, PEAKS_SCALE, type PeaksLevelInfo } from '../peaksFile';
import { assertAnalysableFormat } from './formatGuard';

/**
 * Min/max envelope of each channel at several zoom levels, streamed to a peaks
 * file (format documented in `dsp/peaksFile.ts`). Only the finest level reads
 * samples; each coarser level folds whole buckets of the level below, so the
 * per-sample cost is one comparison pair per channel. Each level streams into
 * its own scratch file beside the output through a small buffer; `finish()`
 * writes the header and joins them, so memory stays bounded for any length.
 */

export interface WaveformPeaksOptions {
  /** Where the peaks file is written (replaced if present). */
  outputPath: string;
  /** Frames per bucket of each level, ascending, each a multiple of the one before, 16 … 2^24. Default [256, 2048, 16384]. */
  levels?: number[];
}

export interface WaveformPeaksResult {
  path: string;
  channels: number;
  sampleRate: number;
  frames: number;
  levels: { framesPerBucket: number; buckets: number }[];
}

const DEFAULT_LEVELS = [256, 2048, 16384];
/** Int16 values buffered per level before a write. */
const WRITE_BUFFER_VALUES = 16384;

class LevelWriter {
  readonly scratchPath: string;
  private readonly fd: number;
  private readonly buffer: Int16Array;
  private fill = 0;
  buckets = 0;
  /** Running min/max of the bucket being built, per channel, and how many frames it holds. */
  readonly min: Float64Array;
  readonly max: Float64Array;
  framesInBucket = 0;

  constructor(scratchPath: string, readonly framesPerBucket: number, private readonly channels: number) {
    this.scratchPath = scratchPath;
    this.fd = openSync(scratchPath, 'w');
    // Whole buckets per buffer, so a flush never splits one.
    this.buffer = new Int16Array(Math.max(1, Math.floor(WRITE_BUFFER_VALUES / (2 * channels))) * 2 * channels);
    this.min = new Float64Array(channels).fill(Infinity);
    this.max = new Float64Array(channels).fill(-Infinity);
  }

  /** Appends the bucket being built, quantised outward (min down, max up) so the envelope encloses the samples. */
  emit(): void {
    for (let c = 0; c < this.channels; c++) {
      this.buffer[this.fill++] = Math.max(-32768, Math.min(32767, Math.floor(this.min[c] * PEAKS_SCALE)));
      this.buffer[this.fill++] = Math.max(-32768, Math.min(32767, Math.ceil(this.max[c] * PEAKS_SCALE)));
      this.min[c] = Infinity;
      this.max[c] = -Infinity;
    }
    this.framesInBucket = 0;
    this.buckets++;
    if (this.fill === this.buffer.length) this.flush();
  }

  flush(): void {
    if (this.fill === 0) return;
    writeSync(this.fd, new Uint8Array(this.buffer.buffer, 0, this.fill * 2));
    this.fill = 0;
  }

  close(): void {
    this.flush();
    closeSync(this.fd);
  }
}

export class WaveformPeaksAnalyzer implements Analyzer<WaveformPeaksResult> {
  private readonly outputPath: string;
  private readonly channels: number;
  private readonly sampleRate: number;
  private readonly writers: LevelWriter[];
  private frames = 0;
  private finished = false;

  /**
   * @param format the take's format (sample rate 1 kHz – 768 kHz, 1–64 channels)
   * @param options output path and zoom levels (frames per bucket)
   * @throws RangeError on impossible configuration; the file system's error when the output cannot be created
   */
  constructor(format: AudioFormat, options: WaveformPeaksOptions) {
    assertAnalysableFormat(format, 'WaveformPeaksAnalyzer');
    if (!options || typeof options.outputPath !== 'string' || options.outputPath.trim() === '') {
      throw new RangeError('WaveformPeaksAnalyzer: outputPath must name the peaks file to write.');
    }
    const levels = options.levels ?? DEFAULT_LEVELS;
    if (!Array.isArray(levels) || levels.length < 1 || levels.length > 8) {
      throw new RangeError('WaveformPeaksAnalyzer: levels must list 1 to 8 bucket sizes.');
    }
    levels.forEach((fpb, i) => {
      if (!Number.isInteger(fpb) || fpb < 16 || fpb > 2 ** 24) {
        throw new RangeError(`WaveformPeaksAnalyzer: ${fpb} frames per bucket must be an integer from 16 to 2^24.`);
      }
      if (i > 0 && (fpb <= levels[i - 1] || fpb % levels[i - 1] !== 0)) {
        throw new RangeError(
          `WaveformPeaksAnalyzer: level ${fpb} must be larger than and a multiple of the level before it (${levels[i - 1]}).`,
        );
      }
    });
    this.outputPath = options.outputPath;
    this.channels = format.channels;
    this.sampleRate = format.sampleRate;
    this.writers = levels.map((fpb, i) => new LevelWriter(`${options.outputPath}.level${i}.part`, fpb, this.channels));
  }

  push(block: SampleBlock): void {
    if (this.finished) throw new Error('WaveformPeaksAnalyzer: push() after finish().');
    const fine = this.writers[0];
    const fpb = fine.framesPerBucket;
    let i = 0;
    while (i < block.frames) {
      const n = Math.min(block.frames - i, fpb - fine.framesInBucket);
      for (let c = 0; c < this.channels; c++) {
        const x = block.channels[c];
        extendMinMax(x, i, i + n, fine.min, fine.max, c);
      }
      fine.framesInBucket += n;
      i += n;
      if (fine.framesInBucket === fpb) this.closeBucket(0);
    }
    this.frames += block.frames;
  }

  finish(): WaveformPeaksResult {
    if (this.finished) throw new Error('WaveformPeaksAnalyzer: finish() called twice.');
    this.finished = true;
    // Close the partial last bucket of every level, finest first so each folds into the next.
    for (let l = 0; l < this.writers.length; l++) {
      if (this.writers[l].framesInBucket > 0) this.closeBucket(l, false);
    }
    for (const w of this.writers) w.close();
    // Header, then each level's scratch file in order.
    const table: PeaksLevelInfo[] = [];
    let offset = PEAKS_HEADER_BYTES + PEAKS_LEVEL_ENTRY_BYTES * this.writers.length;
    for (const w of this.writers) {
      table.push({ framesPerBucket: w.framesPerBucket, bucketCount: w.buckets, dataOffset: offset });
      offset += w.buckets * this.channels * 4;
    }
    const out = openSync(this.outputPath, 'w');
    try {
      writeSync(out, encodePeaksHeader({ channels: this.channels, sampleRate: this.sampleRate, totalFrames: this.frames, levels: table }));
      const chunk = Buffer.alloc(1 << 20);
      for (const w of this.writers) {
        const fd = openSync(w.scratchPath, 'r');
        try {
          for (let got = readSync(fd, chunk, 0, chunk.length, null); got > 0; got = readSync(fd, chunk, 0, chunk.length, null)) {
            writeSync(out, chunk, 0, got);
          }
        } finally {
          closeSync(fd);
        }
      }
    } finally {
      closeSync(out);
      for (const w of this.writers) rmSync(w.scratchPath, { force: true });
    }
    return {
      path: this.outputPath,
      channels: this.channels,
      sampleRate: this.sampleRate,
      frames: this.frames,
      levels: this.writers.map((w) => ({ framesPerBucket: w.framesPerBucket, buckets: w.buckets })),
    };
  }

  /** Emits level l's bucket and folds it into level l+1 (whose bucket closes when full, or at the end when `cascade` is false). */
  private closeBucket(level: number, cascade = true): void {
    const w = this.writers[level];
    const frames = w.framesInBucket;
    const up = this.writers[level + 1];
    if (up) {
      for (let c = 0; c < this.channels; c++) {
        if (w.min[c] < up.min[c]) up.min[c] = w.min[c];
        if (w.max[c] > up.max[c]) up.max[c] = w.max[c];
      }
      up.framesInBucket += frames;
    }
    w.emit();
    if (cascade && up && up.framesInBucket === up.framesPerBucket) this.closeBucket(level + 1);
  }
}

/** Widens min[c]/max[c] to cover x[from..to). A small leaf function, so the engine keeps it hot. */
function extendMinMax(x: Float64Array, from: number, to: number, min: Float64Array, max: Float64Array, c: number): void {
  let mn = min[c];
  let mx = max[c];
  for (let j = from; j < to; j++) {
    const v = x[j];
    if (v < mn) mn = v;
    if (v > mx) mx = v;
  }
  min[c] = mn;
  max[c] = mx;
}
