import FFT from 'fft.js';
import type { Analyzer, AudioFormat, SampleBlock } from '../types';
import { assertAnalysableFormat, declaredFrames, hannWindow, isPowerOfTwo } from './formatGuard';

/**
 * Long-term average spectrum of the take (Welch's method: Hann-windowed
 * periodograms averaged over windows spread evenly across the take, the power of
 * all channels averaged), and what it says about the usable bandwidth.
 *
 * Estimate variance: each Welch bin averages K windows × C channels of
 * independent periodograms, so for noise-like content its relative variance is
 * about 1/(K·C), a standard deviation of ≈ 4.34/√(K·C) dB (K = 1000, C = 2:
 * 0.1 dB per bin). The band and plot averages below pool many bins and are
 * steadier still. Programme is not stationary, so the estimate describes the
 * windows taken: with windows spread evenly over the take, that is a uniform
 * time sample of it.
 */

export interface SpectrumOptions {
  /** FFT length, samples (power of two, 1024–65536). Default 8192. */
  fftSize?: number;
  /** Most windows taken from a take whose length the header declares. Default 1000. */
  maxWindows?: number;
  /** Points in the plotted spectrum (log-spaced 20 Hz … Nyquist), 16–4096. Default 240. */
  plotPoints?: number;
}

export interface BandwidthResult {
  /** Highest frequency the content reaches before a steep cut-off, Hz; null for digital silence. */
  effectiveHz: number | null;
  /** Lowest standard rate whose Nyquist frequency lies above `effectiveHz`, when the take looks up-sampled; else null. */
  impliedSourceRate: number | null;
  /** Mean power density in the top 5 % below Nyquist relative to the passband mean density, dB. */
  nearNyquistDb: number | null;
  /** True when the spectrum shows no anti-alias roll-off: energy just below Nyquist comparable to the passband. */
  aliasingRisk: boolean;
  /** Frequency of the strongest spectral line or region above 20 Hz, Hz (interpolated). */
  peakHz: number | null;
  /** Long-term average spectrum for plotting, dB relative to the passband mean density (floored at −200 dB). */
  spectrum: { hz: number[]; db: number[] };
}

/** Standard sample rates an up-sampled take may come from, Hz (AES5 and common consumer/telephony rates). */
export const STANDARD_RATES_HZ = [8000, 11025, 16000, 22050, 24000, 32000, 44100, 48000, 88200, 96000] as const;

/** A cut-off is reported as up-sampling only below this fraction of the declared rate (report contract). */
const UPSAMPLED_MAX_FRACTION = 0.42;
/** Bands the half spectrum is split into for the cut-off search. */
const BAND_COUNT = 256;
/** Drop across a cut-off, dB: the content must stand this far above everything above it. [common practice] */
const CLIFF_DROP_DB = 15;
/** A cut-off must sit within this distance below the loud part of the spectrum, dB (ignores steps in the noise floor). [common practice] */
const CLIFF_MAX_BELOW_CONTENT_DB = 60;
/**
 * Transition band allowed for a cut-off, as a fraction of its frequency. Resampler
 * low-pass filters fall CLIFF_DROP_DB within this span (a default ffmpeg resample
 * 44.1 → 48 kHz falls ≈ 18 dB from 20.6 to 23.7 kHz); a natural 24 dB/octave roll-off
 * falls only ≈ 5 dB over it. [common practice]
 */
const CLIFF_TRANSITION_FRACTION = 0.15;
/**
 * The edge is the half-power (−3 dB) point relative to the passband just under the cut-off,
 * the textbook definition of a filter's bandwidth. (A soft resampler such as ffmpeg's default
 * one is −6 dB only at or just above the original Nyquist frequency, so −6 dB would misread it.)
 */
const EDGE_DROP_DB = 3;
/** Near-Nyquist region, as fractions of Nyquist. */
const NEAR_NYQUIST_FROM = 0.94;
const NEAR_NYQUIST_TO = 0.99;
/** Region compared with it to see a roll-off, fractions of Nyquist. */
const UPPER_PASSBAND_FROM = 0.7;
const UPPER_PASSBAND_TO = 0.85;
/** Aliasing-risk thresholds, dB. [common practice] */
const ALIAS_NEAR_NYQUIST_MIN_DB = -30;
const ALIAS_ROLL_OFF_MAX_DB = 6;
const PLOT_FLOOR_DB = -200;
const TINY_POWER = 1e-30;

function dbPower(p: number): number {
  return 10 * Math.log10(p > TINY_POWER ? p : TINY_POWER);
}

export class SpectrumAnalyzer implements Analyzer<BandwidthResult> {
  private readonly sampleRate: number;
  private readonly channels: number;
  private readonly fftSize: number;
  private readonly plotPoints: number;
  private readonly maxWindows: number;
  private readonly fft: FFT;
  private readonly window: Float64Array;
  private readonly fftIn: Float64Array;
  private readonly fftOut: Float64Array;
  /** Σ over windows of (weight × channel-mean |X[k]|²), k = 0 … N/2. */
  private readonly powerSum: Float64Array;
  private weightSum = 0;
  /** Frames between window starts; doubles whenever a take outgrows its window budget. */
  private hop: number;
  private windowsAtHop = 0;
  /** Start frames and per-channel buffers of the windows being filled (at most three overlap at hop ≥ N/2). */
  private readonly pending: { start: number; filled: number; data: Float64Array[] }[] = [];
  private readonly spare: Float64Array[][] = [];
  private nextStart = 0;
  private framesSeen = 0;
  private finished = false;

  /**
   * @param format the take's format (sample rate 1 kHz – 768 kHz, 1–64 channels)
   * @param options FFT length, window budget and plot resolution
   * @throws RangeError on impossible configuration
   */
  constructor(format: AudioFormat, options: SpectrumOptions = {}) {
    assertAnalysableFormat(format, 'SpectrumAnalyzer');
    const fftSize = options.fftSize ?? 8192;
    if (!isPowerOfTwo(fftSize) || fftSize < 1024 || fftSize > 65536) {
      throw new RangeError(`SpectrumAnalyzer: fftSize ${fftSize} must be a power of two from 1024 to 65536.`);
    }
    const maxWindows = options.maxWindows ?? 1000;
    if (!Number.isInteger(maxWindows) || maxWindows < 1 || maxWindows > 1_000_000) {
      throw new RangeError(`SpectrumAnalyzer: maxWindows ${maxWindows} must be an integer from 1 to 1000000.`);
    }
    const plotPoints = options.plotPoints ?? 240;
    if (!Number.isInteger(plotPoints) || plotPoints < 16 || plotPoints > 4096) {
      throw new RangeError(`SpectrumAnalyzer: plotPoints ${plotPoints} must be an integer from 16 to 4096.`);
    }
    this.sampleRate = format.sampleRate;
    this.channels = format.channels;
    this.fftSize = fftSize;
    this.maxWindows = maxWindows;
    this.plotPoints = plotPoints;
    this.fft = new FFT(fftSize);
    this.window = hannWindow(fftSize);
    this.fftIn = new Float64Array(fftSize);
    this.fftOut = new Float64Array(2 * fftSize);
    this.powerSum = new Float64Array(fftSize / 2 + 1);
    // Spread the budget evenly over a take of known length; 50 % overlap at most.
    const frames = declaredFrames(format);
    const even = frames !== null && frames > fftSize ? Math.floor((frames - fftSize) / Math.max(1, maxWindows - 1)) : 0;
    this.hop = Math.max(fftSize / 2, even);
  }

  push(block: SampleBlock): void {
    if (this.finished) throw new Error('SpectrumAnalyzer: push() after finish().');
    const blockStart = this.framesSeen;
    const blockEnd = blockStart + block.frames;
    // Open every window that starts inside this block.
    while (this.nextStart < blockEnd) {
      this.pending.push({ start: this.nextStart, filled: 0, data: this.takeBuffers() });
      this.nextStart += this.hop;
    }
    for (let w = 0; w < this.pending.length; ) {
      const win = this.pending[w];
      const from = Math.max(win.start + win.filled, blockStart);
      const to = Math.min(win.start + this.fftSize, blockEnd);
      if (to > from) {
        for (let c = 0; c < this.channels; c++) {
          win.data[c].set(block.channels[c].subarray(from - blockStart, to - blockStart), from - win.start);
        }
        win.filled = to - win.start;
      }
      if (win.filled === this.fftSize) {
        this.accumulate(win.data, this.fftSize);
        this.spare.push(win.data);
        this.pending.splice(w, 1);
      } else {
        w++;
      }
    }
    this.framesSeen = blockEnd;
  }

  finish(): BandwidthResult {
    if (this.finished) throw new Error('SpectrumAnalyzer: finish() called twice.');
    this.finished = true;
    // A take shorter than one window still gets one zero-padded window.
    if (this.weightSum === 0 && this.pending.length > 0 && this.pending[0].filled > 0) {
      this.accumulate(this.pending[0].data, this.pending[0].filled);
    }
    return this.evaluate();
  }

  private takeBuffers(): Float64Array[] {
    const reused = this.spare.pop();
    if (reused) return reused;
    return Array.from({ length: this.channels }, () => new Float64Array(this.fftSize));
  }

  /** Adds one window's channel-mean periodogram, weighted by the hop it stands for. */
  private accumulate(data: Float64Array[], valid: number): void {
    const n = this.fftSize;
    const half = n / 2;
    const weight = this.hop;
    const inv = weight / this.channels;
    for (let c = 0; c < this.channels; c++) {
      const x = data[c];
      for (let i = 0; i < valid; i++) this.fftIn[i] = x[i] * this.window[i];
      for (let i = valid; i < n; i++) this.fftIn[i] = 0;
      this.fft.realTransform(this.fftOut, this.fftIn);
      const out = this.fftOut;
      for (let k = 0; k <= half; k++) {
        const re = out[2 * k];
        const im = out[2 * k + 1];
        this.powerSum[k] += (re * re + im * im) * inv;
      }
    }
    this.weightSum += weight;
    // Keep the window count bounded on takes longer than declared (or of unknown length).
    if (++this.windowsAtHop >= this.maxWindows) {
      this.hop *= 2;
      this.windowsAtHop = 0;
    }
  }

  private evaluate(): BandwidthResult {
    const empty: BandwidthResult = {
      effectiveHz: null, impliedSourceRate: null, nearNyquistDb: null, aliasingRisk: false, peakHz: null,
      spectrum: { hz: [], db: [] },
    };
    if (this.weightSum === 0) return empty;
    const n = this.fftSize;
    const half = n / 2;
    const fs = this.sampleRate;
    const nyquist = fs / 2;
    const binHz = fs / n;
    // One-sided Welch PSD, power per Hz: 2·|X|² / (fs · Σw²) (Welch 1967; DC and Nyquist bins not doubled).
    let windowEnergy = 0;
    for (let i = 0; i < n; i++) windowEnergy += this.window[i] * this.window[i];
    const psd = new Float64Array(half + 1);
    let total = 0;
    for (let k = 0; k <= half; k++) {
      const scale = (k === 0 || k === half ? 1 : 2) / (fs * windowEnergy * this.weightSum);
      psd[k] = this.powerSum[k] * scale;
      if (k > 0) total += psd[k];
    }
    if (!(total > 0)) return empty;

    const effectiveHz = this.effectiveBandwidth(psd, binHz, nyquist);
    const meanDensity = (loHz: number, hiHz: number): number => {
      const k0 = Math.max(1, Math.ceil(loHz / binHz));
      const k1 = Math.min(half, Math.floor(hiHz / binHz));
      if (k1 < k0) return psd[Math.min(half, Math.max(1, Math.round(loHz / binHz)))];
      let s = 0;
      for (let k = k0; k <= k1; k++) s += psd[k];
      return s / (k1 - k0 + 1);
    };
    const passband = meanDensity(Math.min(20, effectiveHz / 2), effectiveHz);
    const nearNyquist = meanDensity(NEAR_NYQUIST_FROM * nyquist, NEAR_NYQUIST_TO * nyquist);
    const upperPassband = meanDensity(UPPER_PASSBAND_FROM * nyquist, UPPER_PASSBAND_TO * nyquist);
    const nearNyquistDb = round(dbPower(nearNyquist) - dbPower(passband), 1);
    const rollOffDb = dbPower(nearNyquist) - dbPower(upperPassband);
    // No anti-alias filter: the spectrum runs on to Nyquist at a level comparable to the passband.
    const aliasingRisk =
      effectiveHz >= 0.9 * nyquist && nearNyquistDb > ALIAS_NEAR_NYQUIST_MIN_DB && rollOffDb > -ALIAS_ROLL_OFF_MAX_DB;

    let impliedSourceRate: number | null = null;
    if (effectiveHz < UPSAMPLED_MAX_FRACTION * fs) {
      const rate = STANDARD_RATES_HZ.find((r) => r / 2 > effectiveHz);
      if (rate !== undefined && rate < fs) impliedSourceRate = rate;
    }

    return {
      effectiveHz: Math.round(effectiveHz),
      impliedSourceRate,
      nearNyquistDb,
      aliasingRisk,
      peakHz: this.peakFrequency(psd, binHz),
      spectrum: this.plotSpectrum(psd, binHz, nyquist, passband),
    };
  }

  /**
   * Highest frequency before a steep cut-off: the top band that stands at least
   * CLIFF_DROP_DB above everything above its transition band, refined to the
   * −EDGE_DROP_DB point. A gradual natural roll-off never
   * qualifies, so content that fades out towards Nyquist reads Nyquist.
   */
  private effectiveBandwidth(psd: Float64Array, binHz: number, nyquist: number): number {
    const half = psd.length - 1;
    const binsPerBand = Math.max(1, Math.floor(half / BAND_COUNT));
    const bands = Math.floor(half / binsPerBand);
    const bandDb = new Float64Array(bands);
    for (let b = 0; b < bands; b++) {
      let s = 0;
      for (let k = b * binsPerBand; k < (b + 1) * binsPerBand; k++) s += psd[k];
      bandDb[b] = dbPower(s / binsPerBand);
    }
    // A 5-band running median ignores isolated tones (hum lines, alias products, whistles).
    const smooth = new Float64Array(bands);
    const scratch = new Float64Array(5);
    for (let b = 0; b < bands; b++) {
      let m = 0;
      for (let j = b - 2; j <= b + 2; j++) if (j >= 1 && j < bands) scratch[m++] = bandDb[j];
      smooth[b] = median(scratch.subarray(0, m));
    }
    const suffixMax = new Float64Array(bands + 1).fill(-Infinity);
    for (let b = bands - 1; b >= 0; b--) suffixMax[b] = Math.max(smooth[b], suffixMax[b + 1]);
    // The loud part of the content: 90th percentile of the band levels.
    const contentDb = percentile(smooth.subarray(1), 0.9);
    const lowestBand = Math.max(2, Math.ceil(200 / (binsPerBand * binHz)));
    for (let b = bands - 2; b >= lowestBand; b--) {
      const gap = Math.max(2, Math.ceil(CLIFF_TRANSITION_FRACTION * b));
      if (b + gap >= bands) continue;
      if (smooth[b] < contentDb - CLIFF_MAX_BELOW_CONTENT_DB) continue;
      if (smooth[b] - suffixMax[b + gap] < CLIFF_DROP_DB) continue;
      // Edge: the passband level is taken one transition width below the cut-off band (band b
      // may already lie inside a steep filter's slope); walking up the median-smoothed bands
      // (a median keeps a monotone edge where it is, and ignores the dips between harmonics),
      // the edge is where the level crosses EDGE_DROP_DB below it, interpolated between band centres.
      const refEnd = Math.max(1, b - gap);
      let under = 0;
      let count = 0;
      for (let j = Math.max(1, refEnd - 4); j <= refEnd; j++) {
        under += Math.pow(10, smooth[j] / 10);
        count++;
      }
      const edgeDb = dbPower(under / count) - EDGE_DROP_DB;
      let j = refEnd + 1;
      while (j < Math.min(bands, b + gap + 1) && smooth[j] >= edgeDb) j++;
      const bandHz = binsPerBand * binHz;
      const centre = (i: number) => (i + 0.5) * bandHz;
      const fraction = smooth[j - 1] > smooth[j] ? (smooth[j - 1] - edgeDb) / (smooth[j - 1] - smooth[j]) : 0;
      return Math.min(nyquist, centre(j - 1) + Math.max(0, Math.min(1, fraction)) * bandHz);
    }
    return nyquist;
  }

  private peakFrequency(psd: Float64Array, binHz: number): number | null {
    const half = psd.length - 1;
    let best = Math.max(1, Math.ceil(20 / binHz));
    for (let k = best + 1; k < half; k++) if (psd[k] > psd[best]) best = k;
    if (!(psd[best] > 0)) return null;
    // Parabolic interpolation of the log-power peak (Gaussian approximation of the Hann main lobe).
    let offset = 0;
    if (best > 0 && best < half) {
      const a = dbPower(psd[best - 1]);
      const b = dbPower(psd[best]);
      const c = dbPower(psd[best + 1]);
      const denom = a - 2 * b + c;
      if (denom < 0) offset = (0.5 * (a - c)) / denom;
    }
    return round((best + offset) * binHz, 2);
  }

  /** Log-spaced points from 20 Hz to Nyquist; each the mean density of the bins it covers (or the nearest bin). */
  private plotSpectrum(psd: Float64Array, binHz: number, nyquist: number, passband: number): { hz: number[]; db: number[] } {
    const half = psd.length - 1;
    const lo = Math.min(20, nyquist / 4);
    const ratio = Math.pow(nyquist / lo, 1 / this.plotPoints);
    const ref = dbPower(passband);
    const hz: number[] = [];
    const db: number[] = [];
    for (let i = 0; i < this.plotPoints; i++) {
      const f0 = lo * Math.pow(ratio, i);
      const f1 = f0 * ratio;
      const k0 = Math.ceil(f0 / binHz);
      const k1 = Math.min(half, Math.floor(f1 / binHz));
      let p: number;
      if (k1 >= k0) {
        let s = 0;
        for (let k = k0; k <= k1; k++) s += psd[k];
        p = s / (k1 - k0 + 1);
      } else {
        p = psd[Math.min(half, Math.round(Math.sqrt(f0 * f1) / binHz))];
      }
      hz.push(round(Math.sqrt(f0 * f1), 1));
      db.push(round(Math.max(PLOT_FLOOR_DB, dbPower(p) - ref), 2));
    }
    return { hz, db };
  }
}

function round(x: number, digits: number): number {
  const f = Math.pow(10, digits);
  return Math.round(x * f) / f;
}

function median(values: Float64Array): number {
  const sorted = Float64Array.from(values).sort();
  const m = sorted.length;
  if (m === 0) return -Infinity;
  return m % 2 ? sorted[(m - 1) / 2] : 0.5 * (sorted[m / 2 - 1] + sorted[m / 2]);
}

function percentile(values: Float64Array, q: number): number {
  const sorted = Float64Array.from(values).sort();
  if (sorted.length === 0) return -Infinity;
  return sorted[Math.min(sorted.length - 1, Math.floor(q * sorted.length))];
}
