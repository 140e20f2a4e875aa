/**
 * A simulated converter for the converter-check tests: the check signal as Takeproof writes it
 * goes through a clock error (sox `speed`, an outside resampler), crosstalk, a second-order
 * nonlinearity, gain and polarity, a Butterworth low-pass, a whole-sample delay per channel and
 * white Gaussian noise, with seconds of noise before and after, and is quantised to the
 * recording's bit depth. `plantedValues` computes what the analysis should find from the planted
 * parameters alone (textbook formulas, never from the analysis).
 */
import { execFileSync } from 'node:child_process';
import { readFileSync, writeFileSync } from 'node:fs';
import { gaussian } from './spectralSignals';
import { seededRandom } from './testSignals';
import { decodeWav } from './wavStreams';
import { encodeSamples, wavFile, type SampleCoding } from './wavWriter';

export interface SimulatedConverter {
  /** Recording bit depth. */
  bits: 16 | 24;
  /** Gain of each channel at 997 Hz before the filter, dB. */
  gainsDb: number[];
  inverted: boolean[];
  /** Butterworth low-pass (bilinear transform, cut-off pre-warped: −3.01 dB exactly at cutoffHz). */
  lowPass: { cutoffHz: number; order: 2 | 4 | 6 | 8 };
  /** White noise added at the output, RMS over the whole band, dB FS re a full-scale sine (AES17). */
  noiseDbfs: number;
  /** y = x + a2·x² before the gain (a second harmonic of a2·A/2 relative to a tone of peak A). */
  secondOrder: number;
  /** Leakage of one channel's input into another's, dB. */
  crosstalk: { from: number; into: number; db: number }[];
  /** Whole-sample delay of each channel (≥ 0). */
  delaySamples: number[];
  /** Recorder clock error, ppm (positive: the recording reads higher, as with sox `speed 1 + ppm·1e-6`). */
  clockPpm: number;
  /** Seconds of converter noise before and after the check signal. */
  leadSec: number;
  tailSec: number;
  seed: number;
}

/** One second-order section b0..b2, a1, a2 (a0 = 1). */
type Section = [number, number, number, number, number];

/**
 * Butterworth low-pass as second-order sections, bilinear transform with the cut-off pre-warped
 * (K = tan(π·fc/fs); section k has Q = 1/(2·sin((2k − 1)π/(2n))); textbook form, e.g. the
 * RBJ audio-EQ cookbook low-pass).
 */
export function butterworthSections(cutoffHz: number, order: number, sampleRate: number): Section[] {
  const k = Math.tan((Math.PI * cutoffHz) / sampleRate);
  return Array.from({ length: order / 2 }, (_, i) => {
    const q = 1 / (2 * Math.sin(((2 * i + 1) * Math.PI) / (2 * order)));
    const norm = 1 / (1 + k / q + k * k);
    const b0 = k * k * norm;
    return [b0, 2 * b0, b0, 2 * (k * k - 1) * norm, (1 - k / q + k * k) * norm] as Section;
  });
}

/** |H(e^{jω})| of a cascade at a frequency. */
export function sectionsMagnitude(sections: Section[], hz: number, sampleRate: number): number {
  const w = (2 * Math.PI * hz) / sampleRate;
  let magnitude = 1;
  for (const [b0, b1, b2, a1, a2] of sections) {
    const numRe = b0 + b1 * Math.cos(w) + b2 * Math.cos(2 * w);
    const numIm = -b1 * Math.sin(w) - b2 * Math.sin(2 * w);
    const denRe = 1 + a1 * Math.cos(w) + a2 * Math.cos(2 * w);
    const denIm = -a1 * Math.sin(w) - a2 * Math.sin(2 * w);
    magnitude *= Math.hypot(numRe, numIm) / Math.hypot(denRe, denIm);
  }
  return magnitude;
}

function filterInPlace(x: Float64Array, sections: Section[]): void {
  for (const section of sections) filterSection(x, section[0], section[1], section[2], section[3], section[4]);
}

/** One biquad in direct form II transposed. */
function filterSection(x: Float64Array, b0: number, b1: number, b2: number, a1: number, a2: number): void {
  let s1 = 0;
  let s2 = 0;
  const length = x.length;
  for (let n = 0; n < length; n++) {
    const input = x[n];
    const output = b0 * input + s1;
    s1 = b1 * input - a1 * output + s2;
    s2 = b2 * input - a2 * output;
    // A decaying state would sink into subnormal numbers, which are very slow to compute with.
    if (Math.abs(s1) < 1e-200) s1 = 0;
    if (Math.abs(s2) < 1e-200) s2 = 0;
    x[n] = output;
  }
}

/** Reads a WAV file into float channels. */
export async function readWav(path: string) {
  return decodeWav(readFileSync(path), 1 << 20);
}

/**
 * Passes the check signal at `signalPath` through the simulated converter and writes the
 * recording to `outPath` (same sample rate, `converter.bits` PCM).
 */
export async function simulateRecording(signalPath: string, workPath: (name: string) => string, converter: SimulatedConverter, outPath: string): Promise<void> {
  const speedPath = workPath(`speed-${converter.seed}.wav`);
  // sox `speed`: pitch and tempo together, resampled back to the file's rate (float output: no dither).
  execFileSync('sox', [signalPath, '-e', 'floating-point', '-b', '32', speedPath, 'speed', String(1 + converter.clockPpm * 1e-6)]);
  const { format, channels: played } = await readWav(speedPath);
  const rate = format.sampleRate;
  const lead = Math.round(converter.leadSec * rate);
  const frames = lead + played[0].length + Math.round(converter.tailSec * rate);
  const inputs = played.map((x) => {
    const padded = new Float64Array(frames);
    padded.set(x, lead);
    return padded;
  });
  const mixed = inputs.map((x) => Float64Array.from(x));
  for (const path of converter.crosstalk) {
    const k = 10 ** (path.db / 20);
    const from = inputs[path.from];
    const into = mixed[path.into];
    for (let n = 0; n < frames; n++) into[n] += k * from[n];
  }
  const sections = butterworthSections(converter.lowPass.cutoffHz, converter.lowPass.order, rate);
  const noise = gaussian(seededRandom(converter.seed));
  const sigma = 10 ** (converter.noiseDbfs / 20) * Math.SQRT1_2;
  const recorded = mixed.map((x, c) => {
    const gain = 10 ** (converter.gainsDb[c] / 20) * (converter.inverted[c] ? -1 : 1);
    for (let n = 0; n < frames; n++) x[n] = gain * (x[n] + converter.secondOrder * x[n] * x[n]);
    filterInPlace(x, sections);
    const delayed = new Float64Array(frames);
    delayed.set(x.subarray(0, frames - converter.delaySamples[c]), converter.delaySamples[c]);
    for (let n = 0; n < frames; n++) delayed[n] += sigma * noise();
    return delayed;
  });
  const coding: SampleCoding = converter.bits === 16 ? 'pcm16' : 'pcm24';
  writeFileSync(outPath, wavFile({ sampleRate: rate, channels: recorded.length, coding }, encodeSamples(recorded, coding)));
}

export interface PlantedValues {
  clockErrorPpm: number;
  gainDb: number[];
  polarityInverted: boolean[];
  bandEdgeHz: number;
  noiseFloorDbfs: number;
  noiseFloorDbfsA: number;
  dynamicRangeDb: number[];
  thdnMinus1Db: number[];
  thdnMinus20Db: number[];
  enobBits: number[];
  crosstalkDb: number;
  delaySamples: number[];
}

/** IEC 61672-1 A-weighting, dB (analogue formula, normalised with +2.00 dB). */
function aWeightingDb(f: number): number {
  const f2 = f * f;
  const ra = (12194 ** 2 * f2 * f2) / ((f2 + 20.6 ** 2) * Math.sqrt((f2 + 107.7 ** 2) * (f2 + 737.9 ** 2)) * (f2 + 12194 ** 2));
  return 20 * Math.log10(ra) + 2;
}

/** ∫ g(f) df over [low, high] by the midpoint rule on 1 Hz steps. */
function integrate(g: (hz: number) => number, low: number, high: number): number {
  let sum = 0;
  for (let f = low + 0.5; f < high; f += 1) sum += g(f);
  return sum;
}

/**
 * The values the analysis should report for a simulated converter, from its parameters:
 * noise powers are σ² (planted), Q²/12 (rounding of the recording, Q = 2^(1−bits)) and Q²/4 of
 * the check signal's own TPDF-dithered quantisation (Lipshitz et al. 1992) through the gain and
 * filter, each spread evenly over 0–fs/2 and integrated over the AES17 band 20 Hz–20 kHz; the
 * second harmonic of y = x + a2·x² on a tone of peak U is a2·U²/2; levels re a full-scale sine
 * (mean square 0.5); ENOB = (SINAD − 1.76)/6.02 (IEEE 1241).
 */
export function plantedValues(converter: SimulatedConverter, sampleRate: number, signalBits: number): PlantedValues {
  const nyquist = sampleRate / 2;
  const sections = butterworthSections(converter.lowPass.cutoffHz, converter.lowPass.order, sampleRate);
  const response = (hz: number) => sectionsMagnitude(sections, hz, sampleRate);
  const bandHigh = Math.min(20_000, nyquist);
  const channels = converter.gainsDb.length;
  const leak = (into: number) => converter.crosstalk.filter((path) => path.into === into).reduce((sum, path) => sum + 10 ** (path.db / 20), 0);
  // The common sections carry the same signal on every channel: leakage adds in phase.
  const gain = (c: number) => 10 ** (converter.gainsDb[c] / 20) * (1 + leak(c));
  const sigma2 = 10 ** (converter.noiseDbfs / 10) * 0.5;
  const recordingQuantisation = 2 ** (2 - 2 * converter.bits) / 12;
  const signalDither = 2 ** (2 - 2 * signalBits) / 4;
  const outputNoiseDensity = (sigma2 + recordingQuantisation) / nyquist;
  const inBand = (c: number, weight: (hz: number) => number) =>
    outputNoiseDensity * integrate(weight, 20, bandHigh) + (signalDither / nyquist) * gain(c) ** 2 * integrate((f) => weight(f) * response(f) ** 2, 20, bandHigh);
  const fullBand = (c: number) => sigma2 + recordingQuantisation + (signalDither / nyquist) * gain(c) ** 2 * integrate((f) => response(f) ** 2, 0, nyquist);
  const unweighted = () => 1;
  const aWeighted = (f: number) => 10 ** (aWeightingDb(f) / 10);

  const tone = (c: number, levelDbfs: number, band: boolean) => {
    const u = 10 ** (levelDbfs / 20) * (1 + leak(c));
    const g = 10 ** (converter.gainsDb[c] / 20);
    const fundamental = (g * u * response(997)) ** 2 / 2;
    const harmonic = (g * converter.secondOrder * (u * u) / 2 * response(1994)) ** 2 / 2;
    return { fundamental, nad: harmonic + (band ? inBand(c, unweighted) : fullBand(c)) };
  };
  const reference = response(997);
  let low = 997;
  let high = nyquist;
  for (let i = 0; i < 200; i++) {
    const mid = (low + high) / 2;
    if (20 * Math.log10(response(mid) / reference) > -3) low = mid;
    else high = mid;
  }
  const crosstalk = converter.crosstalk.map((path) => path.db + converter.gainsDb[path.into] - converter.gainsDb[path.from]);
  const db = (ratio: number) => 10 * Math.log10(ratio);
  return {
    clockErrorPpm: converter.clockPpm,
    gainDb: converter.gainsDb.map((_, c) => 20 * Math.log10(gain(c) * response(997))),
    polarityInverted: converter.inverted,
    bandEdgeHz: low,
    noiseFloorDbfs: db((sigma2 + recordingQuantisation) / nyquist * (bandHigh - 20) / 0.5),
    noiseFloorDbfsA: db((outputNoiseDensity * integrate(aWeighted, 20, bandHigh)) / 0.5),
    dynamicRangeDb: Array.from({ length: channels }, (_, c) => db(0.5 / inBand(c, unweighted))),
    thdnMinus1Db: Array.from({ length: channels }, (_, c) => {
      const t = tone(c, -1, true);
      return db(t.nad / t.fundamental);
    }),
    thdnMinus20Db: Array.from({ length: channels }, (_, c) => {
      const t = tone(c, -20, true);
      return db(t.nad / t.fundamental);
    }),
    enobBits: Array.from({ length: channels }, (_, c) => (db(0.5 / tone(c, -1, false).nad) - 1.76) / 6.02),
    crosstalkDb: crosstalk.length ? Math.max(...crosstalk) : Number.NaN,
    delaySamples: converter.delaySamples.map((d) => d - converter.delaySamples[0]),
  };
}
