import type { Analyzer, AudioFormat, SampleBlock } from '../types';

/** A channel whose AC level stays below this carries no signal [common practice]: 16-bit TPDF dither alone reads about -101 dBFS. */
export const SILENT_CHANNEL_DBFS = -90;
/** Windows for the level distribution (dead channels, steady DC), seconds. */
const WINDOW_SEC = 0.1;
/** Window AC levels are kept in a histogram of this step, dB, from HISTOGRAM_FLOOR_DB up. */
const HISTOGRAM_STEP_DB = 0.25;
const HISTOGRAM_FLOOR_DB = -200;
const HISTOGRAM_BINS = 880;
/** Share of windows, the quietest first, whose mean is the steady DC offset [common practice]. */
const QUIET_WINDOW_SHARE = 0.2;
/** The steady offset is reported net of this many standard errors of the windows' scatter (about 99.7 % one-sided) [textbook]. */
const STANDARD_ERRORS = 3;
/**
 * A channel whose loud windows (99.5th percentile) are within this of its quiet ones (10th percentile)
 * carries a steady noise, not programme [common practice]: speech and music move by 20 dB and more.
 */
const STEADY_SPREAD_DB = 6;
/** Steady noise below this is an open input whatever the other channels carry, dBFS [common practice]. */
const OPEN_INPUT_DBFS = -80;
/** Steady noise this far below the loudest channel, and below QUIET_NOISE_DBFS, is a channel left unconnected [common practice]. */
const BELOW_PROGRAMME_DB = 30;
const QUIET_NOISE_DBFS = -50;
/**
 * A channel left unconnected carries its amplifier's hiss, which is white: at least half its power lies
 * above 4 kHz (0.8 when it reaches the converter's band edge, 0.57 even when band-limited to 10 kHz),
 * while room tone and ambience, dominated by low frequencies, carry far less there (pink noise 0.25,
 * room tone about 0.3-0.45) [computed: white and pink noise through a 2nd-order Butterworth high-pass].
 * Only steady noise this broadband is taken for an open input by the relative rule (BELOW_PROGRAMME_DB):
 * a quiet atmosphere in the surrounds of a mix is programme.
 */
const HISS_HIGH_PASS_HZ = 4000;
const HISS_MIN_HIGH_SHARE = 0.5;
/** Fewest non-silent windows (1 s) before a channel's steadiness is judged. */
const MIN_JUDGED_WINDOWS = 10;

/** Float samples are tested against the 24-bit integer grid (the finest grid a float32 mantissa holds at full scale). */
const FLOAT_GRID_BITS = 24;
const FLOAT_GRID_SCALE = 2 ** (FLOAT_GRID_BITS - 1);

export interface ChannelLevels {
  /** Largest |sample|, full scale = 1.0. */
  samplePeak: number;
  /** Mean square, full scale = 1.0 (a full-scale square wave has 1.0). */
  meanSquare: number;
  /** Mean sample value (DC offset), full scale = 1.0. */
  dcOffset: number;
  /**
   * Mean of the quietest 20 % of 100 ms windows, less three standard errors of their scatter: a
   * converter's offset is there all the time, while the mean of an asymmetric waveform (speech) is
   * there only while it sounds, and that of low-frequency noise wanders. Full scale = 1.0.
   */
  steadyDcOffset: number;
  /** AC level the loudest 0.5 % of 100 ms windows reach, dBFS (square-wave reference); null when all are silent. */
  loudWindowDbfs: number | null;
  /** Float samples beyond full scale (|x| > 1), and the first frame holding one (null when none). */
  overFullScaleSamples: number;
  firstOverFullScaleFrame: number | null;
  /** Bits that carry information: container bits minus the trailing zero bits common to every sample. */
  effectiveBits: number;
  /** Share of the AC power above 4 kHz (2nd-order Butterworth high-pass); null when the rate cannot carry 4 kHz. */
  highShare: number | null;
  /** The channel carries no programme: nothing above -90 dBFS, or only a steady noise such as an open input's hiss. */
  silent: boolean;
  /** Why it is silent: 'no-signal' (digital zero or below -90 dBFS) or 'noise-only'; null when it carries programme. */
  silentKind: 'no-signal' | 'noise-only' | null;
}

export interface LevelsResult {
  channels: ChannelLevels[];
}

/** 2nd-order Butterworth high-pass (bilinear transform, Q = 1/sqrt 2; R. Bristow-Johnson, Audio EQ Cookbook). */
function butterworthHighPass(cutoffHz: number, sampleRate: number): { b0: number; b1: number; b2: number; a1: number; a2: number } {
  const w0 = (2 * Math.PI * cutoffHz) / sampleRate;
  const alpha = Math.sin(w0) / (2 * Math.SQRT1_2);
  const cos = Math.cos(w0);
  const a0 = 1 + alpha;
  return { b0: (1 + cos) / 2 / a0, b1: -(1 + cos) / a0, b2: (1 + cos) / 2 / a0, a1: (-2 * cos) / a0, a2: (1 - alpha) / a0 };
}

/** Counts trailing zero bits of a non-zero 32-bit integer. */
function trailingZeroBits(value: number): number {
  return 31 - Math.clz32(value & -value);
}

/**
 * Per-channel sample peak, mean square, DC and effective bits.
 * Effective bits: OR every integer code and count the trailing zeros, so a
 * 24-bit file whose low 8 bits are never used reads 16. Float samples are
 * tested against the 24-bit grid; a float file holding 16- or 24-bit values
 * reads 16 or 24, and one with values off that grid reads its container bits.
 */
export class LevelsAnalyzer implements Analyzer<LevelsResult> {
  private readonly format: AudioFormat;
  private readonly peaks: Float64Array;
  private readonly sums: Float64Array;
  private readonly squareSums: Float64Array;
  /** OR of all integer codes per channel (codes on the float's 24-bit grid for float files). */
  private readonly codeBitsUsed: Int32Array;
  /** Float files only: a sample was found off the 24-bit grid. */
  private readonly offGrid: Uint8Array;
  private frames = 0;
  private readonly windowFrames: number;
  private windowFill = 0;
  private readonly windowSums: Float64Array;
  private readonly windowSquareSums: Float64Array;
  /** Per channel: windows per AC-level bin, and the sums of those windows' means and squared means. */
  private readonly windowCounts: Float64Array[];
  private readonly windowMeanSums: Float64Array[];
  private readonly windowMeanSquareSums: Float64Array[];
  private readonly overFullScale: Float64Array;
  private readonly firstOverFullScale: Float64Array;
  /** High-pass for the hiss test: biquad coefficients (null below 9 kHz sample rates), per-channel state and output power. */
  private readonly highPass: { b0: number; b1: number; b2: number; a1: number; a2: number } | null;
  private readonly highPassState: Float64Array[];
  private readonly highSquareSums: Float64Array;

  /** @param format encoding and bits decide the integer grid */
  constructor(format: AudioFormat) {
    if (!(format.channels >= 1)) throw new RangeError('Levels need at least one channel');
    this.format = format;
    this.peaks = new Float64Array(format.channels);
    this.sums = new Float64Array(format.channels);
    this.squareSums = new Float64Array(format.channels);
    this.codeBitsUsed = new Int32Array(format.channels);
    this.offGrid = new Uint8Array(format.channels);
    this.windowFrames = Math.max(1, Math.round(WINDOW_SEC * format.sampleRate));
    this.windowSums = new Float64Array(format.channels);
    this.windowSquareSums = new Float64Array(format.channels);
    this.windowCounts = Array.from({ length: format.channels }, () => new Float64Array(HISTOGRAM_BINS));
    this.windowMeanSums = Array.from({ length: format.channels }, () => new Float64Array(HISTOGRAM_BINS));
    this.windowMeanSquareSums = Array.from({ length: format.channels }, () => new Float64Array(HISTOGRAM_BINS));
    this.overFullScale = new Float64Array(format.channels);
    this.firstOverFullScale = new Float64Array(format.channels).fill(-1);
    this.highPass = format.sampleRate > 2.25 * HISS_HIGH_PASS_HZ ? butterworthHighPass(HISS_HIGH_PASS_HZ, format.sampleRate) : null;
    this.highPassState = Array.from({ length: format.channels }, () => new Float64Array(4));
    this.highSquareSums = new Float64Array(format.channels);
  }

  /** Runs a block through the hiss test's high-pass and sums its output power. */
  private pushHighPass(channel: number, samples: Float64Array, frames: number): void {
    const { b0, b1, b2, a1, a2 } = this.highPass!;
    const state = this.highPassState[channel];
    let [x1, x2, y1, y2] = state;
    let sum = 0;
    for (let i = 0; i < frames; i++) {
      const x = samples[i];
      const y = b0 * x + b1 * x1 + b2 * x2 - a1 * y1 - a2 * y2;
      x2 = x1; x1 = x; y2 = y1; y1 = y;
      sum += y * y;
    }
    state[0] = x1; state[1] = x2; state[2] = y1; state[3] = y2;
    this.highSquareSums[channel] += sum;
  }

  push(block: SampleBlock): void {
    const frames = block.frames;
    const channels = this.format.channels;
    const isFloat = this.format.encoding === 'float';
    const codeScale = isFloat ? FLOAT_GRID_SCALE : 2 ** (this.format.bitsPerSample - 1);
    // One pass, cut where the 100 ms windows end.
    let start = 0;
    while (start < frames) {
      const end = Math.min(frames, start + this.windowFrames - this.windowFill);
      for (let channel = 0; channel < channels; channel++) {
        const samples = block.channels[channel];
        let peak = this.peaks[channel];
        let sum = 0;
        let squareSum = 0;
        let bitsUsed = this.codeBitsUsed[channel];
        for (let i = start; i < end; i++) {
          const x = samples[i];
          const magnitude = x < 0 ? -x : x;
          if (magnitude > peak) peak = magnitude;
          sum += x;
          squareSum += x * x;
          // Integer codes are exact in float64, so `| 0` of code·scale is the code itself.
          bitsUsed |= x * codeScale;
        }
        this.peaks[channel] = peak;
        this.sums[channel] += sum;
        this.squareSums[channel] += squareSum;
        this.windowSums[channel] += sum;
        this.windowSquareSums[channel] += squareSum;
        this.codeBitsUsed[channel] = bitsUsed;
      }
      this.windowFill += end - start;
      start = end;
      if (this.windowFill === this.windowFrames) this.closeWindow();
    }
    if (this.highPass) for (let channel = 0; channel < channels; channel++) this.pushHighPass(channel, block.channels[channel], frames);
    if (isFloat) {
      for (let channel = 0; channel < channels; channel++) {
        const samples = block.channels[channel];
        if (this.offGrid[channel] === 0) {
          for (let i = 0; i < frames; i++) {
            const code = samples[i] * codeScale;
            if (code !== Math.trunc(code) || code >= 2147483648 || code < -2147483648) {
              this.offGrid[channel] = 1;
              break;
            }
          }
        }
        if (this.peaks[channel] > 1) this.countOverFullScale(channel, samples, frames, block.startFrame);
      }
    }
    this.frames += frames;
  }

  private countOverFullScale(channel: number, samples: Float64Array, frames: number, startFrame: number): void {
    let count = 0;
    for (let i = 0; i < frames; i++) {
      if (samples[i] > 1 || samples[i] < -1) {
        if (count++ === 0 && this.firstOverFullScale[channel] < 0) this.firstOverFullScale[channel] = startFrame + i;
      }
    }
    this.overFullScale[channel] += count;
  }

  private closeWindow(): void {
    const n = this.windowFrames;
    for (let channel = 0; channel < this.format.channels; channel++) {
      const squareSum = this.windowSquareSums[channel];
      const mean = this.windowSums[channel] / n;
      this.windowSums[channel] = 0;
      this.windowSquareSums[channel] = 0;
      // Digital zero (no converter in the path: muted, gated, edited) says nothing of level or offset.
      if (squareSum === 0) continue;
      const acPower = squareSum / n - mean * mean;
      // A constant (DC only) window, and anything below the floor, goes to bin 0.
      const bin = acPower > 0 ? Math.max(0, Math.min(HISTOGRAM_BINS - 1, Math.floor((10 * Math.log10(acPower) - HISTOGRAM_FLOOR_DB) / HISTOGRAM_STEP_DB))) : 0;
      this.windowCounts[channel][bin]++;
      this.windowMeanSums[channel][bin] += mean;
      this.windowMeanSquareSums[channel][bin] += mean * mean;
    }
    this.windowFill = 0;
  }

  /** Level (dB, bin centre) at a percentile of a channel's non-silent windows; null when there are too few. */
  private windowLevelAt(channel: number, percent: number): number | null {
    const counts = this.windowCounts[channel];
    let total = 0;
    for (let bin = 1; bin < HISTOGRAM_BINS; bin++) total += counts[bin];
    if (total < MIN_JUDGED_WINDOWS) return null;
    const wanted = (percent / 100) * total;
    let seen = 0;
    for (let bin = 1; bin < HISTOGRAM_BINS; bin++) {
      seen += counts[bin];
      if (seen >= wanted) return HISTOGRAM_FLOOR_DB + (bin + 0.5) * HISTOGRAM_STEP_DB;
    }
    return null;
  }

  /**
   * Mean of the quietest QUIET_WINDOW_SHARE of windows (digital zero left out), less three
   * standard errors of that mean (towards 0): low-frequency noise moves a window's mean from window to
   * window, a converter's offset does not, so only an offset that stands out of that scatter remains.
   * The whole mean when there are no such windows.
   */
  private steadyDcOffset(channel: number, wholeMean: number): number {
    const counts = this.windowCounts[channel];
    let total = 0;
    for (let bin = 0; bin < HISTOGRAM_BINS; bin++) total += counts[bin];
    if (total === 0) return wholeMean;
    const wanted = Math.max(1, QUIET_WINDOW_SHARE * total);
    let windows = 0;
    let meanSum = 0;
    let meanSquareSum = 0;
    for (let bin = 0; bin < HISTOGRAM_BINS && windows < wanted; bin++) {
      windows += counts[bin];
      meanSum += this.windowMeanSums[channel][bin];
      meanSquareSum += this.windowMeanSquareSums[channel][bin];
    }
    const mean = meanSum / windows;
    const variance = windows > 1 ? Math.max(0, (meanSquareSum - windows * mean * mean) / (windows - 1)) : 0;
    const bound = Math.max(0, Math.abs(mean) - STANDARD_ERRORS * Math.sqrt(variance / windows));
    return bound === 0 ? 0 : Math.sign(mean) * bound;
  }

  finish(): LevelsResult {
    const frames = Math.max(1, this.frames);
    const gridBits = this.format.encoding === 'float' ? FLOAT_GRID_BITS : this.format.bitsPerSample;
    const channels = Array.from({ length: this.format.channels }, (_, channel): ChannelLevels => {
      const meanSquare = this.squareSums[channel] / frames;
      const dcOffset = this.sums[channel] / frames;
      const acPower = Math.max(0, meanSquare - dcOffset * dcOffset);
      const bitsUsed = this.codeBitsUsed[channel];
      let effectiveBits: number;
      if (this.format.encoding === 'float' && this.offGrid[channel]) effectiveBits = this.format.bitsPerSample;
      else effectiveBits = bitsUsed === 0 ? 0 : gridBits - trailingZeroBits(bitsUsed);
      const noSignal = acPower === 0 || 10 * Math.log10(acPower) < SILENT_CHANNEL_DBFS;
      return {
        samplePeak: this.peaks[channel],
        meanSquare,
        dcOffset,
        steadyDcOffset: this.steadyDcOffset(channel, dcOffset),
        loudWindowDbfs: this.windowLevelAt(channel, 99.5),
        overFullScaleSamples: this.overFullScale[channel],
        firstOverFullScaleFrame: this.firstOverFullScale[channel] >= 0 ? this.firstOverFullScale[channel] : null,
        effectiveBits,
        highShare: this.highPass && acPower > 0 ? Math.min(1, this.highSquareSums[channel] / frames / acPower) : null,
        silent: noSignal,
        silentKind: noSignal ? 'no-signal' : null,
      };
    });
    this.markNoiseOnlyChannels(channels);
    return { channels };
  }

  /**
   * Marks channels that carry only a steady noise (an open input's hiss, a switched-off radio mic):
   * its loud windows are no louder than its quiet ones, and it is either below any programme level or
   * a white hiss far below the other channels' programme.
   */
  private markNoiseOnlyChannels(channels: ChannelLevels[]): void {
    const loudest = Math.max(...channels.map((channel) => (channel.silent ? Number.NEGATIVE_INFINITY : (channel.loudWindowDbfs ?? Number.NEGATIVE_INFINITY))));
    channels.forEach((channel, index) => {
      const loud = channel.loudWindowDbfs;
      const quiet = this.windowLevelAt(index, 10);
      if (channel.silent || loud === null || quiet === null || loud - quiet > STEADY_SPREAD_DB) return;
      const hiss = channel.highShare === null || channel.highShare >= HISS_MIN_HIGH_SHARE;
      if (loud < OPEN_INPUT_DBFS || (hiss && loud < QUIET_NOISE_DBFS && loudest - loud >= BELOW_PROGRAMME_DB)) {
        channel.silent = true;
        channel.silentKind = 'noise-only';
      }
    });
  }
}
