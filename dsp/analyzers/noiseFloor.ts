import FFT from 'fft.js';
import type { Analyzer, AudioFormat, SampleBlock } from '../types';
import { roundTo } from '../util/decibels';
import { GrowableFloat64Array } from '../util/GrowableFloat64Array';
import { assertAnalysableFormat, declaredFrames, hannWindow } from './formatGuard';

/**
 * Noise floor of the quiet stretches and mains hum in them.
 *
 * Floor: short windows (≈ 100 ms) per channel, digital silence (windows of
 * exact zeros) excluded. The quiet windows are those whose AC RMS (own mean
 * removed) lies within QUIET_SPAN_DB of a low percentile, in runs of at least
 * PASSAGE_WINDOWS (quiet passages). The channel's steady
 * DC is the median mean of its quiet passages (runs of quiet windows); the floor
 * is the power mean of those windows' mean squares around that DC. So a converter's
 * offset does not count as noise, but steady noise reads its RMS whatever its
 * spectrum: pink noise's short windows scatter by a few dB and swing slowly, so
 * a percentile of per-window AC levels alone reads it about 1 dB low. RMS in
 * dBFS is referenced to a full-scale square wave (a full-scale sine reads −3.01 dBFS).
 *
 * A floor is only claimed where there is one to hear: quiet passages (the loud
 * windows, the programme, stand at least QUIET_PASSAGE_DB over the quiet ones), or
 * a channel that is one steady noise throughout (room tone, hiss), noise no louder
 * than STEADY_NOISE_MAX_DBFS. Where the loud windows lie in fewer than
 * PROGRAMME_PARTS tenths of the take, the rest must be steady low noise (room tone
 * after a slate) or a programme over pauses itself (its 80th percentile
 * QUIET_PASSAGE_DB over the quiet windows); else the loud stretch is an overload or
 * a sting on dense material, whose own quietest moments are no noise floor. Dense material (a music
 * master that never falls quiet) and steady loud sound (an ambience, a drone, a
 * tone) have no floor to measure, and no hum is looked for in them.
 *
 * Which channels make the take's floor: those with quiet passages under their
 * programme. A channel of steady noise beside them is a part of the programme
 * (a surround atmosphere) or a dead input (judged as a silent channel), not the
 * floor of the quiet passages; steady-noise channels make the floor only when no
 * channel carries programme (a take of room tone). Of those channels the take's
 * floor is the noisiest one's, as one programme is heard through all its
 * channels; for iso tracks (a poly take) it is the quietest track's, as the mix
 * is made from the cleanest microphones and a noisy one can be left out (its own
 * level is no fault of the take), and there is no signal-to-noise ratio, as
 * unrelated tracks share no programme level.
 *
 * Hum: the signal is low-passed and decimated to ≈ 2.4 kHz by averaging groups
 * of D samples (a first-order CIC filter), cut into frames of 1024 decimated samples (≈ 0.43 s,
 * ≈ 2.3 Hz resolution, 50 % overlap), and each frame's Hann periodogram is
 * added to an accumulator chosen by the level of the loudest short window in
 * the frame (2 dB classes), so only frames that lie wholly in a quiet stretch
 * count as quiet. At the end the classes within CLASS_MARGIN_DB of the floor form
 * the floor's spectrum, in which 50 Hz or 60 Hz harmonic lines are looked for;
 * with fewer than MIN_FLOOR_FRAMES such frames (pauses too short to hold one)
 * no hum is claimed. Memory is bounded by the class count.
 *
 * Long takes are sampled: whole segments of 8 windows (3 hum frames) spread
 * evenly over the take, at most `maxSegments` of them (the stride doubles when
 * a take of unknown length outgrows the budget; each window then counts with
 * its stride as weight). A low percentile from ≥ 12 000 windows has a sampling
 * error far below the 0.1 dB histogram step.
 */

export interface NoiseFloorOptions {
  /** Percentile of the short-window RMS taken as the floor, 0.5–50 %. Default 5. [common practice] */
  floorPercentile?: number;
  /** A harmonic counts as hum when it stands this far above the neighbouring floor spectrum, dB (3–40). Default 10. [common practice] */
  humProminenceDb?: number;
  /**
   * Most segments (8 short windows, ≈ 0.85 s at 48 kHz) measured; a longer take is sampled by
   * segments spread evenly over it, 10–1000000. Default 1500 (≈ 21 minutes of a 48 kHz take).
   */
  maxSegments?: number;
}

/** What the floor was measured on: quiet passages under the programme, a take of steady noise, or nothing (no quiet passage). */
export type FloorBasis = 'quiet-passages' | 'steady-noise' | 'none';

export interface NoiseFloorResult {
  /**
   * RMS of the quiet passages of the noisiest channel (of iso tracks, the quietest track), dBFS (square-wave
   * reference), to 0.1 dB; null when there is nothing but digital silence or no quiet passage.
   */
  floorDbfs: number | null;
  /** What the floor stands on ('none' also for digital silence). */
  basis: FloorBasis;
  /**
   * Signal-to-noise ratio of the floor's channel, dB: the power mean of its programme windows (more than
   * PROGRAMME_ABOVE_DB over the quiet band) over the floor, to 0.1 dB; null unless the floor stands on quiet passages,
   * and for iso tracks.
   */
  snrDb: number | null;
  /** Mains frequency whose harmonics stand out of the floor's spectrum, or null. */
  humHz: 50 | 60 | null;
  /**
   * Bits an ideal quantiser would need for its noise (uniform, Q²/12 over the full band) to equal the floor:
   * N = (−floor − 4.77)/6.02 from the unrounded floor, to 0.1 bit. Null with the floor.
   */
  noiseLimitedBits: number | null;
}

/** Decimated rate the hum search aims at, Hz (lowest allowed; harmonics up to 8 × 60 Hz = 480 Hz fit well below its Nyquist). */
const HUM_RATE_TARGET_HZ = 2400;
const HUM_FFT_SIZE = 1024;
/** Short RMS windows per hum frame (≈ 107 ms windows at 48 kHz); frames advance by half of them. */
const WINDOWS_PER_FRAME = 4;
const HISTOGRAM_MIN_DB = -200;
const HISTOGRAM_STEP_DB = 0.1;
const HISTOGRAM_BINS = 2100;
/** Windows up to this far above the percentile count as quiet, dB. [common practice] */
const QUIET_SPAN_DB = 3;
/** Quiet passages: the programme stands at least this far over the quiet windows, dB. [common practice] */
const QUIET_PASSAGE_DB = 10;
/** The loud windows, the programme: those over this percentile, dB. */
const LOUD_PERCENTILE = 0.95;
/**
 * Loud windows in at least this many of the take's ten equal parts recur as a programme does (speech with
 * pauses: all ten); an overload of a second or two in dense music lies in one to three. [common practice]
 */
const PROGRAMME_PARTS = 4;
/** The bulk of a channel's windows: up to this percentile. */
const BULK_PERCENTILE = 0.8;
/** Windows this far over the quiet windows' percentile are programme, for the signal-to-noise ratio, dB. [common practice] */
const PROGRAMME_ABOVE_DB = 6;
/** Shortest quiet passage, in short windows (≈ 0.3 s at 107 ms each). [common practice] */
const PASSAGE_WINDOWS = 3;
/** A take whose windows all lie within this span is one steady sound, dB. [common practice] */
const STEADY_SPAN_DB = 3;
/** Steady sound louder than this is programme (an ambience, a drone, a tone), not a noise floor, dBFS RMS. [common practice] */
const STEADY_NOISE_MAX_DBFS = -45;
/** Short windows per measured segment (three hum frames at 50 % overlap). */
const SEGMENT_WINDOWS = 8;
const CLASS_STEP_DB = 2;
/** Floor-spectrum classes reach this far above the floor, dB. [common practice] */
const CLASS_MARGIN_DB = 6;
const MIN_FLOOR_FRAMES = 2;
const HARMONICS = 8;
/** Half-width of the neighbourhood a line is compared with, Hz. */
const NEIGHBOURHOOD_HZ = 25;

export class NoiseFloorAnalyzer implements Analyzer<NoiseFloorResult> {
  private readonly channels: number;
  private readonly decimation: number;
  private readonly humRate: number;
  private readonly windowFrames: number;
  private readonly percentile: number;
  private readonly prominenceDb: number;
  private readonly fft: FFT;
  private readonly hann: Float64Array;
  private readonly fftIn: Float64Array;
  private readonly fftOut: Float64Array;
  // Per channel: short-window sums, histogram, CIC state, frame buffer, recent window levels.
  private readonly winSum: Float64Array;
  private readonly winSumSq: Float64Array;
  private winFill = 0;
  /** Per channel and measured window: AC mean square, mean, and weight (the stride it stands for). */
  private readonly windowMs: GrowableFloat64Array[];
  private readonly windowMeans: GrowableFloat64Array[];
  private readonly windowWeights: GrowableFloat64Array[];
  private readonly maxSegments: number;
  /** Segments per measured segment (1 = every segment), and what is left of a skip. */
  private stride: number;
  private segmentsAtStride = 0;
  private windowsInSegment = 0;
  private skipFrames = 0;
  private readonly groupSum: Float64Array;
  private readonly groupSumSq: Float64Array;
  private cicPhase = 0;
  private readonly frames: Float64Array[];
  private frameFill = 0;
  private readonly recentMs: Float64Array[];
  private recentCount = 0;
  /** classSpectra[channel][class] (allocated on first use) and frame counts. */
  private readonly classSpectra: (Float64Array | null)[][];
  private readonly classFrames: Int32Array[];
  private finished = false;

  /**
   * @param format the take's format (sample rate 1 kHz – 768 kHz, 1–64 channels)
   * @param options floor percentile (%) and hum prominence (dB)
   * @throws RangeError on impossible configuration
   */
  constructor(format: AudioFormat, options: NoiseFloorOptions = {}) {
    assertAnalysableFormat(format, 'NoiseFloorAnalyzer');
    const pct = options.floorPercentile ?? 5;
    if (!Number.isFinite(pct) || pct < 0.5 || pct > 50) {
      throw new RangeError(`NoiseFloorAnalyzer: floorPercentile ${pct} must be from 0.5 to 50 (%).`);
    }
    const prom = options.humProminenceDb ?? 10;
    if (!Number.isFinite(prom) || prom < 3 || prom > 40) {
      throw new RangeError(`NoiseFloorAnalyzer: humProminenceDb ${prom} must be from 3 to 40 dB.`);
    }
    const maxSegments = options.maxSegments ?? 1500;
    if (!Number.isInteger(maxSegments) || maxSegments < 10 || maxSegments > 1_000_000) {
      throw new RangeError(`NoiseFloorAnalyzer: maxSegments ${maxSegments} must be an integer from 10 to 1000000.`);
    }
    this.maxSegments = maxSegments;
    this.channels = format.channels;
    this.percentile = pct / 100;
    this.prominenceDb = prom;
    this.decimation = Math.max(1, Math.floor(format.sampleRate / HUM_RATE_TARGET_HZ));
    this.humRate = format.sampleRate / this.decimation;
    this.windowFrames = (HUM_FFT_SIZE * this.decimation) / WINDOWS_PER_FRAME;
    this.fft = new FFT(HUM_FFT_SIZE);
    this.hann = hannWindow(HUM_FFT_SIZE);
    this.fftIn = new Float64Array(HUM_FFT_SIZE);
    this.fftOut = new Float64Array(2 * HUM_FFT_SIZE);
    const c = this.channels;
    this.winSum = new Float64Array(c);
    this.winSumSq = new Float64Array(c);
    this.windowMs = Array.from({ length: c }, () => new GrowableFloat64Array());
    this.windowMeans = Array.from({ length: c }, () => new GrowableFloat64Array());
    this.windowWeights = Array.from({ length: c }, () => new GrowableFloat64Array());
    const frames = declaredFrames(format);
    const segmentFrames = SEGMENT_WINDOWS * this.windowFrames;
    this.stride = frames === null ? 1 : Math.max(1, Math.ceil(frames / segmentFrames / maxSegments));
    this.groupSum = new Float64Array(c);
    this.groupSumSq = new Float64Array(c);
    this.frames = Array.from({ length: c }, () => new Float64Array(HUM_FFT_SIZE));
    this.recentMs = Array.from({ length: c }, () => new Float64Array(WINDOWS_PER_FRAME));
    const classes = Math.ceil(-HISTOGRAM_MIN_DB / CLASS_STEP_DB) + 10;
    this.classSpectra = Array.from({ length: c }, () => new Array<Float64Array | null>(classes).fill(null));
    this.classFrames = Array.from({ length: c }, () => new Int32Array(classes));
  }

  push(block: SampleBlock): void {
    if (this.finished) throw new Error('NoiseFloorAnalyzer: push() after finish().');
    const d = this.decimation;
    const w = this.windowFrames;
    let i = 0;
    while (i < block.frames) {
      if (this.skipFrames > 0) {
        const skip = Math.min(this.skipFrames, block.frames - i);
        this.skipFrames -= skip;
        i += skip;
        continue;
      }
      // Process up to the next window boundary, so window, CIC and frame stay in step.
      const n = Math.min(block.frames - i, w - this.winFill);
      const phase0 = this.cicPhase;
      let outputs = 0;
      for (let c = 0; c < this.channels; c++) {
        const x = block.channels[c];
        const frame = this.frames[c];
        let sum = this.winSum[c];
        let sumSq = this.winSumSq[c];
        // Group sums of D samples: a boxcar (first-order CIC) decimator, H(F) = sin(πFD/fs)/(D·sin(πF/fs)).
        // What folds onto f comes from near its nulls k·fs/D and is attenuated there (first fold at
        // D = 20: ≈ 28 dB for f = 100 Hz, ≈ 18 dB for 300 Hz); the same sums feed the window statistics.
        let g = this.groupSum[c];
        let g2 = this.groupSumSq[c];
        let p = phase0;
        let fill = this.frameFill;
        let j = i;
        const end = i + n;
        while (j < end) {
          const stop = Math.min(end, j + (d - p));
          p += stop - j;
          // Pairs: two independent sums per step shorten the floating-point dependency chain.
          for (; j + 1 < stop; j += 2) {
            const v = x[j];
            const u = x[j + 1];
            g += v + u;
            g2 += v * v + u * u;
          }
          if (j < stop) {
            const v = x[j++];
            g += v;
            g2 += v * v;
          }
          if (p === d) {
            if (fill < HUM_FFT_SIZE) frame[fill] = g / d;
            fill++;
            sum += g;
            sumSq += g2;
            g = 0;
            g2 = 0;
            p = 0;
          }
        }
        this.winSum[c] = sum;
        this.winSumSq[c] = sumSq;
        this.groupSum[c] = g;
        this.groupSumSq[c] = g2;
        if (c === this.channels - 1) {
          this.cicPhase = p;
          outputs = fill - this.frameFill;
        }
      }
      this.frameFill += outputs;
      this.winFill += n;
      i += n;
      if (this.winFill === w) {
        this.closeWindow();
        // Windows hold 256 decimated samples each, so frames complete on window boundaries.
        if (this.frameFill >= HUM_FFT_SIZE) this.closeFrame();
        if (++this.windowsInSegment === SEGMENT_WINDOWS) this.endSegment();
      }
    }
  }

  /**
   * @param take `isoTracks`: the channels are independent iso tracks (a poly take), judged by the quietest track
   */
  finish(take: { isoTracks?: boolean } = {}): NoiseFloorResult {
    if (this.finished) throw new Error('NoiseFloorAnalyzer: finish() called twice.');
    this.finished = true;
    // A last window of at least a quarter length still counts (with its unfinished group).
    for (let c = 0; c < this.channels; c++) {
      this.winSum[c] += this.groupSum[c];
      this.winSumSq[c] += this.groupSumSq[c];
    }
    if (this.winFill >= this.windowFrames / 4) this.closeWindow();
    const floors = this.windowMs.map((ms, c) => channelFloor(ms.view(), this.windowMeans[c].view(), this.windowWeights[c].view(), this.percentile));
    const judged = floorChannels(floors);
    if (judged.length === 0) return { floorDbfs: null, basis: 'none', snrDb: null, humHz: null, noiseLimitedBits: null };
    const isoTracks = take.isoTracks === true;
    const chosen = judged.reduce((best, floor) => ((isoTracks ? floor.db < best.db : floor.db > best.db) ? floor : best));
    // Ideal quantiser noise, step Q = 2^(1−N) for full scale ±1: rms Q/√12, so
    // 20·log10(Q/√12) = −6.02·N − 4.77 dBFS (square-wave reference).
    const bits = (-chosen.db - 10 * Math.log10(12 / 4)) / (20 * Math.log10(2));
    return {
      floorDbfs: roundTo(chosen.db, 1),
      basis: chosen.basis,
      snrDb: !isoTracks && chosen.basis === 'quiet-passages' && chosen.programmeDb !== null ? roundTo(chosen.programmeDb - chosen.db, 1) : null,
      humHz: this.detectHum(floors.map((floor) => (judged.includes(floor) ? floor.db : null))),
      noiseLimitedBits: roundTo(bits, 1),
    };
  }

  /** Ends a measured segment: skip to the next one, and start afresh there (frames never straddle a skip). */
  private endSegment(): void {
    this.windowsInSegment = 0;
    if (++this.segmentsAtStride >= this.maxSegments) {
      this.stride *= 2;
      this.segmentsAtStride = 0;
    }
    if (this.stride === 1) return;
    this.skipFrames = (this.stride - 1) * SEGMENT_WINDOWS * this.windowFrames;
    this.frameFill = 0;
    this.recentCount = 0;
    this.cicPhase = 0;
    this.groupSum.fill(0);
    this.groupSumSq.fill(0);
  }

  private closeWindow(): void {
    const n = this.winFill;
    for (let c = 0; c < this.channels; c++) {
      const mean = this.winSum[c] / n;
      const acMs = Math.max(0, this.winSumSq[c] / n - mean * mean);
      const digitalSilence = this.winSumSq[c] === 0;
      // A take's last, shorter window counts only when it is all there is (its level is less steady).
      if (!digitalSilence && (n === this.windowFrames || this.windowMs[c].length === 0)) {
        this.windowMs[c].push(acMs);
        this.windowMeans[c].push(mean);
        // Weighted by the stride it stands for, so a denser start does not bias the percentile.
        this.windowWeights[c].push(this.stride);
      }
      this.recentMs[c][this.recentCount % WINDOWS_PER_FRAME] = digitalSilence ? -1 : acMs;
      this.winSum[c] = 0;
      this.winSumSq[c] = 0;
    }
    this.recentCount++;
    this.winFill = 0;
  }

  /** Adds each channel's frame periodogram to the class of the frame's level. */
  private closeFrame(): void {
    const n = HUM_FFT_SIZE;
    for (let c = 0; c < this.channels; c++) {
      let loudest = 0;
      let silent = false;
      const recent = this.recentMs[c];
      const count = Math.min(WINDOWS_PER_FRAME, this.recentCount);
      for (let k = 0; k < count; k++) {
        if (recent[k] < 0) silent = true;
        loudest = Math.max(loudest, recent[k]);
      }
      if (silent || count === 0 || !(loudest > 0)) continue;
      const levelDb = 10 * Math.log10(loudest);
      const cls = Math.max(0, Math.floor((levelDb - HISTOGRAM_MIN_DB) / CLASS_STEP_DB));
      const frame = this.frames[c];
      let mean = 0;
      for (let k = 0; k < n; k++) mean += frame[k];
      mean /= n;
      for (let k = 0; k < n; k++) this.fftIn[k] = (frame[k] - mean) * this.hann[k];
      this.fft.realTransform(this.fftOut, this.fftIn);
      const spectra = this.classSpectra[c];
      const acc = spectra[cls] ?? (spectra[cls] = new Float64Array(n / 2 + 1));
      for (let k = 0; k <= n / 2; k++) {
        const re = this.fftOut[2 * k];
        const im = this.fftOut[2 * k + 1];
        acc[k] += re * re + im * im;
      }
      this.classFrames[c][cls]++;
    }
    // 50 % overlap: keep the second half as the next frame's first half.
    for (const frame of this.frames) frame.copyWithin(0, HUM_FFT_SIZE / 2, HUM_FFT_SIZE);
    this.frameFill = HUM_FFT_SIZE / 2;
  }

  /** Sums the classes at or near each channel's floor and looks for mains harmonic lines in that spectrum. */
  private detectHum(floors: (number | null)[]): 50 | 60 | null {
    const half = HUM_FFT_SIZE / 2;
    const spectrum = new Float64Array(half + 1);
    let used = 0;
    for (let c = 0; c < this.channels; c++) {
      const floor = floors[c];
      if (floor === null) continue;
      const limit = Math.floor((floor + CLASS_MARGIN_DB - HISTOGRAM_MIN_DB) / CLASS_STEP_DB);
      const counts = this.classFrames[c];
      let framesTaken = 0;
      for (let cls = 0; cls < counts.length; cls++) {
        if (counts[cls] === 0) continue;
        // Only frames at the floor: louder ones hold programme (a voice at 100 Hz has the lines of 50 Hz hum).
        if (cls > limit) break;
        const acc = this.classSpectra[c][cls]!;
        for (let k = 0; k <= half; k++) spectrum[k] += acc[k];
        framesTaken += counts[cls];
      }
      used += framesTaken;
    }
    // Too few frames lie wholly in quiet passages (fast speech, short pauses): hum cannot be measured.
    if (used < MIN_FLOOR_FRAMES) return null;
    const binHz = this.humRate / HUM_FFT_SIZE;
    const score = (mains: number): { count: number; sum: number } => {
      let count = 0;
      let sum = 0;
      for (let h = 1; h <= HARMONICS; h++) {
        const f = h * mains;
        // 300 Hz is the 6th harmonic of 50 Hz and the 5th of 60 Hz: it tells them apart no better than silence.
        if (f % 50 === 0 && f % 60 === 0) continue;
        if (f + NEIGHBOURHOOD_HZ > 0.45 * this.humRate) break;
        const prominence = lineProminence(spectrum, f, binHz);
        if (prominence >= this.prominenceDb) {
          count++;
          sum += prominence;
        }
      }
      return { count, sum };
    };
    const s50 = score(50);
    const s60 = score(60);
    // Hum: at least two harmonics (of the first eight) stand out. [common practice]
    const best = s50.count > s60.count || (s50.count === s60.count && s50.sum >= s60.sum) ? { hz: 50 as const, ...s50 } : { hz: 60 as const, ...s60 };
    return best.count >= 2 ? best.hz : null;
  }
}

interface ChannelFloor {
  /** Power mean of the quiet windows, dB (−Infinity for a channel of digital silence). */
  db: number;
  basis: FloorBasis;
  /** Power mean of the programme windows (AC), dB; null when there are none. */
  programmeDb: number | null;
}

/**
 * The channels whose floors make the take's: those with quiet passages under a programme; failing those,
 * steady-noise channels, but only when no channel carries programme (every channel is steady noise or
 * digital silence).
 */
function floorChannels(floors: ChannelFloor[]): ChannelFloor[] {
  const underProgramme = floors.filter((floor) => floor.basis === 'quiet-passages');
  if (underProgramme.length > 0) return underProgramme;
  const noProgramme = floors.every((floor) => floor.basis === 'steady-noise' || floor.db === -Infinity);
  return noProgramme ? floors.filter((floor) => floor.basis === 'steady-noise') : [];
}

/** Level of histogram bin `bin`, dB (its centre). */
const binDb = (bin: number) => HISTOGRAM_MIN_DB + (bin + 0.5) * HISTOGRAM_STEP_DB;

/** Level below which a share `fraction` of the histogram's windows lie, dB (a bin centre). */
function percentileDb(histogram: Float64Array, total: number, fraction: number): number {
  let run = 0;
  for (let bin = 0; bin < histogram.length; bin++) {
    run += histogram[bin];
    if (run >= fraction * total) return binDb(bin);
  }
  return binDb(histogram.length - 1);
}

/** A 0.1 dB histogram of window mean squares, each window counting `weights[i]`. */
function histogramOf(meanSquares: ArrayLike<number>, weights: Float64Array): Float64Array {
  const histogram = new Float64Array(HISTOGRAM_BINS);
  for (let i = 0; i < weights.length; i++) {
    const db = 10 * Math.log10(meanSquares[i] > 1e-20 ? meanSquares[i] : 1e-20);
    const bin = Math.floor((db - HISTOGRAM_MIN_DB) / HISTOGRAM_STEP_DB);
    histogram[Math.max(0, Math.min(HISTOGRAM_BINS - 1, bin))] += weights[i];
  }
  return histogram;
}

/**
 * One channel's floor. Quiet windows are those whose AC level lies within QUIET_SPAN_DB of the
 * percentile; a passage is a run of at least PASSAGE_WINDOWS of them: steady, as noise is (a decaying
 * note passes through that band in a window or two, and is not a pause). The channel's steady DC is the median mean of the passages' windows, and
 * the floor the power mean of their mean squares around it.
 */
function channelFloor(acMs: Float64Array, means: Float64Array, weights: Float64Array, percentile: number): ChannelFloor {
  if (weights.length === 0) return { db: -Infinity, basis: 'none', programmeDb: null };
  const histogram = histogramOf(acMs, weights);
  const total = histogram.reduce((sum, count) => sum + count, 0);
  const low = percentileDb(histogram, total, percentile);
  const spread = percentileDb(histogram, total, LOUD_PERCENTILE) - low;
  const bulkSpread = percentileDb(histogram, total, BULK_PERCENTILE) - low;
  const quietLimit = 10 ** ((low + QUIET_SPAN_DB) / 10);
  const quietFloorMs = 10 ** ((low - QUIET_SPAN_DB) / 10);
  const inPassage: number[] = [];
  let runStart = 0;
  for (let i = 0; i <= acMs.length; i++) {
    if (i < acMs.length && acMs[i] <= quietLimit && acMs[i] >= quietFloorMs) continue;
    if (i - runStart >= PASSAGE_WINDOWS) for (let k = runStart; k < i; k++) inPassage.push(k);
    runStart = i + 1;
  }
  if (inPassage.length === 0) return { db: low, basis: 'none', programmeDb: null };
  const passageMeans = inPassage.map((i) => means[i]).sort((a, b) => a - b);
  const steadyDc = passageMeans[Math.floor(passageMeans.length / 2)];
  let power = 0;
  let weight = 0;
  for (const i of inPassage) {
    power += weights[i] * (acMs[i] + (means[i] - steadyDc) ** 2);
    weight += weights[i];
  }
  const db = 10 * Math.log10(power / weight);
  const programmeMs = 10 ** ((low + PROGRAMME_ABOVE_DB) / 10);
  let programmePower = 0;
  let programmeWeight = 0;
  for (let i = 0; i < acMs.length; i++) {
    if (acMs[i] <= programmeMs) continue;
    programmePower += weights[i] * acMs[i];
    programmeWeight += weights[i];
  }
  const programmeDb = programmeWeight > 0 ? 10 * Math.log10(programmePower / programmeWeight) : null;
  const lowNoise = db <= STEADY_NOISE_MAX_DBFS;
  if (spread >= QUIET_PASSAGE_DB) {
    const bulkIsNoiseOrPauses = (lowNoise && bulkSpread <= STEADY_SPAN_DB) || bulkSpread >= QUIET_PASSAGE_DB;
    const loudStretchOnly = partsWithLoudWindows(acMs, weights, 10 ** ((low + QUIET_PASSAGE_DB) / 10)) < PROGRAMME_PARTS;
    if (bulkIsNoiseOrPauses || !loudStretchOnly) return { db, basis: 'quiet-passages', programmeDb };
  }
  if (lowNoise && spread <= STEADY_SPAN_DB) return { db, basis: 'steady-noise', programmeDb };
  return { db, basis: 'none', programmeDb };
}

/** In how many of ten equal parts of the take (by window weight, i.e. time) some window's mean square reaches `loudMs`. */
function partsWithLoudWindows(acMs: Float64Array, weights: Float64Array, loudMs: number): number {
  let total = 0;
  for (const weight of weights) total += weight;
  const parts = new Set<number>();
  let before = 0;
  for (let i = 0; i < acMs.length; i++) {
    if (acMs[i] >= loudMs) parts.add(Math.min(9, Math.floor((10 * before) / total)));
    before += weights[i];
  }
  return parts.size;
}

/**
 * Prominence of a spectral line near `hz`, dB: the power of its Hann main lobe
 * (three bins around the highest bin within ±(1.5 Hz + 0.5 %), the mains
 * tolerance) over three times the median bin of its ±25 Hz neighbourhood
 * without the lobe.
 */
function lineProminence(spectrum: Float64Array, hz: number, binHz: number): number {
  const tol = 1.5 + 0.005 * hz;
  const k0 = Math.max(1, Math.floor((hz - tol) / binHz));
  const k1 = Math.min(spectrum.length - 2, Math.ceil((hz + tol) / binHz));
  let kp = k0;
  for (let k = k0 + 1; k <= k1; k++) if (spectrum[k] > spectrum[kp]) kp = k;
  const line = spectrum[kp - 1] + spectrum[kp] + spectrum[kp + 1];
  const n0 = Math.max(1, Math.floor((hz - NEIGHBOURHOOD_HZ) / binHz));
  const n1 = Math.min(spectrum.length - 1, Math.ceil((hz + NEIGHBOURHOOD_HZ) / binHz));
  const around: number[] = [];
  for (let k = n0; k <= n1; k++) if (Math.abs(k - kp) > 4) around.push(spectrum[k]);
  if (around.length === 0) return 0;
  around.sort((a, b) => a - b);
  const ref = 3 * around[Math.floor(around.length / 2)];
  if (!(line > 0)) return 0;
  if (!(ref > 0)) return 200;
  return 10 * Math.log10(line / ref);
}
