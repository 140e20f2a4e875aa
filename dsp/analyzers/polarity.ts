import FFT from 'fft.js';
import { hannWindow } from './formatGuard';

/** Longest delay between two channels looked at, seconds: about 3.4 m of path difference [common practice: spaced pairs, bleed between mics]. */
const MAX_LAG_SEC = 0.01;
/** Delays up to this are coincident sound (one mix, or a coincident microphone pair), seconds [common practice]. */
const COINCIDENT_LAG_SEC = 0.001;
/** Cross-spectra are summed over segments of this length, and each segment votes, seconds. */
const SEGMENT_SEC = 5;
/** Every FRAME_STRIDE-th frame is compared (about 1.3 s of each 5 s segment at 48 kHz): enough for the estimate, a quarter of the work. */
const FRAME_STRIDE = 4;
/** Compared frames of a segment that must carry sound on both channels before it votes. */
const MIN_FRAMES_PER_SEGMENT = 6;
/** A frame carries sound when both channels' mean square exceed this (about -60 dBFS). */
const AUDIBLE_MEAN_SQUARE = 1e-6;
/** Band of the comparison, Hz: below it rumble and hum, above it little is coherent between spaced mics. */
const BAND_LOW_HZ = 80;
const BAND_HIGH_HZ = 8000;
/**
 * A segment votes when the coherence-weighted cross-correlation peak reaches this [common practice]:
 * for unrelated channels it stays near 1/sqrt(frames · bins), well under 0.1.
 */
const MIN_PEAK = 0.12;

export interface PolarityVerdict {
  /** Segments whose strongest relation between the channels is in the same polarity, and in opposite polarity. */
  inPolaritySegments: number;
  invertedSegments: number;
  /** Time span of the segments found in opposite polarity, seconds; null when none. */
  invertedFromSec: number | null;
  invertedToSec: number | null;
}

/**
 * Relative polarity of two channels that may be delayed against each other (spaced microphones,
 * one voice bleeding into the other's microphone): the sign of the strongest peak of the
 * coherence-weighted cross-correlation (the smoothed coherence transform, Carter et al., 1973)
 * within ±10 ms. A delay turns some frequencies into anti-phase, which fools a plain correlation
 * at lag 0; the weighted peak at the true delay keeps the sign of the wiring. Channels with no
 * common sound (two isolated voices) give no peak and no vote.
 */
export class PolarityTracker {
  private readonly size: number;
  private readonly fft: FFT;
  private readonly window: Float64Array;
  private readonly maxLag: number;
  private readonly coincidentLag: number;
  private readonly firstBin: number;
  private readonly lastBin: number;
  private readonly framesPerSegment: number;
  private readonly sampleRate: number;
  private readonly left: Float64Array;
  private readonly right: Float64Array;
  private fill = 0;
  private readonly spectrumLeft: number[];
  private readonly spectrumRight: number[];
  private readonly frameIn: Float64Array;
  private readonly coherency: number[];
  private readonly correlation: number[];
  /** Segment sums of the cross-spectrum L·conj(R) (real, imaginary) and of both auto-spectra, per bin. */
  private readonly crossRe: Float64Array;
  private readonly crossIm: Float64Array;
  private readonly powerLeft: Float64Array;
  private readonly powerRight: Float64Array;
  private framesInSegment = 0;
  private audibleFrames = 0;
  private segmentStartFrame = 0;
  private framesSeen = 0;
  private readonly verdict: PolarityVerdict = { inPolaritySegments: 0, invertedSegments: 0, invertedFromSec: null, invertedToSec: null };

  constructor(sampleRate: number) {
    this.sampleRate = sampleRate;
    this.maxLag = Math.round(MAX_LAG_SEC * sampleRate);
    this.coincidentLag = Math.round(COINCIDENT_LAG_SEC * sampleRate);
    let size = 1024;
    while (size < 8 * this.maxLag) size *= 2;
    this.size = size;
    this.fft = new FFT(size);
    this.window = hannWindow(size);
    this.left = new Float64Array(size);
    this.right = new Float64Array(size);
    this.frameIn = new Float64Array(size);
    this.spectrumLeft = this.fft.createComplexArray();
    this.spectrumRight = this.fft.createComplexArray();
    this.coherency = this.fft.createComplexArray();
    this.correlation = this.fft.createComplexArray();
    this.firstBin = Math.max(1, Math.floor((BAND_LOW_HZ * size) / sampleRate));
    this.lastBin = Math.min(size / 2 - 1, Math.ceil((Math.min(BAND_HIGH_HZ, 0.45 * sampleRate) * size) / sampleRate));
    const bins = size / 2 + 1;
    this.crossRe = new Float64Array(bins);
    this.crossIm = new Float64Array(bins);
    this.powerLeft = new Float64Array(bins);
    this.powerRight = new Float64Array(bins);
    this.framesPerSegment = Math.max(1, Math.round((SEGMENT_SEC * sampleRate) / size));
  }

  push(left: Float64Array, right: Float64Array, frames: number): void {
    let start = 0;
    while (start < frames) {
      const count = Math.min(frames - start, this.size - this.fill);
      this.left.set(left.subarray(start, start + count), this.fill);
      this.right.set(right.subarray(start, start + count), this.fill);
      this.fill += count;
      start += count;
      if (this.fill === this.size) {
        this.addFrame();
        this.fill = 0;
      }
    }
  }

  private addFrame(): void {
    if (this.framesInSegment % FRAME_STRIDE === 0) this.compareFrame();
    this.framesSeen += this.size;
    if (++this.framesInSegment === this.framesPerSegment) this.closeSegment();
  }

  private compareFrame(): void {
    let leftSquares = 0;
    let rightSquares = 0;
    for (let i = 0; i < this.size; i++) {
      leftSquares += this.left[i] * this.left[i];
      rightSquares += this.right[i] * this.right[i];
    }
    if (leftSquares / this.size > AUDIBLE_MEAN_SQUARE && rightSquares / this.size > AUDIBLE_MEAN_SQUARE) {
      this.transform(this.left, this.spectrumLeft);
      this.transform(this.right, this.spectrumRight);
      for (let k = this.firstBin; k <= this.lastBin; k++) {
        const lr = this.spectrumLeft[2 * k], li = this.spectrumLeft[2 * k + 1];
        const rr = this.spectrumRight[2 * k], ri = this.spectrumRight[2 * k + 1];
        this.crossRe[k] += lr * rr + li * ri;
        this.crossIm[k] += li * rr - lr * ri;
        this.powerLeft[k] += lr * lr + li * li;
        this.powerRight[k] += rr * rr + ri * ri;
      }
      this.audibleFrames++;
    }
  }

  private transform(samples: Float64Array, out: number[]): void {
    for (let i = 0; i < this.size; i++) this.frameIn[i] = samples[i] * this.window[i];
    this.fft.realTransform(out, this.frameIn);
  }

  /** Weighted cross-correlation of the segment at lags -maxLag..maxLag; the segment votes by the sign of its peak. */
  private closeSegment(): void {
    if (this.audibleFrames >= MIN_FRAMES_PER_SEGMENT) {
      // r(lag) = mean over the band of Re(γ_k · e^{iω_k·lag}), γ_k the coherency S_LR / sqrt(S_LL·S_RR),
      // for every lag at once by one inverse FFT of γ (Hermitian, so the result is real).
      const spectrum = this.coherency;
      spectrum.fill(0);
      let bins = 0;
      for (let k = this.firstBin; k <= this.lastBin; k++) {
        const norm = Math.sqrt(this.powerLeft[k] * this.powerRight[k]);
        if (norm === 0) continue;
        bins++;
        spectrum[2 * k] = this.crossRe[k] / norm;
        spectrum[2 * k + 1] = this.crossIm[k] / norm;
        spectrum[2 * (this.size - k)] = this.crossRe[k] / norm;
        spectrum[2 * (this.size - k) + 1] = -this.crossIm[k] / norm;
      }
      this.fft.inverseTransform(this.correlation, spectrum);
      // The inverse transform divides by N and sums both halves of the spectrum: scale back to a mean over the band.
      const scale = bins > 0 ? this.size / (2 * bins) : 0;
      let peak = 0;
      let peakLag = 0;
      for (let lag = -this.maxLag; lag <= this.maxLag; lag++) {
        const value = this.correlation[2 * ((lag + this.size) % this.size)] * scale;
        if (Math.abs(value) > Math.abs(peak)) {
          peak = value;
          peakLag = lag;
        }
      }
      if (peak >= MIN_PEAK) this.verdict.inPolaritySegments++;
      else if (peak <= -MIN_PEAK) {
        // Coincident sound (a mix, a coincident pair) whose plain, power-weighted cross-correlation is in
        // phase: a widened mix, whose side content is in anti-phase across many bins while its louder
        // centre (bass, voice) stays in phase and the mono sum keeps its level. Not a channel wired inverted.
        const widenedMix = Math.abs(peakLag) <= this.coincidentLag && this.crossCorrelationAt(peakLag) > 0;
        if (widenedMix) this.verdict.inPolaritySegments++;
        else this.markInverted();
      }
    }
    this.crossRe.fill(0);
    this.crossIm.fill(0);
    this.powerLeft.fill(0);
    this.powerRight.fill(0);
    this.framesInSegment = 0;
    this.audibleFrames = 0;
    this.segmentStartFrame = this.framesSeen;
  }

  /** Plain cross-correlation of the segment over the band at one lag: the real part of the sum of S_LR·e^{iω_k·lag}. */
  private crossCorrelationAt(lag: number): number {
    let sum = 0;
    for (let k = this.firstBin; k <= this.lastBin; k++) {
      const angle = (2 * Math.PI * k * lag) / this.size;
      sum += this.crossRe[k] * Math.cos(angle) - this.crossIm[k] * Math.sin(angle);
    }
    return sum;
  }

  private markInverted(): void {
    this.verdict.invertedSegments++;
    this.verdict.invertedFromSec ??= this.segmentStartFrame / this.sampleRate;
    this.verdict.invertedToSec = this.framesSeen / this.sampleRate;
  }

  finish(): PolarityVerdict {
    // A last segment of at least half the usual length still votes.
    if (this.framesInSegment >= this.framesPerSegment / 2) this.closeSegment();
    return { ...this.verdict };
  }
}
