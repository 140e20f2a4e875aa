import FFT from 'fft.js';
import type { Analyzer, AudioFormat, SampleBlock } from '../types';
import { powerToDbFloored, roundTo } from '../util/decibels';
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
  /** Highest frequency the content reaches before a steep cut-off, Hz; null for digital silence and for content that is not broadband (tones only). */
  effectiveHz: number | null;
  /**
   * The standard rate the take was probably made at and converted up from: the lowest whose Nyquist frequency lies
   * above `effectiveHz`, claimed only where the cut-off sits where a resampler's low-pass puts it; else null.
   */
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

/**
 * Where a resampler's low-pass ends its pass band (−3 dB), as fractions of the old Nyquist frequency:
 * from 80 % (speech codecs, telephone channels) to a little past it (ffmpeg's default soft filter is
 * −3 dB at about 100.5 %). [common practice]
 */
const SOURCE_EDGE_MIN_FRACTION = 0.8;
const SOURCE_EDGE_MAX_FRACTION = 1.02;
/**
 * A take's own converter passes up to about 0.45 fs (delta-sigma decimation filters end their pass band
 * at 0.45–0.4535 fs) and its content is gone a little above that; a resampler from a lower standard rate
 * has removed everything by that rate's Nyquist. So content that is still there at 0.45 fs was cut by the
 * take's own converter: native 48 kHz music that holds on to 21.5 kHz (gone by about 21.9 kHz) is not
 * "made at 44.1 kHz", while sox's 44.1 → 48 kHz conversion is −3 dB at 20.95 kHz and gone by 21.4 kHz.
 * [common practice]
 */
const NATIVE_STOP_FRACTION = 0.45;
/**
 * Broadband content: at least this share of the bands from 200 Hz to the cut-off stand CLIFF_DROP_DB over
 * what lies above it, and at least BROADBAND_MIN_BANDS of them (a tone and its window leakage fill a few). [common practice]
 */
const BROADBAND_MIN_SHARE = 0.5;
const BROADBAND_MIN_BANDS = 16;
/**
 * ... and broadband at once, not only on average: in the mean window at least this share of those bands holds
 * content (within PRESENT_WITHIN_DB of the window's strongest band). A sweep covers the band over time, one
 * frequency at a time, and fills a few percent. [common practice]
 */
const BROADBAND_MIN_PRESENCE = 0.25;
const PRESENT_WITHIN_DB = 50;
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
/** A band this much under the one below it is still on a filter's slope, dB. [common practice] */
const SLOPE_STEP_DB = 1.5;
/** Near-Nyquist region, as fractions of Nyquist. */
const NEAR_NYQUIST_FROM = 0.94;
const NEAR_NYQUIST_TO = 0.99;
/** Region compared with it to see a roll-off, fractions of Nyquist. */
const UPPER_PASSBAND_FROM = 0.7;
const UPPER_PASSBAND_TO = 0.85;
/**
 * Aliasing-risk thresholds, dB: the top 5 % below Nyquist as dense as the passband on average (a converter
 * without an anti-alias filter fills it with folded content), not merely present: a full-band electronic
 * master with digital hi-hats keeps it about 7 dB down. [common practice]
 */
const ALIAS_NEAR_NYQUIST_MIN_DB = -3;
const ALIAS_ROLL_OFF_MAX_DB = 6;
const PLOT_FLOOR_DB = -200;
const TINY_POWER = 1e-30;

const dbPower = (power: number) => powerToDbFloored(power, TINY_POWER);

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
  /** One window's channel-mean |X[k]|², and its band sums. */
  private readonly windowPower: Float64Array;
  private readonly windowBands: Float64Array;
  /** Σ over windows of the weight of those in which each band held content (within PRESENT_WITHIN_DB of the window's strongest band). */
  private readonly bandPresence: Float64Array;
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
    this.windowPower = new Float64Array(fftSize / 2 + 1);
    this.windowBands = new Float64Array(BAND_COUNT);
    this.bandPresence = new Float64Array(BAND_COUNT);
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
    const inv = 1 / this.channels;
    this.windowPower.fill(0);
    for (let c = 0; c < this.channels; c++) {
      const x = data[c];
      for (let i = 0; i < valid; i++) this.fftIn[i] = x[i] * this.window[i];
      for (let i = valid; i < n; i++) this.fftIn[i] = 0;
      this.fft.realTransform(this.fftOut, this.fftIn);
      const out = this.fftOut;
      for (let k = 0; k <= half; k++) {
        const re = out[2 * k];
        const im = out[2 * k + 1];
        this.windowPower[k] += (re * re + im * im) * inv;
      }
    }
    for (let k = 0; k <= half; k++) this.powerSum[k] += this.windowPower[k] * weight;
    this.notePresence(weight);
    this.weightSum += weight;
    // Keep the window count bounded on takes longer than declared (or of unknown length).
    if (++this.windowsAtHop >= this.maxWindows) {
      this.hop *= 2;
      this.windowsAtHop = 0;
    }
  }

  /** Marks the bands in which this window held content: a tone or a sweep fills a few, broadband sound most. */
  private notePresence(weight: number): void {
    const binsPerBand = Math.max(1, Math.floor(this.fftSize / 2 / BAND_COUNT));
    let strongest = 0;
    for (let b = 0; b < BAND_COUNT; b++) {
      let sum = 0;
      for (let k = b * binsPerBand; k < (b + 1) * binsPerBand; k++) sum += this.windowPower[k];
      this.windowBands[b] = sum;
      if (b > 0 && sum > strongest) strongest = sum;
    }
    if (!(strongest > 0)) return;
    const threshold = strongest * 10 ** (-PRESENT_WITHIN_DB / 10);
    for (let b = 1; b < BAND_COUNT; b++) if (this.windowBands[b] >= threshold) this.bandPresence[b] += weight;
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

    const { edgeHz: effectiveHz, stopHz, broadband } = this.effectiveBandwidth(psd, binHz, nyquist);
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
    const nearNyquistDb = roundTo(dbPower(nearNyquist) - dbPower(passband), 1);
    const rollOffDb = dbPower(nearNyquist) - dbPower(upperPassband);
    // No anti-alias filter: the spectrum runs on to Nyquist at a level comparable to the passband.
    const aliasingRisk =
      effectiveHz >= 0.9 * nyquist && nearNyquistDb > ALIAS_NEAR_NYQUIST_MIN_DB && rollOffDb > -ALIAS_ROLL_OFF_MAX_DB;

    // Up-sampled: broadband content that stops where a resampler's low-pass for a lower standard rate
    // puts the cut-off, and is gone below where the take's own converter would remove it.
    const sourceRate = STANDARD_RATES_HZ.find((rate) => SOURCE_EDGE_MAX_FRACTION * (rate / 2) >= effectiveHz);
    const impliedSourceRate =
      broadband && sourceRate !== undefined && sourceRate < fs && stopHz < NATIVE_STOP_FRACTION * fs &&
      effectiveHz >= SOURCE_EDGE_MIN_FRACTION * (sourceRate / 2)
        ? sourceRate
        : null;

    return {
      effectiveHz: broadband ? Math.round(effectiveHz) : null,
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
   * −EDGE_DROP_DB point. A gradual natural roll-off never qualifies, so content
   * that fades out towards Nyquist reads Nyquist. `broadband` says whether the
   * content under a cut-off fills the band (not a tone and its leakage).
   */
  private effectiveBandwidth(psd: Float64Array, binHz: number, nyquist: number): { edgeHz: number; stopHz: number; broadband: boolean } {
    const half = psd.length - 1;
    const binsPerBand = Math.max(1, Math.floor(half / BAND_COUNT));
    const bands = Math.floor(half / binsPerBand);
    const bandDb = new Float64Array(bands);
    for (let b = 0; b < bands; b++) {
      let s = 0;
      for (let k = b * binsPerBand; k < (b + 1) * binsPerBand; k++) s += psd[k];
      bandDb[b] = dbPower(s / binsPerBand);
    }
    // A 5-band running median ignores isolated tones (hum lines, alias products, whistles); an
    // 11-band one (about 1 kHz at 48 kHz) also evens out the peaks and valleys of a harmonic top octave
    // for placing the edge (a median keeps a monotone slope where it is).
    const smooth = runningMedian(bandDb, 2);
    const smoothWide = runningMedian(bandDb, 5);
    const suffixMax = new Float64Array(bands + 1).fill(-Infinity);
    for (let b = bands - 1; b >= 0; b--) suffixMax[b] = Math.max(smooth[b], suffixMax[b + 1]);
    // The loud part of the content: 90th percentile of the band levels.
    const contentDb = percentile(smooth.subarray(1), 0.9);
    const lowestBand = Math.max(2, Math.ceil(200 / (binsPerBand * binHz)));
    for (let b = bands - 2; b >= lowestBand; b--) {
      const gap = Math.max(2, Math.ceil(CLIFF_TRANSITION_FRACTION * b));
      if (b + gap >= bands) continue;
      if (smooth[b] < contentDb - CLIFF_MAX_BELOW_CONTENT_DB) continue;
      const stopDb = suffixMax[b + gap];
      if (smooth[b] - stopDb < CLIFF_DROP_DB) continue;
      // Band b may lie deep inside a steep filter's slope: walk down the slope (levels still rising
      // by more than SLOPE_STEP_DB a band) to where the pass band flattens; the reference is the median
      // level of the transition width below that (a soft filter's knee falls slowly). Then, on the wide
      // median, the edge is where the level crosses EDGE_DROP_DB below the reference nearest the cliff,
      // interpolated between band centres.
      let top = b;
      while (top > lowestBand && smoothWide[top - 1] > smoothWide[top] + SLOPE_STEP_DB) top--;
      const edgeDb = median(smoothWide.subarray(Math.max(1, top - gap), top + 1)) - EDGE_DROP_DB;
      let j = top;
      while (j > 1 && smoothWide[j - 1] < edgeDb) j--;
      while (j < Math.min(bands, b + gap + 1) && smoothWide[j] >= edgeDb) j++;
      j = Math.max(j, 1);
      const bandHz = binsPerBand * binHz;
      const centre = (i: number) => (i + 0.5) * bandHz;
      const fraction = smoothWide[j - 1] > smoothWide[j] ? (smoothWide[j - 1] - edgeDb) / (smoothWide[j - 1] - smoothWide[j]) : 0;
      const edgeHz = Math.min(nyquist, centre(j - 1) + Math.max(0, Math.min(1, fraction)) * bandHz);
      // Where the content is gone: CLIFF_DROP_DB under the edge level.
      let stop = j;
      while (stop < bands - 1 && smoothWide[stop] >= edgeDb - CLIFF_DROP_DB) stop++;
      const stopHz = centre(stop);
      let filled = 0;
      for (let k = lowestBand; k < j; k++) if (smooth[k] >= stopDb + CLIFF_DROP_DB) filled++;
      let presence = 0;
      for (let k = lowestBand; k < j; k++) presence += this.bandPresence[k] / this.weightSum;
      const broadband =
        filled >= BROADBAND_MIN_BANDS && filled >= BROADBAND_MIN_SHARE * (j - lowestBand) && presence >= BROADBAND_MIN_PRESENCE * (j - lowestBand);
      return { edgeHz, stopHz, broadband };
    }
    return { edgeHz: nyquist, stopHz: nyquist, broadband: true };
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
    return roundTo((best + offset) * binHz, 2);
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
      hz.push(roundTo(Math.sqrt(f0 * f1), 1));
      db.push(roundTo(Math.max(PLOT_FLOOR_DB, dbPower(p) - ref), 2));
    }
    return { hz, db };
  }
}

/** Running median of `values` over ±`half` neighbours (index 0, the DC band, left out). */
function runningMedian(values: Float64Array, half: number): Float64Array {
  const out = new Float64Array(values.length);
  const scratch = new Float64Array(2 * half + 1);
  for (let b = 0; b < values.length; b++) {
    let m = 0;
    for (let j = b - half; j <= b + half; j++) if (j >= 1 && j < values.length) scratch[m++] = values[j];
    out[b] = median(scratch.subarray(0, m));
  }
  return out;
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
