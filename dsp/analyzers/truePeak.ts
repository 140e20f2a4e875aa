import {
  TRUE_PEAK_CENTRE_GAIN,
  TRUE_PEAK_CENTRE_TAP,
  TRUE_PEAK_MAX_GAIN,
  TRUE_PEAK_NORM,
  TRUE_PEAK_PHASES,
  TRUE_PEAK_SIDE_GAIN,
  TRUE_PEAK_TAPS_PER_PHASE,
} from '../filters/truePeakFilter';
import type { Analyzer, AudioFormat, SampleBlock } from '../types';

/** Samples per bound check: small enough to skip finely, large enough to amortise the check. */
const CHUNK = 32;
const TAPS = TRUE_PEAK_TAPS_PER_PHASE;
const HISTORY = TAPS - 1;
const CENTRE = TRUE_PEAK_CENTRE_TAP;
const HALF = TAPS / 2;
/** Per phase 0 and 1: h[k] + h[23-k] and h[k] - h[23-k] for k < 12. */
const FOLDED = [0, 1].map((index) => {
  const phase = TRUE_PEAK_PHASES[index];
  return [
    Float64Array.from({ length: HALF }, (_, k) => phase[k] + phase[HISTORY - k]),
    Float64Array.from({ length: HALF }, (_, k) => phase[k] - phase[HISTORY - k]),
  ];
});

export interface TruePeakResult {
  /** Highest |value| of the 4x over-sampled signal per channel, linear (full scale = 1.0). */
  channelTruePeaks: number[];
  /** Frame where each channel's true peak occurs (to the nearest sample). */
  channelTruePeakFrames: number[];
}

/**
 * True peak per channel, ITU-R BS.1770-4 Annex 2 method: 4x over-sampling
 * through the interpolator of `filters/truePeakFilter` (in floating point, so no
 * 12.04 dB attenuation is needed), then the largest absolute value.
 *
 * Exact shortcuts: an output is a sum of 24 taps times 24 samples, so it is at
 * most TRUE_PEAK_MAX_GAIN × the largest |sample| of its window; a run of
 * outputs whose windows cannot beat the running maximum is not computed. Within
 * a run that can, an output is skipped when either of two bounds cannot win:
 * (|h11|+|h12|)·max(|x[n-11]|, |x[n-12]|) + (sum of the other |h|)·(window max),
 * or (largest phase norm)·(norm of its 24 samples) by Cauchy-Schwarz.
 * The sample values themselves also count, so the reading never falls below
 * the sample peak. The take is followed by 23 zeros, so its last samples'
 * inter-sample peaks are read like every other's.
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
    const [folded0Sum, folded0Difference] = FOLDED[0];
    const [folded1Sum, folded1Difference] = FOLDED[1];
    const normSquared = TRUE_PEAK_NORM * TRUE_PEAK_NORM;
    for (let chunkStart = 0; chunkStart < frames; chunkStart += CHUNK) {
      const chunkEnd = Math.min(frames, chunkStart + CHUNK);
      // Window of the chunk's outputs: samples chunkStart-23 .. chunkEnd-1 (offset by HISTORY in `extended`).
      let windowMax = 0;
      for (let i = chunkStart; i < chunkEnd + HISTORY; i++) {
        const magnitude = Math.abs(extended[i]);
        if (magnitude > windowMax) windowMax = magnitude;
      }
      if (windowMax * TRUE_PEAK_MAX_GAIN <= peak) continue;
      const sideBound = TRUE_PEAK_SIDE_GAIN * windowMax;
      // Energy of the first output's 24 samples, then slid one sample per output.
      let energy = 0;
      for (let i = chunkStart; i < chunkStart + TAPS; i++) energy += extended[i] * extended[i];
      for (let n = chunkStart; n < chunkEnd; n++) {
        // extended[n + HISTORY - k] is x[n - k].
        const newest = n + HISTORY;
        if (n > chunkStart) energy += extended[newest] * extended[newest] - extended[newest - TAPS] * extended[newest - TAPS];
        const newestMagnitude = Math.abs(extended[newest]);
        if (newestMagnitude > peak) {
          peak = newestMagnitude;
          peakFrame = base + n;
        }
        const after = Math.abs(extended[newest - CENTRE + 1]);
        const before = Math.abs(extended[newest - CENTRE]);
        if (TRUE_PEAK_CENTRE_GAIN * (after > before ? after : before) + sideBound <= peak) continue;
        // The sliding sum can drift by rounding; 1e-9 of slack keeps the bound safe.
        if (energy * normSquared * (1 + 1e-9) <= peak * peak) continue;
        // Phases 3 and 2 are phases 0 and 1 reversed. With the window folded about its centre
        // (s = x[n-k] + x[n-23+k], d = x[n-k] - x[n-23+k]), phase 0 + phase 3 = FOLDED_SUM·s and
        // phase 0 - phase 3 = FOLDED_DIFFERENCE·d, so max(|phase 0|, |phase 3|) = (|FS·s| + |FD·d|)/2.
        let even0 = 0, odd0 = 0, even1 = 0, odd1 = 0;
        for (let k = 0; k < HALF; k++) {
          const early = extended[newest - k];
          const late = extended[newest - HISTORY + k];
          const sum = early + late;
          const difference = early - late;
          even0 += folded0Sum[k] * sum;
          odd0 += folded0Difference[k] * difference;
          even1 += folded1Sum[k] * sum;
          odd1 += folded1Difference[k] * difference;
        }
        const outer = Math.abs(even0) + Math.abs(odd0);
        const inner = Math.abs(even1) + Math.abs(odd1);
        const magnitude = (outer > inner ? outer : inner) / 2;
        if (magnitude > peak) {
          peak = magnitude;
          // The interpolated points lie between x[n-12] and x[n-11], the filter's centre taps.
          peakFrame = base + n - CENTRE;
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
