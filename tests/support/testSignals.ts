/** Deterministic test signals (full scale = 1.0). */

import { seededRandom } from '../../dsp/util/seededRandom';

export { seededRandom };

/** Peak amplitude of a level in dBFS. */
export const dbToAmplitude = (db: number) => 10 ** (db / 20);

/**
 * The one sine generator of the tests: amplitude·sin(2π·f·n/fs + phase) for `frames` samples
 * (the frequency may exceed Nyquist: it then folds).
 * @param frames length in samples; @param sampleRate Hz; @param frequencyHz Hz; @param amplitude peak, full scale 1.0; @param phaseRad start phase
 */
export function sineFrames(frames: number, sampleRate: number, frequencyHz: number, amplitude: number, phaseRad = 0): Float64Array {
  const out = new Float64Array(frames);
  const step = (2 * Math.PI * frequencyHz) / sampleRate;
  for (let n = 0; n < frames; n++) out[n] = amplitude * Math.sin(step * n + phaseRad);
  return out;
}

/** The same sine, `seconds` long. */
export function sine(frequencyHz: number, amplitude: number, seconds: number, sampleRate: number, phaseRad = 0): Float64Array {
  return sineFrames(Math.round(seconds * sampleRate), sampleRate, frequencyHz, amplitude, phaseRad);
}

/** Joins signals end to end. */
export function concat(...parts: Float64Array[]): Float64Array {
  const out = new Float64Array(parts.reduce((sum, part) => sum + part.length, 0));
  let offset = 0;
  for (const part of parts) {
    out.set(part, offset);
    offset += part.length;
  }
  return out;
}

/** Digital silence. */
export const silence = (seconds: number, sampleRate: number) => new Float64Array(Math.round(seconds * sampleRate));

/** Consecutive tone segments at 1 kHz (or `frequencyHz`), each [seconds, dBFS peak]; dBFS null = silence. Phase continues across segments. */
export function toneSegments(segments: [number, number | null][], sampleRate: number, frequencyHz = 1000): Float64Array {
  const total = segments.reduce((sum, [seconds]) => sum + Math.round(seconds * sampleRate), 0);
  const out = new Float64Array(total);
  const step = (2 * Math.PI * frequencyHz) / sampleRate;
  let n = 0;
  for (const [seconds, db] of segments) {
    const frames = Math.round(seconds * sampleRate);
    const amplitude = db === null ? 0 : dbToAmplitude(db);
    for (let i = 0; i < frames; i++, n++) out[n] = amplitude * Math.sin(step * n);
  }
  return out;
}

/** Linear fade in and out over `seconds` at both ends, in place. */
export function fadeEnds(signal: Float64Array, seconds: number, sampleRate: number): Float64Array {
  const frames = Math.min(Math.round(seconds * sampleRate), Math.floor(signal.length / 2));
  for (let i = 0; i < frames; i++) {
    const gain = i / frames;
    signal[i] *= gain;
    signal[signal.length - 1 - i] *= gain;
  }
  return signal;
}

/**
 * Programme-like material, generated block by block so long takes need no memory:
 * pink-ish noise (white noise through a one-pole low-pass and a gentle high-pass)
 * under a slowly varying loudness envelope (phrases and pauses), with partly
 * correlated channels. Deterministic for a seed.
 */
export class ProgrammeGenerator {
  private readonly random: () => number;
  private readonly sampleRate: number;
  private readonly channels: number;
  private readonly lowPassState: Float64Array;
  private readonly highPassState: Float64Array;
  private readonly highPassInput: Float64Array;
  private frame = 0;
  private envelopeTarget = 0.3;
  private envelope = 0.3;
  private nextEnvelopeChange = 0;

  constructor(sampleRate: number, channels: number, seed = 1) {
    this.random = seededRandom(seed);
    this.sampleRate = sampleRate;
    this.channels = channels;
    this.lowPassState = new Float64Array(channels);
    this.highPassState = new Float64Array(channels);
    this.highPassInput = new Float64Array(channels);
  }

  /** Fills `out[c][0..frames)` with the next frames. Peak stays below about -1 dBFS. */
  fill(out: Float64Array[], frames: number): void {
    const random = this.random;
    const lowPass = Math.exp((-2 * Math.PI * 3000) / this.sampleRate);
    const highPass = Math.exp((-2 * Math.PI * 60) / this.sampleRate);
    const envelopeSmoothing = 1 - Math.exp(-1 / (0.05 * this.sampleRate));
    for (let i = 0; i < frames; i++, this.frame++) {
      if (this.frame >= this.nextEnvelopeChange) {
        // A new phrase every 0.3-3 s: mostly speech-like levels, sometimes a pause.
        const pause = random() < 0.12;
        this.envelopeTarget = pause ? 0.003 : 0.05 + 0.3 * random();
        this.nextEnvelopeChange = this.frame + Math.round((0.3 + 2.7 * random()) * this.sampleRate);
      }
      this.envelope += (this.envelopeTarget - this.envelope) * envelopeSmoothing;
      const common = random() + random() + random() - 1.5;
      for (let c = 0; c < this.channels; c++) {
        const own = random() + random() + random() - 1.5;
        const white = 0.7 * common + 0.7 * own;
        this.lowPassState[c] = (1 - lowPass) * white + lowPass * this.lowPassState[c];
        const low = this.lowPassState[c];
        const high = highPass * (this.highPassState[c] + low - this.highPassInput[c]);
        this.highPassInput[c] = low;
        this.highPassState[c] = high;
        out[c][i] = Math.max(-0.89, Math.min(0.89, 1.2 * this.envelope * high));
      }
    }
  }
}
