import { TRUE_PEAK_CENTRE_GAIN, TRUE_PEAK_MAX_GAIN, TRUE_PEAK_PHASES, TRUE_PEAK_SIDE_GAIN, TRUE_PEAK_TAPS_PER_PHASE } from '../filters/truePeakFilter';
import type { Analyzer, AudioFormat, SampleBlock } from '../types';

/** Samples per bound check: small enough to skip finely, large enough to amortise the check. */
const CHUNK = 32;
const HISTORY = TRUE_PEAK_TAPS_PER_PHASE - 1;

export interface TruePeakResult {
  /** Highest |value| of the 4x over-sampled signal per channel, linear (full scale = 1.0). */
  channelTruePeaks: number[];
  /** Frame where each channel's true peak occurs (to the nearest sample). */
  channelTruePeakFrames: number[];
}

/**
 * True peak per channel, ITU-R BS.1770-4 Annex 2: 4x over-sampling through the
 * Annex's 48-tap FIR (in floating point, so no 12.04 dB attenuation is needed),
 * then the largest absolute value.
 *
 * Exact shortcuts: an output is a sum of 12 taps times 12 samples, so it is at
 * most TRUE_PEAK_MAX_GAIN × the largest |sample| of its window; a run of
 * outputs whose windows cannot beat the running maximum is not computed. Within
 * a run that can, an output is also bounded by (|h5|+|h6|)·max(|x[n-5]|, |x[n-6]|)
 * + (sum of the other |h|)·(window max), and is skipped when that cannot win.
 * The sample values themselves also count, so the reading never falls below
 * the sample peak (the example filter's phases 1-2 have a DC gain of 0.973).
 */
export class TruePeakAnalyzer implements Analyzer<TruePeakResult> {
  private readonly channelCount: number;
  /** Per channel: the previous HISTORY samples followed by the current block. */
  private extended: Float64Array[];
  private readonly peaks: Float64Array;
  private readonly peakFrames: Float64Array;
  /** Frames pushed so far per channel: the take position of each block's first sample. */
  private readonly framesSeen: Float64Array;

  /** @param format channel count is used */
  constructor(format: AudioFormat) {
    if (!(format.channels >= 1)) throw new RangeError('True peak needs at least one channel');
    this.channelCount = format.channels;
    this.extended = Array.from({ length: format.channels }, () => new Float64Array(HISTORY));
    this.peaks = new Float64Array(format.channels);
    this.peakFrames = new Float64Array(format.channels);
    this.framesSeen = new Float64Array(format.channels);
  }

  push(block: SampleBlock): void {
    for (let channel = 0; channel < this.channelCount; channel++) this.pushChannel(channel, block.channels[channel], block.frames);
  }

  /** Runs one channel's samples through the interpolator (used directly by parallel workers). */
  pushChannel(channel: number, samples: Float64Array, frames: number): void {
    if (frames === 0) return;
    let extended = this.extended[channel];
    if (extended.length < HISTORY + frames) {
      const larger = new Float64Array(HISTORY + frames);
      larger.set(extended.subarray(0, HISTORY));
      extended = larger;
      this.extended[channel] = extended;
    }
    extended.set(samples.subarray(0, frames), HISTORY);
    let peak = this.peaks[channel];
    let peakFrame = this.peakFrames[channel];
    const base = this.framesSeen[channel];
    const [a0, a1, a2, a3, a4, a5, a6, a7, a8, a9, a10, a11] = TRUE_PEAK_PHASES[0];
    const [b0, b1, b2, b3, b4, b5, b6, b7, b8, b9, b10, b11] = TRUE_PEAK_PHASES[1];
    for (let chunkStart = 0; chunkStart < frames; chunkStart += CHUNK) {
      const chunkEnd = Math.min(frames, chunkStart + CHUNK);
      // Window of the chunk's outputs: samples chunkStart-11 .. chunkEnd-1 (offset by HISTORY in `extended`).
      let windowMax = 0;
      for (let i = chunkStart; i < chunkEnd + HISTORY; i++) {
        const magnitude = Math.abs(extended[i]);
        if (magnitude > windowMax) windowMax = magnitude;
      }
      if (windowMax * TRUE_PEAK_MAX_GAIN <= peak) continue;
      const sideBound = TRUE_PEAK_SIDE_GAIN * windowMax;
      for (let n = chunkStart; n < chunkEnd; n++) {
        // extended[n + HISTORY - k] is x[n - k].
        const newest = n + HISTORY;
        const centre5 = Math.abs(extended[newest - 5]);
        const centre6 = Math.abs(extended[newest - 6]);
        const newestMagnitude = Math.abs(extended[newest]);
        if (newestMagnitude > peak) {
          peak = newestMagnitude;
          peakFrame = base + n;
        }
        if (TRUE_PEAK_CENTRE_GAIN * (centre5 > centre6 ? centre5 : centre6) + sideBound <= peak) continue;
        // The 12 taps unrolled; phases 3 and 2 are phases 0 and 1 reversed (Annex 2 table).
        const x0 = extended[newest], x1 = extended[newest - 1], x2 = extended[newest - 2], x3 = extended[newest - 3];
        const x4 = extended[newest - 4], x5 = extended[newest - 5], x6 = extended[newest - 6], x7 = extended[newest - 7];
        const x8 = extended[newest - 8], x9 = extended[newest - 9], x10 = extended[newest - 10], x11 = extended[newest - 11];
        const sum0 = a0 * x0 + a1 * x1 + a2 * x2 + a3 * x3 + a4 * x4 + a5 * x5 + a6 * x6 + a7 * x7 + a8 * x8 + a9 * x9 + a10 * x10 + a11 * x11;
        const sum3 = a11 * x0 + a10 * x1 + a9 * x2 + a8 * x3 + a7 * x4 + a6 * x5 + a5 * x6 + a4 * x7 + a3 * x8 + a2 * x9 + a1 * x10 + a0 * x11;
        const sum1 = b0 * x0 + b1 * x1 + b2 * x2 + b3 * x3 + b4 * x4 + b5 * x5 + b6 * x6 + b7 * x7 + b8 * x8 + b9 * x9 + b10 * x10 + b11 * x11;
        const sum2 = b11 * x0 + b10 * x1 + b9 * x2 + b8 * x3 + b7 * x4 + b6 * x5 + b5 * x6 + b4 * x7 + b3 * x8 + b2 * x9 + b1 * x10 + b0 * x11;
        const magnitude = Math.max(Math.abs(sum0), Math.abs(sum1), Math.abs(sum2), Math.abs(sum3));
        if (magnitude > peak) {
          peak = magnitude;
          // The interpolated points lie between x[n-6] and x[n-5], the filter's centre taps.
          peakFrame = base + n - 6;
        }
      }
    }
    this.peaks[channel] = peak;
    this.peakFrames[channel] = peakFrame;
    this.framesSeen[channel] = base + frames;
    extended.copyWithin(0, frames, frames + HISTORY);
  }

  /** Flushes the filters' last outputs (the take followed by zeros). */
  private flush(): void {
    const zeros = new Float64Array(HISTORY);
    for (let channel = 0; channel < this.channelCount; channel++) this.pushChannel(channel, zeros, HISTORY);
  }

  finish(): TruePeakResult {
    this.flush();
    // The flush's zeros are not part of the take: a peak found there belongs to its last frame.
    const lastFrame = (channel: number) => Math.max(0, this.framesSeen[channel] - HISTORY - 1);
    return {
      channelTruePeaks: Array.from(this.peaks),
      channelTruePeakFrames: Array.from(this.peakFrames, (frame, channel) => Math.min(Math.max(0, frame), lastFrame(channel))),
    };
  }
}
