import type { Analyzer, AudioFormat, ClipEvent, SampleBlock } from '../types';

/** Consecutive samples at the limit that make a clip [common practice: 3, range 2-10]. */
export const MIN_CLIP_RUN = 3;
/** Events closer than this on one channel are merged into one, seconds [common practice]. */
const MERGE_GAP_SEC = 0.02;
/** Flat tops below this level are not examined (a clip that quiet is not an overload), linear (-20 dBFS) [common practice]. */
const MIN_FLAT_TOP_LEVEL = 0.1;
/** Samples on a flat top stay within this fraction of its level (0.0087 dB), allowing converter noise [common practice]. */
const FLAT_TOP_RELATIVE_TOLERANCE = 1e-3;
/** ...or within this many LSBs, whichever is larger [common practice]. */
const FLAT_TOP_LSB_TOLERANCE = 4;
/** The signal must approach a flat top this many tolerances per sample faster than a rounded (unclipped) peak can [common practice]. */
const ENTRY_SLOPE_FACTOR = 4;
/** Flat tops of one clipping stage lie within this many dB of each other [common practice]. */
const EXTREME_LEVEL_WINDOW_DB = 0.5;
/** At least this many flat tops at the extreme make a below-full-scale clip [common practice]. */
const MIN_FLAT_TOPS = 3;
/** Histogram bins per unit of full scale. */
const HISTOGRAM_BINS_PER_UNIT = 2048;
/**
 * Histograms are filled from this magnitude up: far enough below MIN_FLAT_TOP_LEVEL that the bins a
 * flat top at -20 dBFS is compared with are filled too (0.08 = -21.9 dBFS).
 */
const HISTOGRAM_FLOOR = 0.08;
/**
 * Of the half-cycles whose peak lies at a flat-top level, at least this share must be flat [common practice]:
 * a clipping stage flattens every peak that reaches its level, while the rounded peaks of clean speech
 * that happen to stop there are nearly all rounded.
 */
const MIN_FLAT_SHARE = 0.5;
/** The flat-top level's bin must hold this many times the mean of the bins just below it [common practice]. */
const HISTOGRAM_SPIKE_RATIO = 4;
/**
 * Plateaus: a flat top that a low-pass after the clip (the converter's anti-alias filter, a resampler)
 * has rippled. A half-cycle whose samples stay within PLATEAU_DEPTH of its peak for at least
 * PLATEAU_RATIO times as long as the signal took to rise from half the peak is a plateau: a rounded
 * sine peak dwells there 0.47 times its rise, a sine clipped 1 dB below its peak 1.7 times, 3 dB below
 * 3.8 times [computed from the sine]. [common practice]
 */
const PLATEAU_DEPTH = 0.03;
const PLATEAU_RATIO = 1.5;
/**
 * Plateaus count as clipping when the half-cycle peaks at their level outnumber PLATEAU_PILE_UP times those
 * in the band just under it (twice as wide), and at least MIN_PLATEAU_SHARE of them are plateaus [common practice].
 */
const PLATEAU_PILE_UP = 1;
const MIN_PLATEAU_SHARE = 0.25;
/** Plateaus whose lengths differ from the one before by less than this (relative) and that rise within this many samples come from a synthesiser [common practice]. */
const SQUARE_LENGTH_SPREAD = 0.05;
const SQUARE_RISE_FRAMES = 3;
/** Share of the plateaus as long as the one before them (within SQUARE_LENGTH_SPREAD) for a synthesiser [common practice]. */
const SQUARE_EVEN_SHARE = 0.9;
/** Longest half-cycle examined for a plateau, samples (about 85 ms at 96 kHz: lower than any voice). */
const MAX_HALF_CYCLE = 8192;
/** Merged groups kept per channel and kind; clean audio has a handful. */
const MAX_GROUPS = 100_000;

export interface ClippingResult {
  clippedSamples: number;
  events: ClipEvent[];
  /** Clipped samples per channel. */
  channelClippedSamples: number[];
}

/** A run of clipped samples, or several close runs merged. */
interface ClipGroup {
  start: number;
  end: number;
  /** |level| of the flat top (linear, full scale = 1.0). */
  level: number;
  samples: number;
  runs: number;
  /** Plateaus only: the last run's length, how many runs were as long as the run before them, and the frames each took to rise from half its level. */
  lastLength: number;
  evenSteps: number;
  riseFrames: number;
}

/** Run state, merged groups and histograms of one channel. */
class ChannelClipState {
  fullScaleRunStart = 0;
  fullScaleRunLength = 0;
  fullScaleRunSign = 0;
  readonly fullScaleGroups: ClipGroup[] = [];
  flatRunStart = 0;
  flatRunLength = 0;
  flatRunReference = 0;
  /** The two samples before the flat run started (for its entry slope). */
  flatRunBefore1 = 0;
  flatRunBefore2 = 0;
  previous1 = 0;
  previous2 = 0;
  previous3 = 0;
  /** Whether the previous sample was at a top code (+1 / -1) or not (0). */
  previousAtLimit = 0;
  /** Flat-top candidates merged per polarity (index 0 positive, 1 negative). */
  readonly flatTopGroups: [ClipGroup[], ClipGroup[]] = [[], []];
  readonly positiveHistogram = new Uint32Array(HISTOGRAM_BINS_PER_UNIT + 2);
  readonly negativeHistogram = new Uint32Array(HISTOGRAM_BINS_PER_UNIT + 2);
  /** Peak magnitude of each half-cycle (between sign changes), binned like the sample histograms. */
  readonly positivePeaks = new Uint32Array(HISTOGRAM_BINS_PER_UNIT + 2);
  readonly negativePeaks = new Uint32Array(HISTOGRAM_BINS_PER_UNIT + 2);
  halfCycleSign = 0;
  halfCycleMax = 0;
  /** Magnitudes of the current half-cycle (up to MAX_HALF_CYCLE), its first frame and whether it touched a top code. */
  readonly halfCycle = new Float64Array(MAX_HALF_CYCLE);
  halfCycleFill = 0;
  halfCycleStart = 0;
  halfCycleAtLimit = false;
  /** Plateau candidates per polarity. */
  readonly plateauGroups: [ClipGroup[], ClipGroup[]] = [[], []];
}

/**
 * Clipping, two kinds:
 * - `fullScale`: runs of >= 3 consecutive samples at the top codes (digital overload); a float
 *   sample beyond full scale is not clipped (yet) and is counted by the levels analyzer instead;
 * - `belowFullScale`: flat tops left by an analogue stage that clipped before the converter and a
 *   gain stage after it. Either runs of >= 3 samples of one polarity within a small tolerance of
 *   each other (converter noise allowed), entered faster than any rounded peak could be, at least
 *   three at one level where the sample-value histogram spikes and where most half-cycle peaks are
 *   flat; or plateaus that a low-pass after the clip (the converter's own filter, a resampler) has
 *   rippled, at a level where half-cycle peaks pile up. A clean take with high or rounded peaks
 *   (a -0.1 dBFS sine, loud noise, a low voice at 96 kHz) has neither.
 */
export class ClippingAnalyzer implements Analyzer<ClippingResult> {
  private readonly sampleRate: number;
  private readonly channelCount: number;
  private readonly positiveLimit: number;
  private readonly negativeLimit: number;
  /** Float only: beyond this a sample is over full scale, not clipped at it. */
  private readonly positiveCeiling: number;
  private readonly toleranceFloor: number;
  private readonly states: ChannelClipState[];
  private readonly mergeGapFrames: number;

  /** @param format encoding and valid bits decide the top codes and the LSB */
  constructor(format: AudioFormat) {
    if (!(format.channels >= 1)) throw new RangeError('Clipping needs at least one channel');
    this.sampleRate = format.sampleRate;
    this.channelCount = format.channels;
    if (format.encoding === 'float') {
      // Float: at or beyond the 16-bit top code, so float files carrying 16- or 24-bit data are covered.
      this.positiveLimit = 1 - 2 ** -15;
      this.negativeLimit = -(1 - 2 ** -15);
      this.positiveCeiling = 1 + 2 ** -15;
      this.toleranceFloor = FLAT_TOP_LSB_TOLERANCE * 2 ** -23;
    } else {
      const validBits = Math.min(format.validBitsPerSample || format.bitsPerSample, format.bitsPerSample);
      // Top codes: +(2^(n-1) - 1) and -2^(n-1) of the valid bits, left-justified (WAVEFORMATEXTENSIBLE).
      this.positiveLimit = 1 - 2 ** (1 - validBits);
      this.negativeLimit = -1;
      this.positiveCeiling = Number.POSITIVE_INFINITY;
      this.toleranceFloor = FLAT_TOP_LSB_TOLERANCE * 2 ** (1 - validBits);
    }
    this.mergeGapFrames = Math.round(MERGE_GAP_SEC * format.sampleRate);
    this.states = Array.from({ length: format.channels }, () => new ChannelClipState());
  }

  push(block: SampleBlock): void {
    for (let channel = 0; channel < this.channelCount; channel++) this.pushChannel(this.states[channel], block.channels[channel], block.frames, block.startFrame);
  }

  private pushChannel(state: ChannelClipState, samples: Float64Array, frames: number, startFrame: number): void {
    const positiveLimit = this.positiveLimit;
    const negativeLimit = this.negativeLimit;
    const positiveCeiling = this.positiveCeiling;
    const positivePeaks = state.positivePeaks;
    const negativePeaks = state.negativePeaks;
    let halfCycleSign = state.halfCycleSign;
    let halfCycleMax = state.halfCycleMax;
    const halfCycle = state.halfCycle;
    let halfCycleFill = state.halfCycleFill;
    let halfCycleStart = state.halfCycleStart;
    let halfCycleAtLimit = state.halfCycleAtLimit;
    const toleranceFloor = this.toleranceFloor;
    const positiveHistogram = state.positiveHistogram;
    const negativeHistogram = state.negativeHistogram;
    const topBin = HISTOGRAM_BINS_PER_UNIT + 1;
    // Run state in locals for the loop, written back after it.
    let fullScaleRunStart = state.fullScaleRunStart;
    let fullScaleRunLength = state.fullScaleRunLength;
    let fullScaleRunSign = state.fullScaleRunSign;
    let flatRunLength = state.flatRunLength;
    let flatRunStart = state.flatRunStart;
    let flatRunBefore1 = state.flatRunBefore1;
    let flatRunBefore2 = state.flatRunBefore2;
    let flatRunReference = state.flatRunReference;
    let flatRunTolerance = Math.max(toleranceFloor, Math.abs(flatRunReference) * FLAT_TOP_RELATIVE_TOLERANCE);
    let previous1 = state.previous1;
    let previous2 = state.previous2;
    let previous3 = state.previous3;
    let previousAtLimit = state.previousAtLimit;
    for (let i = 0; i < frames; i++) {
      const x = samples[i];
      const magnitude = x < 0 ? -x : x;

      // Full-scale runs.
      // A float sample beyond full scale is not clipped (yet): the levels analyzer counts it.
      const atLimit = x >= positiveLimit ? (x <= positiveCeiling ? 1 : 0) : x <= negativeLimit ? (x >= -positiveCeiling ? -1 : 0) : 0;
      if (atLimit !== 0 || fullScaleRunLength !== 0) {
        if (atLimit !== 0 && atLimit === fullScaleRunSign) {
          fullScaleRunLength++;
        } else {
          if (fullScaleRunLength >= MIN_CLIP_RUN) this.addRun(state.fullScaleGroups, fullScaleRunStart, fullScaleRunLength, 1, Number.POSITIVE_INFINITY);
          fullScaleRunSign = atLimit;
          fullScaleRunStart = startFrame + i;
          fullScaleRunLength = atLimit !== 0 ? 1 : 0;
        }
      }

      if (magnitude >= HISTOGRAM_FLOOR) {
        let bin = (magnitude * HISTOGRAM_BINS_PER_UNIT) | 0;
        if (bin > topBin) bin = topBin;
        if (x > 0) positiveHistogram[bin]++;
        else negativeHistogram[bin]++;
      }
      // Half-cycles: from one sign change to the next.
      if (x > 0 ? halfCycleSign <= 0 : x < 0 && halfCycleSign >= 0) {
        if (halfCycleMax >= HISTOGRAM_FLOOR) {
          let bin = (halfCycleMax * HISTOGRAM_BINS_PER_UNIT) | 0;
          if (bin > topBin) bin = topBin;
          if (halfCycleSign > 0) positivePeaks[bin]++;
          else negativePeaks[bin]++;
          if (halfCycleMax >= MIN_FLAT_TOP_LEVEL && halfCycleFill < MAX_HALF_CYCLE && !halfCycleAtLimit) {
            this.closeHalfCycle(state, halfCycleSign, halfCycleMax, halfCycleFill, halfCycleStart);
          }
        }
        halfCycleSign = x > 0 ? 1 : -1;
        halfCycleMax = 0;
        halfCycleFill = 0;
        halfCycleStart = startFrame + i;
        halfCycleAtLimit = false;
      }
      if (magnitude > halfCycleMax) halfCycleMax = magnitude;
      if (halfCycleFill < MAX_HALF_CYCLE) halfCycle[halfCycleFill++] = magnitude;
      if (atLimit !== 0) halfCycleAtLimit = true;

      // Flat-top runs below full scale: same polarity, within tolerance of the run's first sample.
      if (flatRunLength > 0) {
        const deviation = x - flatRunReference;
        if (atLimit === 0 && (x > 0) === (flatRunReference > 0) && deviation <= flatRunTolerance && deviation >= -flatRunTolerance) {
          flatRunLength++;
        } else {
          if (flatRunLength >= MIN_CLIP_RUN) this.closeFlatRun(state, flatRunStart, flatRunLength, flatRunReference, flatRunBefore1, flatRunBefore2);
          flatRunLength = 0;
        }
      } else {
        // A run starts at the previous sample when this one stays within its tolerance
        // (most loud samples fail the first, cheap test).
        const step = x - previous1;
        const previousMagnitude = previous1 < 0 ? -previous1 : previous1;
        if (previousMagnitude >= MIN_FLAT_TOP_LEVEL && atLimit === 0 && previousAtLimit === 0 && (x > 0) === (previous1 > 0)) {
          let tolerance = previousMagnitude * FLAT_TOP_RELATIVE_TOLERANCE;
          if (tolerance < toleranceFloor) tolerance = toleranceFloor;
          if (step <= tolerance && step >= -tolerance) {
            flatRunStart = startFrame + i - 1;
            flatRunReference = previous1;
            flatRunTolerance = tolerance;
            flatRunLength = 2;
            flatRunBefore1 = previous2;
            flatRunBefore2 = previous3;
          }
        }
      }
      previous3 = previous2;
      previous2 = previous1;
      previous1 = x;
      previousAtLimit = atLimit;
    }
    state.fullScaleRunStart = fullScaleRunStart;
    state.fullScaleRunLength = fullScaleRunLength;
    state.fullScaleRunSign = fullScaleRunSign;
    state.flatRunLength = flatRunLength;
    state.flatRunStart = flatRunStart;
    state.flatRunBefore1 = flatRunBefore1;
    state.flatRunBefore2 = flatRunBefore2;
    state.flatRunReference = flatRunReference;
    state.previous1 = previous1;
    state.previous2 = previous2;
    state.previous3 = previous3;
    state.previousAtLimit = previousAtLimit;
    state.halfCycleSign = halfCycleSign;
    state.halfCycleMax = halfCycleMax;
    state.halfCycleFill = halfCycleFill;
    state.halfCycleStart = halfCycleStart;
    state.halfCycleAtLimit = halfCycleAtLimit;
  }

  /** Keeps a finished half-cycle as a plateau candidate when it dwells at its peak far longer than it took to rise. */
  private closeHalfCycle(state: ChannelClipState, sign: number, peak: number, length: number, startFrame: number): void {
    const magnitudes = state.halfCycle;
    const top = (1 - PLATEAU_DEPTH) * peak;
    let first = 0;
    while (magnitudes[first] < top) first++;
    let last = length - 1;
    while (magnitudes[last] < top) last--;
    const dwell = last - first + 1;
    if (dwell < MIN_CLIP_RUN) return;
    // One plateau, not two peaks with a valley between them.
    let sum = 0;
    const floor = (1 - 2 * PLATEAU_DEPTH) * peak;
    for (let i = first; i <= last; i++) {
      if (magnitudes[i] < floor) return;
      sum += magnitudes[i];
    }
    const half = peak / 2;
    let rise = first;
    while (rise > 0 && magnitudes[rise - 1] >= half) rise--;
    let fall = last;
    while (fall < length - 1 && magnitudes[fall + 1] >= half) fall++;
    const slowest = Math.min(first - rise + 1, fall - last + 1);
    if (dwell < PLATEAU_RATIO * slowest) return;
    this.addRun(state.plateauGroups[sign > 0 ? 0 : 1], startFrame + first, dwell, sum / dwell, PLATEAU_DEPTH * peak, first - rise + 1);
  }

  /** Adds a run to the groups, merging it into the last group when close in time and (for flat tops) in level. */
  private addRun(groups: ClipGroup[], start: number, length: number, level: number, levelTolerance: number, riseFrames = 0): void {
    const last = groups[groups.length - 1];
    if (last && start - last.end <= this.mergeGapFrames && Math.abs(last.level - level) <= levelTolerance) {
      last.end = start + length;
      last.samples += length;
      last.runs++;
      if (Math.abs(length - last.lastLength) <= SQUARE_LENGTH_SPREAD * Math.max(length, last.lastLength)) last.evenSteps++;
      last.lastLength = length;
      last.riseFrames += riseFrames;
      if (level > last.level) last.level = level;
      return;
    }
    if (groups.length < MAX_GROUPS) groups.push({ start, end: start + length, level, samples: length, runs: 1, lastLength: length, evenSteps: 0, riseFrames });
  }

  /**
   * A synthesiser's square or trapezium wave: each plateau as long as the one before it (one note's
   * cycles; a melody changes the length only from note to note), all reached in a sample or two. A
   * clipped voice or instrument makes plateaus of many lengths, entered along its own waveform.
   */
  private static isSynthesisedSquare(cluster: ClipGroup[]): boolean {
    const count = cluster.reduce((sum, group) => sum + group.runs, 0);
    const meanRise = cluster.reduce((sum, group) => sum + group.riseFrames, 0) / count;
    const steps = count - cluster.length;
    const evenSteps = cluster.reduce((sum, group) => sum + group.evenSteps, 0);
    return meanRise <= SQUARE_RISE_FRAMES && steps > 0 && evenSteps >= SQUARE_EVEN_SHARE * steps;
  }

  /** Keeps a flat run as a candidate when the signal ran into it faster than a rounded peak can. */
  private closeFlatRun(state: ChannelClipState, start: number, length: number, reference: number, before1: number, before2: number): void {
    const magnitude = Math.abs(reference);
    const tolerance = Math.max(this.toleranceFloor, magnitude * FLAT_TOP_RELATIVE_TOLERANCE);
    // How fast |x| was rising into the run, over the last two steps before it.
    const entrySlope = Math.max(magnitude - Math.abs(before1), Math.abs(before1) - Math.abs(before2));
    if (entrySlope < ENTRY_SLOPE_FACTOR * tolerance) return;
    this.addRun(state.flatTopGroups[reference > 0 ? 0 : 1], start, length, magnitude, 2 * tolerance);
  }

  /**
   * Flat-top candidates grouped by level: each cluster spans at most EXTREME_LEVEL_WINDOW_DB below its
   * loudest member. A clipping stage flattens every overload at one level, so a real flat top forms
   * a cluster of its own, whatever else (full-scale clips, louder passages) the channel holds.
   */
  private static levelClusters(groups: ClipGroup[]): ClipGroup[][] {
    const byLevel = [...groups].sort((a, b) => b.level - a.level);
    const clusters: ClipGroup[][] = [];
    const ratio = 10 ** (-EXTREME_LEVEL_WINDOW_DB / 20);
    for (const group of byLevel) {
      const current = clusters[clusters.length - 1];
      if (current && group.level >= current[0].level * ratio) current.push(group);
      else clusters.push([group]);
    }
    return clusters;
  }

  /** True when the histogram bins at `level` hold a spike over the bins just below. */
  private static isHistogramSpike(histogram: Uint32Array, level: number, tolerance: number): boolean {
    const low = Math.floor((level - tolerance) * HISTOGRAM_BINS_PER_UNIT);
    const high = Math.min(HISTOGRAM_BINS_PER_UNIT + 1, Math.floor((level + tolerance) * HISTOGRAM_BINS_PER_UNIT));
    let spike = 0;
    for (let bin = low; bin <= high; bin++) spike = Math.max(spike, histogram[bin]);
    const width = 16;
    let below = 0;
    for (let bin = low - width - 1; bin < low - 1; bin++) below += bin >= 0 ? histogram[bin] : 0;
    return spike >= HISTOGRAM_SPIKE_RATIO * Math.max(1, below / width);
  }

  /** Half-cycles whose peak lies within [low, high] (linear magnitudes). */
  private static peaksBetween(peaks: Uint32Array, low: number, high: number): number {
    const first = Math.max(0, Math.floor(low * HISTOGRAM_BINS_PER_UNIT));
    const last = Math.min(HISTOGRAM_BINS_PER_UNIT + 1, Math.floor(high * HISTOGRAM_BINS_PER_UNIT));
    let count = 0;
    for (let bin = first; bin <= last; bin++) count += peaks[bin];
    return count;
  }

  finish(): ClippingResult {
    const events: ClipEvent[] = [];
    const channelClippedSamples: number[] = [];
    for (let channel = 0; channel < this.channelCount; channel++) {
      const state = this.states[channel];
      if (state.flatRunLength >= MIN_CLIP_RUN) this.closeFlatRun(state, state.flatRunStart, state.flatRunLength, state.flatRunReference, state.flatRunBefore1, state.flatRunBefore2);
      if (state.fullScaleRunLength >= MIN_CLIP_RUN) this.addRun(state.fullScaleGroups, state.fullScaleRunStart, state.fullScaleRunLength, 1, Number.POSITIVE_INFINITY);
      const kept: (ClipGroup & { kind: ClipEvent['level'] })[] = state.fullScaleGroups.map((group) => ({ ...group, kind: 'fullScale' as const }));
      for (const polarity of [0, 1] as const) {
        const histogram = polarity === 0 ? state.positiveHistogram : state.negativeHistogram;
        for (const cluster of ClippingAnalyzer.levelClusters(state.flatTopGroups[polarity])) {
          const flatTops = cluster.reduce((sum, group) => sum + group.runs, 0);
          if (flatTops < MIN_FLAT_TOPS) continue;
          const meanLevel = cluster.reduce((sum, group) => sum + group.level * group.runs, 0) / flatTops;
          const tolerance = Math.max(this.toleranceFloor, meanLevel * FLAT_TOP_RELATIVE_TOLERANCE);
          if (!ClippingAnalyzer.isHistogramSpike(histogram, meanLevel, tolerance)) continue;
          const lowest = Math.min(...cluster.map((group) => group.level));
          const highest = Math.max(...cluster.map((group) => group.level));
          const peaks = ClippingAnalyzer.peaksBetween(polarity === 0 ? state.positivePeaks : state.negativePeaks, lowest - 2 * tolerance, highest + 2 * tolerance);
          if (flatTops < MIN_FLAT_SHARE * peaks) continue;
          for (const group of cluster) kept.push({ ...group, kind: 'belowFullScale' });
        }
      }
      for (const polarity of [0, 1] as const) {
        const peaksHistogram = polarity === 0 ? state.positivePeaks : state.negativePeaks;
        for (const cluster of ClippingAnalyzer.levelClusters(state.plateauGroups[polarity])) {
          const plateaus = cluster.reduce((sum, group) => sum + group.runs, 0);
          if (plateaus < MIN_FLAT_TOPS) continue;
          const lowest = Math.min(...cluster.map((group) => group.level));
          const highest = Math.max(...cluster.map((group) => group.level));
          // Half-cycle peaks pile up at a clipping level: more of them end there than in a band twice as wide just under it.
          const peaksAtLevel = ClippingAnalyzer.peaksBetween(peaksHistogram, lowest, highest * (1 + 2 * PLATEAU_DEPTH));
          const peaksUnder = ClippingAnalyzer.peaksBetween(peaksHistogram, lowest * (1 - 5 * PLATEAU_DEPTH), lowest * (1 - PLATEAU_DEPTH));
          if (peaksAtLevel < PLATEAU_PILE_UP * peaksUnder || plateaus < MIN_PLATEAU_SHARE * peaksAtLevel) continue;
          if (ClippingAnalyzer.isSynthesisedSquare(cluster)) continue;
          for (const group of cluster) kept.push({ ...group, kind: 'belowFullScale' });
        }
      }
      kept.sort((a, b) => a.start - b.start);
      // Merge across polarities: one clipped passage is one event.
      let current: (ClipGroup & { kind: ClipEvent['level'] }) | null = null;
      let clipped = 0;
      const emit = () => {
        if (!current) return;
        events.push({
          channel,
          startSec: current.start / this.sampleRate,
          endSec: current.end / this.sampleRate,
          level: current.kind,
          levelDbfs: current.kind === 'fullScale' ? 0 : Math.round(20 * Math.log10(current.level) * 100) / 100,
        });
      };
      for (const group of kept) {
        clipped += group.samples;
        if (current && current.kind === group.kind && group.start - current.end <= this.mergeGapFrames) {
          current.end = Math.max(current.end, group.end);
          current.level = Math.max(current.level, group.level);
        } else {
          emit();
          current = { ...group };
        }
      }
      emit();
      channelClippedSamples.push(clipped);
    }
    events.sort((a, b) => a.startSec - b.startSec || a.channel - b.channel);
    return { clippedSamples: channelClippedSamples.reduce((a, b) => a + b, 0), events, channelClippedSamples };
  }
}
