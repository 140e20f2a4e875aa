import type { Analyzer, AudioFormat, SampleBlock } from '../types';
import { PolarityTracker, type PolarityVerdict } from './polarity';

/** Windows for the sustained anti-phase check, seconds. */
const WINDOW_SEC = 0.4;
/** A window below this correlation counts as anti-phase [common practice: r < -0.3]. */
const ANTI_PHASE_CORRELATION = -0.3;
/** Share of voting segments in opposite polarity that marks part of a take as inverted (with at least two of them) [common practice]. */
const INVERTED_SEGMENT_SHARE = 0.2;
/** Overall correlation at or below which one channel is taken as polarity-inverted when no segment could vote [common practice]. */
const INVERTED_CORRELATION = -0.5;
/** Windows quieter than this on either channel are not judged (mean square, about -60 dBFS). */
const QUIET_WINDOW_MEAN_SQUARE = 1e-6;

export interface StereoResult {
  /** Pearson correlation of left and right over the take (0 when a channel is silent). */
  correlation: number;
  identicalChannels: boolean;
  polarityInverted: boolean;
  /** Share of audible 400 ms windows whose correlation is below -0.3. */
  antiPhaseShare: number;
  /** The delay-tolerant polarity comparison, segment by segment. */
  polarity: PolarityVerdict;
}

/**
 * Left/right relationship of a two-channel take: Pearson correlation
 * r = cov(L,R) / sqrt(var L · var R), exact identity, exact inversion, the
 * share of 400 ms windows that are in anti-phase, and the delay-tolerant
 * polarity comparison (PolarityTracker) that decides whether a channel is inverted.
 */
export class StereoAnalyzer implements Analyzer<StereoResult> {
  private readonly windowFrames: number;
  private sumLeft = 0; private sumRight = 0;
  private sumLeftSquared = 0; private sumRightSquared = 0; private sumProduct = 0;
  private frames = 0;
  private identical = true;
  private inverted = true;
  private windowLeftSquared = 0; private windowRightSquared = 0; private windowProduct = 0; private windowFill = 0;
  private audibleWindows = 0;
  private antiPhaseWindows = 0;
  private readonly polarity: PolarityTracker;

  /** @param format must have exactly 2 channels */
  constructor(format: AudioFormat) {
    if (format.channels !== 2) throw new RangeError(`Stereo analysis needs 2 channels, got ${format.channels}`);
    this.windowFrames = Math.max(1, Math.round(WINDOW_SEC * format.sampleRate));
    this.polarity = new PolarityTracker(format.sampleRate);
  }

  push(block: SampleBlock): void {
    const left = block.channels[0];
    const right = block.channels[1];
    let sumLeft = 0, sumRight = 0, sumLeftSquared = 0, sumRightSquared = 0, sumProduct = 0;
    let identical = this.identical, inverted = this.inverted;
    let windowLeftSquared = this.windowLeftSquared, windowRightSquared = this.windowRightSquared, windowProduct = this.windowProduct;
    let windowFill = this.windowFill;
    for (let i = 0; i < block.frames; i++) {
      const l = left[i];
      const r = right[i];
      sumLeft += l; sumRight += r;
      const ll = l * l, rr = r * r, lr = l * r;
      sumLeftSquared += ll; sumRightSquared += rr; sumProduct += lr;
      if (l !== r) identical = false;
      if (l !== -r) inverted = false;
      windowLeftSquared += ll; windowRightSquared += rr; windowProduct += lr;
      if (++windowFill === this.windowFrames) {
        this.judgeWindow(windowLeftSquared, windowRightSquared, windowProduct);
        windowLeftSquared = 0; windowRightSquared = 0; windowProduct = 0; windowFill = 0;
      }
    }
    this.sumLeft += sumLeft; this.sumRight += sumRight;
    this.sumLeftSquared += sumLeftSquared; this.sumRightSquared += sumRightSquared; this.sumProduct += sumProduct;
    this.identical = identical; this.inverted = inverted;
    this.windowLeftSquared = windowLeftSquared; this.windowRightSquared = windowRightSquared; this.windowProduct = windowProduct;
    this.windowFill = windowFill;
    this.frames += block.frames;
    this.polarity.push(left, right, block.frames);
  }

  private judgeWindow(leftSquared: number, rightSquared: number, product: number): void {
    const n = this.windowFrames;
    if (leftSquared / n < QUIET_WINDOW_MEAN_SQUARE || rightSquared / n < QUIET_WINDOW_MEAN_SQUARE) return;
    this.audibleWindows++;
    if (product / Math.sqrt(leftSquared * rightSquared) < ANTI_PHASE_CORRELATION) this.antiPhaseWindows++;
  }

  finish(): StereoResult {
    const n = Math.max(1, this.frames);
    const covariance = this.sumProduct / n - (this.sumLeft / n) * (this.sumRight / n);
    const varianceLeft = this.sumLeftSquared / n - (this.sumLeft / n) ** 2;
    const varianceRight = this.sumRightSquared / n - (this.sumRight / n) ** 2;
    const correlation = varianceLeft > 0 && varianceRight > 0 ? Math.max(-1, Math.min(1, covariance / Math.sqrt(varianceLeft * varianceRight))) : 0;
    const hasSignal = this.sumLeftSquared > 0;
    const polarity = this.polarity.finish();
    const inverted = polarity.invertedSegments;
    const voted = inverted + polarity.inPolaritySegments;
    const segmentsInverted = voted > 0 ? inverted > voted / 2 || (inverted >= 2 && inverted >= INVERTED_SEGMENT_SHARE * voted) : correlation <= INVERTED_CORRELATION;
    return {
      correlation,
      identicalChannels: this.frames > 0 && this.identical && hasSignal,
      polarityInverted: (this.inverted && hasSignal) || segmentsInverted,
      antiPhaseShare: this.audibleWindows > 0 ? this.antiPhaseWindows / this.audibleWindows : 0,
      polarity,
    };
  }
}
