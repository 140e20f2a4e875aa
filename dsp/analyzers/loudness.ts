import { loudnessChannelWeights } from '../channelWeights';
import { KWeightingFilter } from '../filters/kWeighting';
import type { Analyzer, AudioFormat, SampleBlock } from '../types';
import { GrowableFloat64Array } from '../util/GrowableFloat64Array';
import { roundTo } from '../util/decibels';

/** Loudness of a weighted mean square (BS.1770 eq. 2): -0.691 cancels the K gain at 997 Hz. */
const LOUDNESS_OFFSET_DB = -0.691;
/** BS.1770 absolute gate, LKFS; also the Tech 3342 absolute gate. */
const ABSOLUTE_GATE_LUFS = -70;
/** BS.1770 relative gate below the absolute-gated loudness, LU. */
const INTEGRATED_RELATIVE_GATE_LU = -10;
/** Tech 3342 relative gate for loudness range, LU. */
const RANGE_RELATIVE_GATE_LU = -20;

/** Energy is summed in 10 ms steps: fine enough for momentary maxima (Tech 3341 case 13 needs hops of 18 ms or less). */
const STEPS_PER_SECOND = 100;
const MOMENTARY_STEPS = 40; // 400 ms window (Tech 3341 2.1)
const SHORT_TERM_STEPS = 300; // 3 s window (Tech 3341 2.1)
const GATING_HOP_STEPS = 10; // 400 ms blocks, 75% overlap = 100 ms hop (BS.1770 1.5)
const SERIES_HOP_STEPS = 100; // short-term series for plotting, every 1 s

/** A stretch of the take left out of the loudness figures (the line-up tone), seconds from the first sample. */
export interface LeftOutSpan {
  startSec: number;
  endSec: number;
}

export interface LoudnessResult {
  integratedLufs: number | null;
  rangeLu: number | null;
  momentaryMaxLufs: number | null;
  shortTermMaxLufs: number | null;
  /** Short-term loudness of the 3 s (shorter at the start) ending at (i+1)·stepSec; null below -70 LUFS. */
  shortTermSeries: { stepSec: number; values: (number | null)[] };
}

/** Lowest sample rate measured, Hz: BS.1770 weighting is defined for wide-band audio [common practice: 8 kHz telephony is the floor]. */
export const MIN_LOUDNESS_RATE_HZ = 8000;

/** The result for a take whose rate is too low to measure: every figure null. */
export const UNMEASURED_LOUDNESS: LoudnessResult = {
  integratedLufs: null,
  rangeLu: null,
  momentaryMaxLufs: null,
  shortTermMaxLufs: null,
  shortTermSeries: { stepSec: 1, values: [] },
};

const loudnessOf = (weightedMeanSquare: number) => LOUDNESS_OFFSET_DB + 10 * Math.log10(weightedMeanSquare);

/**
 * BS.1770-4 loudness with EBU Tech 3341 time scales and EBU Tech 3342 loudness range.
 * Keeps a 3 s ring of 10 ms energy sums plus one number per 100 ms of audio
 * (gating-block energies and short-term levels), about 0.6 MB per hour.
 */
export class LoudnessAnalyzer implements Analyzer<LoudnessResult> {
  private readonly sampleRate: number;
  private readonly channelWeights: Float64Array;
  private readonly filters: KWeightingFilter[];
  private kWeighted: Float64Array = new Float64Array(0);
  /** Per-block energy of each 10 ms segment in the block, summed over weighted channels. */
  private segmentEnergy: Float64Array = new Float64Array(0);
  private segmentEnds: Int32Array = new Int32Array(0);
  /** Ring of the last SHORT_TERM_STEPS completed steps: channel-weighted sums of K-weighted squares, and sample counts. */
  private readonly stepEnergyRing = new Float64Array(SHORT_TERM_STEPS);
  private readonly stepFramesRing = new Float64Array(SHORT_TERM_STEPS);
  private completedSteps = 0;
  private currentStepEnergy = 0;
  private currentStepFrames = 0;
  private framesSeen = 0;
  /** Channel-weighted mean square of each 400 ms gating block. */
  private readonly gatingBlockMeanSquares = new GrowableFloat64Array(4096);
  /** Short-term loudness every 100 ms, for the loudness range. */
  private readonly shortTermLevels = new GrowableFloat64Array(4096);
  private readonly seriesValues: (number | null)[] = [];
  /** Largest momentary and short-term mean square among the windows ending in each 100 ms hop (so maxima can leave a stretch out). */
  private readonly momentaryHopMax = new GrowableFloat64Array(4096);
  private readonly shortTermHopMax = new GrowableFloat64Array(4096);
  private momentaryMaxInHop = 0;
  private shortTermMaxInHop = 0;

  /**
   * @param format sample rate (Hz) and channel layout; weights follow BS.1770 Table 3
   * @param options.channelWeights override of the per-channel weights G_i
   */
  constructor(format: AudioFormat, options: { channelWeights?: ArrayLike<number> } = {}) {
    if (!(format.sampleRate >= MIN_LOUDNESS_RATE_HZ)) throw new RangeError(`Loudness needs a sample rate of at least ${MIN_LOUDNESS_RATE_HZ} Hz, got ${format.sampleRate}`);
    if (!(format.channels >= 1)) throw new RangeError('Loudness needs at least one channel');
    this.sampleRate = format.sampleRate;
    this.channelWeights = options.channelWeights
      ? Float64Array.from(options.channelWeights)
      : loudnessChannelWeights(format.channels, format.channelMask);
    if (this.channelWeights.length !== format.channels) throw new RangeError('One channel weight per channel is needed');
    this.filters = Array.from({ length: format.channels }, () => new KWeightingFilter(format.sampleRate));
  }

  /** First frame of step `step`: steps tile the take at round(step·fs/100), so 400 ms blocks are exact to the nearest sample. */
  private stepStartFrame(step: number): number {
    return Math.round((step * this.sampleRate) / STEPS_PER_SECOND);
  }

  push(block: SampleBlock): void {
    const frames = block.frames;
    if (frames === 0) return;
    if (this.kWeighted.length < frames) {
      this.kWeighted = new Float64Array(frames);
      // At most one segment per 10 ms plus the partial ones at both ends.
      const maxSegments = Math.ceil((frames * STEPS_PER_SECOND) / this.sampleRate) + 2;
      this.segmentEnergy = new Float64Array(maxSegments);
      this.segmentEnds = new Int32Array(maxSegments);
    }
    // Cut the block where 10 ms steps end.
    let segmentCount = 0;
    let stepEnd = this.stepStartFrame(this.completedSteps + 1) - this.framesSeen;
    for (let step = this.completedSteps + 1; stepEnd < frames; ) {
      this.segmentEnds[segmentCount++] = stepEnd;
      step++;
      stepEnd = this.stepStartFrame(step) - this.framesSeen;
    }
    this.segmentEnds[segmentCount++] = frames;
    this.segmentEnergy.fill(0, 0, segmentCount);

    for (let channel = 0; channel < this.filters.length; channel++) {
      const weight = this.channelWeights[channel];
      if (weight === 0) continue;
      const kWeighted = this.kWeighted;
      this.filters[channel].process(block.channels[channel], kWeighted, frames);
      let start = 0;
      for (let segment = 0; segment < segmentCount; segment++) {
        const end = this.segmentEnds[segment];
        let kWeightedSquareSum = 0;
        for (let i = start; i < end; i++) kWeightedSquareSum += kWeighted[i] * kWeighted[i];
        this.segmentEnergy[segment] += weight * kWeightedSquareSum;
        start = end;
      }
    }

    let start = 0;
    for (let segment = 0; segment < segmentCount; segment++) {
      const end = this.segmentEnds[segment];
      this.currentStepEnergy += this.segmentEnergy[segment];
      this.currentStepFrames += end - start;
      start = end;
      if (segment < segmentCount - 1) this.completeStep();
    }
    this.framesSeen += frames;
    // The last segment may itself close a step exactly at the block end.
    if (this.framesSeen === this.stepStartFrame(this.completedSteps + 1)) this.completeStep();
  }

  /** Weighted mean square over the last `steps` completed steps. */
  private meanSquareOfLast(steps: number): number {
    let energy = 0;
    let frames = 0;
    for (let back = 1; back <= steps; back++) {
      const slot = (this.completedSteps - back) % SHORT_TERM_STEPS;
      energy += this.stepEnergyRing[slot];
      frames += this.stepFramesRing[slot];
    }
    return frames > 0 ? energy / frames : 0;
  }

  private completeStep(): void {
    const slot = this.completedSteps % SHORT_TERM_STEPS;
    this.stepEnergyRing[slot] = this.currentStepEnergy;
    this.stepFramesRing[slot] = this.currentStepFrames;
    this.currentStepEnergy = 0;
    this.currentStepFrames = 0;
    const steps = ++this.completedSteps;

    if (steps >= MOMENTARY_STEPS) {
      const momentary = this.meanSquareOfLast(MOMENTARY_STEPS);
      if (momentary > this.momentaryMaxInHop) this.momentaryMaxInHop = momentary;
      if (steps % GATING_HOP_STEPS === 0) this.gatingBlockMeanSquares.push(momentary);
    }
    if (steps >= SHORT_TERM_STEPS) {
      const shortTerm = this.meanSquareOfLast(SHORT_TERM_STEPS);
      if (shortTerm > this.shortTermMaxInHop) this.shortTermMaxInHop = shortTerm;
      if (steps % GATING_HOP_STEPS === 0) this.shortTermLevels.push(shortTerm > 0 ? loudnessOf(shortTerm) : Number.NEGATIVE_INFINITY);
    }
    if (steps % GATING_HOP_STEPS === 0) this.closeHop();
    if (steps % SERIES_HOP_STEPS === 0) {
      const windowMeanSquare = this.meanSquareOfLast(Math.min(steps, SHORT_TERM_STEPS));
      const level = windowMeanSquare > 0 ? loudnessOf(windowMeanSquare) : Number.NEGATIVE_INFINITY;
      this.seriesValues.push(level > ABSOLUTE_GATE_LUFS ? roundTo(level, 2) : null);
    }
  }

  private closeHop(): void {
    this.momentaryHopMax.push(this.momentaryMaxInHop);
    this.shortTermHopMax.push(this.shortTermMaxInHop);
    this.momentaryMaxInHop = 0;
    this.shortTermMaxInHop = 0;
  }

  /**
   * @param leaveOut a stretch whose windows do not count (every window that touches it is left out of the
   *   integrated loudness, range, maxima and series), or null for the whole take
   */
  finish(leaveOut: LeftOutSpan | null = null): LoudnessResult {
    if (this.completedSteps % GATING_HOP_STEPS !== 0) this.closeHop();
    const seconds = (steps: number) => steps / STEPS_PER_SECOND;
    // Whether the window of `lengthSteps` ending at step `endStep` stays clear of the left-out stretch.
    const counts = (endStep: number, lengthSteps: number) =>
      leaveOut === null || seconds(endStep) <= leaveOut.startSec || seconds(endStep - lengthSteps) >= leaveOut.endSec;
    const blocks = this.gatingBlockMeanSquares.view().filter((_, k) => counts(MOMENTARY_STEPS + GATING_HOP_STEPS * k, MOMENTARY_STEPS));
    const shortTerms = this.shortTermLevels.view().filter((_, k) => counts(SHORT_TERM_STEPS + GATING_HOP_STEPS * k, SHORT_TERM_STEPS));
    // A hop's maximum comes from windows ending anywhere in it: the span tested runs from the earliest start to its end.
    const hopMax = (maxima: Float64Array, lengthSteps: number) =>
      maxima.reduce((max, value, h) => (value > max && counts(GATING_HOP_STEPS * (h + 1), lengthSteps + GATING_HOP_STEPS - 1) ? value : max), 0);
    const momentaryMax = hopMax(this.momentaryHopMax.view(), MOMENTARY_STEPS);
    const shortTermMax = hopMax(this.shortTermHopMax.view(), SHORT_TERM_STEPS);
    const series = this.seriesValues.map((value, j) => (counts(SERIES_HOP_STEPS * (j + 1), Math.min(SERIES_HOP_STEPS * (j + 1), SHORT_TERM_STEPS)) ? value : null));
    return {
      integratedLufs: gatedIntegratedLoudness(blocks),
      rangeLu: loudnessRange(shortTerms),
      momentaryMaxLufs: momentaryMax > 0 ? loudnessOf(momentaryMax) : null,
      shortTermMaxLufs: shortTermMax > 0 ? loudnessOf(shortTermMax) : null,
      shortTermSeries: { stepSec: SERIES_HOP_STEPS / STEPS_PER_SECOND, values: series },
    };
  }
}

/**
 * Gated integrated loudness, BS.1770-4 eqs. 3-7: blocks above -70 LKFS, then
 * above (their mean loudness - 10 LU), both with strict ">".
 * @param blockMeanSquares channel-weighted mean squares of 400 ms blocks
 * @returns LUFS, or null when no block passes the gates
 */
export function gatedIntegratedLoudness(blockMeanSquares: Float64Array): number | null {
  let absoluteGatedSum = 0;
  let absoluteGatedCount = 0;
  for (const meanSquare of blockMeanSquares) {
    if (meanSquare > 0 && loudnessOf(meanSquare) > ABSOLUTE_GATE_LUFS) {
      absoluteGatedSum += meanSquare;
      absoluteGatedCount++;
    }
  }
  if (absoluteGatedCount === 0) return null;
  const relativeGate = loudnessOf(absoluteGatedSum / absoluteGatedCount) + INTEGRATED_RELATIVE_GATE_LU;
  let gatedSum = 0;
  let gatedCount = 0;
  for (const meanSquare of blockMeanSquares) {
    if (meanSquare <= 0) continue;
    const level = loudnessOf(meanSquare);
    if (level > ABSOLUTE_GATE_LUFS && level > relativeGate) {
      gatedSum += meanSquare;
      gatedCount++;
    }
  }
  return gatedCount > 0 ? loudnessOf(gatedSum / gatedCount) : null;
}

/**
 * Loudness range, EBU Tech 3342 section 3.1 and its reference code: short-term levels
 * gated at >= -70 LUFS and >= (power mean - 20 LU), then the 95th minus the 10th
 * nearest-rank percentile.
 * @param shortTermLufs short-term levels at >= 10 Hz
 * @returns LU, or null when no level passes the gates
 */
export function loudnessRange(shortTermLufs: Float64Array): number | null {
  let powerSum = 0;
  let absoluteGatedCount = 0;
  for (const level of shortTermLufs) {
    if (level >= ABSOLUTE_GATE_LUFS) {
      powerSum += 10 ** (level / 10);
      absoluteGatedCount++;
    }
  }
  if (absoluteGatedCount === 0) return null;
  const relativeGate = 10 * Math.log10(powerSum / absoluteGatedCount) + RANGE_RELATIVE_GATE_LU;
  const gated = Float64Array.from(shortTermLufs.filter((level) => level >= ABSOLUTE_GATE_LUFS && level >= relativeGate)).sort();
  const count = gated.length;
  // MATLAB-style 1-based nearest rank with halves rounded up: floor(x + 0.5).
  const percentile = (percent: number) => gated[Math.floor(((count - 1) * percent) / 100 + 1 + 0.5) - 1];
  return percentile(95) - percentile(10);
}
