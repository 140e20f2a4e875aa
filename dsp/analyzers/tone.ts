import FFT from 'fft.js';
import type { Analyzer, AudioFormat, SampleBlock } from '../types';
import { assertAnalysableFormat, declaredFrames, hannWindow } from './formatGuard';
import { STANDARD_RATES_HZ } from './spectrum';
import { fitSine, type SineFit } from '../util/sineFit';
import { roundTo } from '../util/decibels';

/**
 * Steady line-up tone at the start or end of a take.
 *
 * Only the first `headSec` and the last `tailSec` seconds of the first eight
 * channels are kept (each buffer at most 2^21 samples, 16 MB, but never under
 * 2 s; float64, so keeping the tail is a plain copy of every block). Both
 * are cut into ≈ 85 ms chunks; a chunk is tonal when one Hann-windowed spectral
 * peak holds all but −30 dB of its power. A run of consistent tonal chunks
 * lasting at least `minToneSec` that begins within `leadInSec` of the start
 * (or ends within it of the end) is a tone. It is measured by the IEEE 1241 /
 * IEEE 1057 four-parameter least-squares sine fit (frequency, two quadrature
 * amplitudes, DC); the fit residual is the noise and distortion (NAD). The
 * tone's edges are then placed where the residual of 5 ms blocks rises above
 * −20 dB of the tone, and a tone still running at the end of the kept head is
 * followed block by block through the rest of the take.
 */

export interface ToneOptions {
  /** Seconds kept from the start of the take, 2–120. Default 10. */
  headSec?: number;
  /** Seconds kept from the end of the take, 2–120. Default 10. */
  tailSec?: number;
  /** Shortest tone reported, seconds, 0.2–60 (and below headSec/tailSec). Default 1. */
  minToneSec?: number;
  /** Silence or pre-roll allowed before the tone (after it, at the end), seconds, 0–30. Default 3. [common practice] */
  leadInSec?: number;
}

export interface ToneResult {
  startSec: number;
  endSec: number;
  /** Fitted frequency, Hz. */
  frequencyHz: number;
  /** Peak amplitude of the fitted sine, dBFS. */
  levelDbfs: number;
  /** Signal to noise-and-distortion ratio over the measured span, dB (NAD = everything but the fundamental and DC, up to Nyquist). */
  sinadDb: number;
  /** THD+N = −SINAD, dB. */
  thdnDb: number;
  /** ENOB referred to full scale: (SINAD − 1.76 + 20·log10(1/peak))/6.02, bits. */
  enobBits: number;
  /**
   * True when the fit's residual lay below the container's own quantisation noise (a sine that lands on a
   * few codes, such as fs/4): SINAD and ENOB are then given as that limit, and the real values are at least these.
   */
  limitedByContainer: boolean;
  /** Rate the take was likely recorded at when a 1000 Hz or 997 Hz tone appears shifted by a wrong declared rate; else null. */
  likelyRecordedRate: number | null;
  /** Channel measured (the one with the strongest tone), 0-based. */
  channel: number;
}

/** Reference line-up tone frequencies, Hz (AES17 / IEC 61606 997 Hz; nominal 1 kHz). */
const STANDARD_TONES_HZ = [1000, 997];
/** A tone counts as a shifted standard tone within this relative distance. [common practice] */
const RATE_MATCH_TOLERANCE = 0.001;
/** Chunk purity: power outside the peak's ±4 bins must be below this fraction (−30 dB). [common practice] */
const CHUNK_IMPURITY_MAX = 1e-3;
/**
 * Lowest SINAD of a line-up tone, dB: a steady sine fits itself far better (even 4-bit codes give
 * ≈ 26 dB); a sweep or a musical note fitted as one sine leaves most of its power as residual. [common practice]
 */
const MIN_TONE_SINAD_DB = 20;
/** Mantissa bits of 32-bit float samples (IEEE 754 binary32, with the hidden bit). */
const FLOAT32_MANTISSA_BITS = 24;
/** Lowest tone level considered, dBFS peak. [common practice] */
const MIN_TONE_DBFS = -60;
/** Level steadiness within a run, dB. [common practice] */
const RUN_LEVEL_TOLERANCE_DB = 1;
/** Edge blocks are inside the tone while their fit residual stays below −20 dB of it. [common practice] */
const EDGE_RESIDUAL_RATIO = 0.1;
const EDGE_BLOCK_SEC = 0.005;
/** Longest span fed to the sine fit, seconds (precision gains little beyond it). */
const MAX_FIT_SEC = 4;
/** Channels searched for a tone (line-up tone is sent to all channels). */
const MAX_TONE_CHANNELS = 8;
/** Samples per kept buffer (head or tail, all channels), unless that is under 2 s. */
const MAX_BUFFER_SAMPLES = 2 ** 21;
/**
 * With a declared length, the tail ring starts filling this long before the declared end, so
 * a take cut short by up to this much still has its end searched; one cut shorter has not.
 */
const TRUNCATION_MARGIN_SEC = 60;


interface Candidate {
  channel: number;
  /** Absolute frames. */
  startFrame: number;
  endFrame: number;
  fit: SineFit;
  /** Absolute frame index of the fit's origin. */
  originFrame: number;
  amplitude: number;
  sinadDb: number;
  /** Edge reached the end of the kept head: follow it on. */
  open: boolean;
}

export class ToneAnalyzer implements Analyzer<ToneResult | null> {
  private readonly fs: number;
  private readonly channels: number;
  /** Mean square of the container's quantisation noise relative to full scale, or, for float, relative to the signal's power. */
  private readonly quantisation: { kind: 'absolute' | 'relative'; meanSquare: number };
  private readonly headFrames: number;
  private readonly tailFrames: number;
  private readonly minToneFrames: number;
  private readonly leadInFrames: number;
  private readonly chunk: number;
  private readonly fft: FFT;
  private readonly hann: Float64Array;
  private readonly hannEnergy: number;
  private readonly fftIn: Float64Array;
  private readonly fftOut: Float64Array;
  private readonly head: Float64Array[];
  private headFill = 0;
  private readonly tail: Float64Array[];
  /** Frames before which nothing needs to enter the tail ring (header length known). */
  private readonly tailSkip: number;
  private tailPos = 0;
  private framesSeen = 0;
  private startTone: Candidate | null = null;
  private headDone = false;
  // Following an open start tone beyond the head.
  private tracking = false;
  private trackSumSq = 0;
  private trackCount = 0;
  private trackBlockStart = 0;
  private readonly edgeBlock: number;
  private finished = false;

  /**
   * @param format the take's format (sample rate 1 kHz – 768 kHz, 1–64 channels)
   * @param options kept seconds, shortest tone and lead-in (seconds)
   * @throws RangeError on impossible configuration
   */
  constructor(format: AudioFormat, options: ToneOptions = {}) {
    assertAnalysableFormat(format, 'ToneAnalyzer');
    const headSec = options.headSec ?? 10;
    const tailSec = options.tailSec ?? 10;
    const minToneSec = options.minToneSec ?? 1;
    const leadInSec = options.leadInSec ?? 3;
    for (const [name, v] of [['headSec', headSec], ['tailSec', tailSec]] as const) {
      if (!Number.isFinite(v) || v < 2 || v > 120) throw new RangeError(`ToneAnalyzer: ${name} ${v} must be from 2 to 120 s.`);
    }
    if (!Number.isFinite(minToneSec) || minToneSec < 0.2 || minToneSec > 60 || minToneSec >= Math.min(headSec, tailSec)) {
      throw new RangeError(`ToneAnalyzer: minToneSec ${minToneSec} must be from 0.2 to 60 s and shorter than headSec and tailSec.`);
    }
    if (!Number.isFinite(leadInSec) || leadInSec < 0 || leadInSec > 30) {
      throw new RangeError(`ToneAnalyzer: leadInSec ${leadInSec} must be from 0 to 30 s.`);
    }
    this.fs = format.sampleRate;
    this.channels = Math.min(format.channels, MAX_TONE_CHANNELS);
    // Ideal quantiser (IEEE 1241): step Q = 2^(1−N) for full scale ±1, noise Q²/12. Float keeps N mantissa bits of each sample.
    this.quantisation =
      format.encoding === 'float'
        ? { kind: 'relative', meanSquare: 2 ** (2 * (1 - FLOAT32_MANTISSA_BITS)) / 12 }
        : { kind: 'absolute', meanSquare: 2 ** (2 * (1 - format.validBitsPerSample)) / 12 };
    const cap = Math.max(2 * this.fs, Math.floor(MAX_BUFFER_SAMPLES / this.channels));
    this.headFrames = Math.min(cap, Math.round(headSec * this.fs));
    this.tailFrames = Math.min(cap, Math.round(tailSec * this.fs));
    this.minToneFrames = Math.round(minToneSec * this.fs);
    this.leadInFrames = Math.round(leadInSec * this.fs);
    // ≈ 85 ms chunks (4096 at 48 kHz), a power of two for the FFT.
    this.chunk = 2 ** Math.max(8, Math.round(Math.log2(0.085 * this.fs)));
    this.edgeBlock = Math.max(16, Math.round(EDGE_BLOCK_SEC * this.fs));
    this.fft = new FFT(this.chunk);
    this.hann = hannWindow(this.chunk);
    this.hannEnergy = this.hann.reduce((s, w) => s + w * w, 0);
    this.fftIn = new Float64Array(this.chunk);
    this.fftOut = new Float64Array(2 * this.chunk);
    const declared = declaredFrames(format);
    this.tailSkip = declared === null ? 0 : Math.max(0, declared - this.tailFrames - Math.round(TRUNCATION_MARGIN_SEC * this.fs));
    this.head = Array.from({ length: this.channels }, () => new Float64Array(this.headFrames));
    this.tail = Array.from({ length: this.channels }, () => new Float64Array(this.tailFrames));
  }

  push(block: SampleBlock): void {
    if (this.finished) throw new Error('ToneAnalyzer: push() after finish().');
    const n = block.frames;
    const start = this.framesSeen;
    let offset = 0;
    if (this.headFill < this.headFrames) {
      const take = Math.min(n, this.headFrames - this.headFill);
      for (let c = 0; c < this.channels; c++) this.head[c].set(block.channels[c].subarray(0, take), this.headFill);
      this.headFill += take;
      offset = take;
      if (this.headFill === this.headFrames) this.analyseHead();
    }
    if (this.tracking && offset < n) this.follow(block, offset, n);
    // Tail ring: only what can still be among the last tailFrames frames of a take that is
    // at most TRUNCATION_MARGIN_SEC shorter than its header declares.
    const end = start + n;
    if (end > this.tailSkip) {
      const from = Math.max(0, this.tailSkip - start, n - this.tailFrames);
      for (let i = from; i < n; ) {
        const run = Math.min(n - i, this.tailFrames - this.tailPos);
        for (let c = 0; c < this.channels; c++) this.tail[c].set(block.channels[c].subarray(i, i + run), this.tailPos);
        this.tailPos = (this.tailPos + run) % this.tailFrames;
        i += run;
      }
    }
    this.framesSeen = end;
  }

  finish(): ToneResult | null {
    if (this.finished) throw new Error('ToneAnalyzer: finish() called twice.');
    this.finished = true;
    if (!this.headDone) this.analyseHead();
    if (this.tracking) {
      this.tracking = false;
      this.startTone!.endFrame = this.trackBlockStart + (this.trackCount > 0 && this.trackBlockPasses() ? this.trackCount : 0);
    }
    if (this.startTone) return this.report(this.startTone);
    const total = this.framesSeen;
    if (total === 0) return null;
    // End tone: from the head when the whole take fits in it, else from the unrolled tail ring.
    let buffers: Float64Array[];
    let length: number;
    let offsetFrame: number;
    if (total <= this.headFrames) {
      buffers = this.head;
      length = total;
      offsetFrame = 0;
    } else {
      // What the ring holds (less only for a take cut short by more than the margin).
      length = Math.min(total, this.tailFrames, total - this.tailSkip);
      if (length < this.chunk) return null;
      offsetFrame = total - length;
      buffers = this.tail.map((ring) => {
        const lin = new Float64Array(length);
        const first = (this.tailPos - length + this.tailFrames) % this.tailFrames;
        const firstRun = Math.min(length, this.tailFrames - first);
        lin.set(ring.subarray(first, first + firstRun), 0);
        if (firstRun < length) lin.set(ring.subarray(0, length - firstRun), firstRun);
        return lin;
      });
    }
    const endTone = this.findTone(buffers, length, offsetFrame, 'end');
    return endTone ? this.report(endTone) : null;
  }

  private analyseHead(): void {
    this.headDone = true;
    this.startTone = this.findTone(this.head, this.headFill, 0, 'start');
    if (this.startTone && this.startTone.open && this.headFill === this.headFrames) {
      this.tracking = true;
      this.trackBlockStart = this.headFrames;
      this.trackSumSq = 0;
      this.trackCount = 0;
    }
  }

  /** Extends an open start tone while 5 ms blocks keep fitting the measured sine. */
  private follow(block: SampleBlock, from: number, to: number): void {
    const tone = this.startTone!;
    const x = block.channels[tone.channel];
    const { a, b, c, omega } = tone.fit;
    const cosStep = Math.cos(omega);
    const sinStep = Math.sin(omega);
    const base = this.framesSeen;
    // The fitted sine's phase is advanced by rotation (two multiplies per sample instead of a cos
    // and a sin), and taken exactly from t again at every block so rounding cannot accumulate.
    let cosPhase = 0;
    let sinPhase = 0;
    let exactAt = -1;
    for (let i = from; i < to; i++) {
      if (exactAt !== this.trackBlockStart) {
        const t = base + i - tone.originFrame;
        cosPhase = Math.cos(omega * t);
        sinPhase = Math.sin(omega * t);
        exactAt = this.trackBlockStart;
      }
      const e = x[i] - (a * cosPhase + b * sinPhase + c);
      const nextCos = cosPhase * cosStep - sinPhase * sinStep;
      sinPhase = sinPhase * cosStep + cosPhase * sinStep;
      cosPhase = nextCos;
      this.trackSumSq += e * e;
      if (++this.trackCount === this.edgeBlock) {
        if (!this.trackBlockPasses()) {
          tone.endFrame = this.trackBlockStart;
          this.tracking = false;
          return;
        }
        this.trackBlockStart += this.edgeBlock;
        this.trackSumSq = 0;
        this.trackCount = 0;
      }
    }
  }

  private trackBlockPasses(): boolean {
    const limit = EDGE_RESIDUAL_RATIO * EDGE_RESIDUAL_RATIO * (this.startTone!.amplitude ** 2 / 2);
    return this.trackSumSq / this.trackCount <= limit;
  }

  private report(tone: Candidate): ToneResult {
    const f = (tone.fit.omega * this.fs) / (2 * Math.PI);
    const power = tone.amplitude ** 2 / 2;
    const floor = this.quantisation.kind === 'absolute' ? this.quantisation.meanSquare : this.quantisation.meanSquare * power;
    const containerLimitDb = 10 * Math.log10(power / floor);
    const limitedByContainer = tone.sinadDb > containerLimitDb;
    const sinad = limitedByContainer ? containerLimitDb : tone.sinadDb;
    return {
      startSec: roundTo(tone.startFrame / this.fs, 3),
      endSec: roundTo(tone.endFrame / this.fs, 3),
      frequencyHz: roundTo(f, 3),
      levelDbfs: roundTo(20 * Math.log10(tone.amplitude), 2),
      sinadDb: roundTo(sinad, 2),
      thdnDb: roundTo(-sinad, 2),
      // IEEE 1241 full-scale-referred ENOB, FS peak = 1.0.
      enobBits: roundTo((sinad - 1.76 + 20 * Math.log10(1 / tone.amplitude)) / 6.02, 2),
      likelyRecordedRate: likelyRecordedRate(f, this.fs),
      limitedByContainer,
      channel: tone.channel,
    };
  }

  /** Finds and measures a tone in each channel of a buffer; keeps the strongest. */
  private findTone(buffers: Float64Array[], length: number, offsetFrame: number, where: 'start' | 'end'): Candidate | null {
    let best: Candidate | null = null;
    for (let c = 0; c < this.channels; c++) {
      const cand = this.measureChannel(buffers[c], length, offsetFrame, where, c);
      if (cand && (!best || cand.amplitude > best.amplitude * 1.0001)) best = cand;
    }
    return best;
  }

  private measureChannel(x: Float64Array, length: number, offsetFrame: number, where: 'start' | 'end', channel: number): Candidate | null {
    const m = this.chunk;
    const chunks = Math.floor(length / m);
    if (chunks === 0) return null;
    // Chunk j counts from the start (start tones) or from the end (end tones).
    const chunkStart = (j: number) => (where === 'start' ? j * m : length - (j + 1) * m);
    const leadChunks = Math.floor(this.leadInFrames / m);
    const minChunks = Math.max(1, Math.floor(this.minToneFrames / m) - 1);
    let run: { first: number; last: number; bin: number } | null = null;
    let bestRun: { first: number; last: number; bin: number } | null = null;
    let runLevel = 0;
    for (let j = 0; j < chunks; j++) {
      const info = this.classifyChunk(x, chunkStart(j));
      const fits = info !== null && run !== null && Math.abs(info.bin - run.bin) <= 1 && Math.abs(info.levelDb - runLevel) <= RUN_LEVEL_TOLERANCE_DB;
      if (fits) {
        run!.last = j;
        continue;
      }
      if (run && run.last - run.first + 1 >= minChunks) {
        bestRun = run;
        break;
      }
      run = null;
      if (info !== null && j <= leadChunks) {
        run = { first: j, last: j, bin: info.bin };
        runLevel = info.levelDb;
      } else if (j > leadChunks) {
        break;
      }
    }
    if (!bestRun && run && run.last - run.first + 1 >= minChunks) bestRun = run;
    if (!bestRun) return null;

    // Span of the run in buffer samples, trimmed by 10 ms at each side.
    const trim = Math.round(0.01 * this.fs);
    let s0: number;
    let s1: number;
    if (where === 'start') {
      s0 = bestRun.first * m + trim;
      s1 = (bestRun.last + 1) * m - trim;
    } else {
      s0 = length - (bestRun.last + 1) * m + trim;
      s1 = length - bestRun.first * m - trim;
    }
    const maxFit = Math.round(MAX_FIT_SEC * this.fs);
    if (s1 - s0 > maxFit) {
      if (where === 'start') s1 = s0 + maxFit;
      else s0 = s1 - maxFit;
    }
    const omega0 = this.coarseFrequency(x, s0, s1 - s0);
    const fit = fitSine(x, s0, s1 - s0, omega0, this.fs);
    if (!fit) return null;
    const amplitude = Math.hypot(fit.a, fit.b);
    if (!(amplitude > 0) || 20 * Math.log10(amplitude) < MIN_TONE_DBFS) return null;
    const sinadDb = 10 * Math.log10((amplitude * amplitude) / 2 / Math.max(fit.residualMs, 1e-300));
    if (sinadDb < MIN_TONE_SINAD_DB) return null;

    // Edges: walk outwards in 5 ms blocks while the residual stays small.
    const limit = EDGE_RESIDUAL_RATIO * EDGE_RESIDUAL_RATIO * ((amplitude * amplitude) / 2);
    const blk = this.edgeBlock;
    const blockOk = (from: number): boolean => {
      let s = 0;
      for (let i = from; i < from + blk; i++) {
        const t = i - fit.origin;
        const e = x[i] - (fit.a * Math.cos(fit.omega * t) + fit.b * Math.sin(fit.omega * t) + fit.c);
        s += e * e;
      }
      return s / blk <= limit;
    };
    let lo = s0;
    while (lo - blk >= 0 && blockOk(lo - blk)) lo -= blk;
    if (lo > 0 && lo < blk && length >= blk && blockOk(0)) lo = 0;
    let hi = s1;
    while (hi + blk <= length && blockOk(hi)) hi += blk;
    if (hi < length && hi + blk > length && length >= blk && blockOk(length - blk)) hi = length;
    const open = where === 'start' && hi === length;
    if (hi - lo < this.minToneFrames) return null;
    return {
      channel,
      startFrame: offsetFrame + lo,
      endFrame: offsetFrame + hi,
      fit,
      originFrame: offsetFrame + fit.origin,
      amplitude,
      sinadDb,
      open,
    };
  }

  /** One chunk's dominant spectral peak, or null when the chunk is not a steady pure tone. */
  private classifyChunk(x: Float64Array, from: number): { bin: number; levelDb: number } | null {
    const m = this.chunk;
    let mean = 0;
    for (let i = 0; i < m; i++) mean += x[from + i];
    mean /= m;
    for (let i = 0; i < m; i++) this.fftIn[i] = (x[from + i] - mean) * this.hann[i];
    this.fft.realTransform(this.fftOut, this.fftIn);
    const half = m / 2;
    const lowBin = Math.max(2, Math.ceil((20 * m) / this.fs));
    const highBin = Math.floor((0.45 * this.fs * m) / this.fs);
    let total = 0;
    let peak = lowBin;
    let peakPower = -1;
    const power = (k: number) => this.fftOut[2 * k] ** 2 + this.fftOut[2 * k + 1] ** 2;
    for (let k = 1; k <= half; k++) {
      const p = power(k);
      total += p;
      if (k >= lowBin && k <= highBin && p > peakPower) {
        peakPower = p;
        peak = k;
      }
    }
    if (!(total > 0)) return null;
    let lobe = 0;
    for (let k = Math.max(1, peak - 4); k <= Math.min(half, peak + 4); k++) lobe += power(k);
    if (total - lobe > CHUNK_IMPURITY_MAX * total) return null;
    // Parseval: the lobe's one-sided power P holds the windowed sine's energy (A²/2)·Σw² = 2P/N, so A = √(4P/(N·Σw²)).
    const amplitude = Math.sqrt((4 * lobe) / (m * this.hannEnergy));
    const levelDb = 20 * Math.log10(amplitude);
    if (levelDb < MIN_TONE_DBFS) return null;
    return { bin: peak, levelDb };
  }

  /** Frequency from one long Hann FFT of the span, with a parabolic log-peak interpolation; rad/sample. */
  private coarseFrequency(x: Float64Array, from: number, length: number): number {
    const n = 2 ** Math.min(16, Math.floor(Math.log2(length)));
    const fft = n === this.chunk ? this.fft : new FFT(n);
    const input = new Float64Array(n);
    const w = n === this.chunk ? this.hann : hannWindow(n);
    for (let i = 0; i < n; i++) input[i] = x[from + i] * w[i];
    const out = new Float64Array(2 * n);
    fft.realTransform(out, input);
    let peak = 2;
    let peakPower = -1;
    const p = (k: number) => out[2 * k] ** 2 + out[2 * k + 1] ** 2;
    for (let k = 2; k < n / 2; k++) {
      const v = p(k);
      if (v > peakPower) {
        peakPower = v;
        peak = k;
      }
    }
    const a = Math.log(p(peak - 1) + 1e-300);
    const b = Math.log(p(peak) + 1e-300);
    const c = Math.log(p(peak + 1) + 1e-300);
    const denom = a - 2 * b + c;
    const delta = denom < 0 ? (0.5 * (a - c)) / denom : 0;
    return (2 * Math.PI * (peak + delta)) / n;
  }
}

/**
 * A 1000 Hz or 997 Hz tone recorded at rate R and declared at rate D plays at
 * f·D/R (the samples are the same; only the clock differs). Returns R when the
 * measured frequency matches that for a standard R ≠ D, else null.
 */
export function likelyRecordedRate(measuredHz: number, declaredRate: number): number | null {
  for (const f0 of STANDARD_TONES_HZ) if (Math.abs(measuredHz - f0) <= RATE_MATCH_TOLERANCE * f0) return null;
  for (const f0 of STANDARD_TONES_HZ) {
    for (const rate of STANDARD_RATES_HZ) {
      if (rate === declaredRate) continue;
      const shifted = (f0 * declaredRate) / rate;
      if (Math.abs(measuredHz - shifted) <= RATE_MATCH_TOLERANCE * shifted) return rate;
    }
  }
  return null;
}

