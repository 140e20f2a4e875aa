import { seededRandom } from '../../tests/support/testSignals';
import { roomTone } from './material';
import { converterBand } from './tools';

/**
 * Faults planted into clean material, each of a stated size, the way they arise in a signal chain.
 * All work in place on float signals (full scale 1.0) and return what they were given.
 */

const dbToGain = (db: number) => 10 ** (db / 20);
const frame = (seconds: number, sampleRate: number) => Math.round(seconds * sampleRate);

/** Largest |sample| of a signal. */
export function peakOf(signal: Float64Array): number {
  let peak = 0;
  for (const x of signal) peak = Math.max(peak, Math.abs(x));
  return peak;
}

/**
 * An analogue stage that clipped before the converter, the level lowered afterwards: the take runs
 * through a stage that clips at a level that ends up at `flatTopDbfs`; outside `fromSec`..`toSec` its
 * peaks stay 4 dB under that level, inside (a louder passage) they are driven `overdriveDb` past it and
 * clipped. With `converterFilter` the clipped signal then passes a converter's anti-alias filter;
 * converter noise at `noiseDbfs` RMS is added on top.
 */
export function clipBeforeConverter(signal: Float64Array, sampleRate: number, fromSec: number, toSec: number, flatTopDbfs: number, overdriveDb: number, noiseDbfs: number, seed: number, converterFilter = false): Float64Array {
  const start = frame(fromSec, sampleRate), end = Math.min(signal.length, frame(toSec, sampleRate));
  const level = dbToGain(flatTopDbfs);
  const outsidePeak = Math.max(peakOf(signal.subarray(0, start)), peakOf(signal.subarray(end)));
  const outsideGain = (level * dbToGain(-4)) / outsidePeak;
  const drive = (level * dbToGain(overdriveDb)) / peakOf(signal.subarray(start, end));
  for (let i = 0; i < signal.length; i++) {
    signal[i] = i >= start && i < end ? Math.max(-level, Math.min(level, signal[i] * drive)) : signal[i] * outsideGain;
  }
  // An analogue clip reaches the file through the converter's anti-alias filter, which ripples the flat tops.
  if (converterFilter) signal.set(converterBand(signal, sampleRate));
  const random = seededRandom(seed);
  const noise = dbToGain(noiseDbfs) * Math.sqrt(3);
  for (let i = 0; i < signal.length; i++) signal[i] += noise * (random() - random());
  return signal;
}

/** A digital overload: from `fromSec` to `toSec` the signal is driven `overdriveDb` past full scale and clipped at the top codes. */
export function overload(signal: Float64Array, sampleRate: number, fromSec: number, toSec: number, overdriveDb: number): Float64Array {
  const start = frame(fromSec, sampleRate), end = Math.min(signal.length, frame(toSec, sampleRate));
  const drive = dbToGain(overdriveDb) / peakOf(signal.subarray(start, end));
  for (let i = start; i < end; i++) signal[i] = Math.max(-1, Math.min(1, signal[i] * drive));
  return signal;
}

/** Scales every channel so the loudest sample peak sits at `peakDbfs`. */
export function normalisePeak(channels: Float64Array[], peakDbfs: number): Float64Array[] {
  const gain = dbToGain(peakDbfs) / Math.max(...channels.map(peakOf));
  for (const channel of channels) for (let i = 0; i < channel.length; i++) channel[i] *= gain;
  return channels;
}

/** Digital silence on every channel for `seconds` from `atSec` (a recorder's buffer dropout). */
export function dropout(channels: Float64Array[], sampleRate: number, atSec: number, seconds: number): Float64Array[] {
  for (const channel of channels) channel.fill(0, frame(atSec, sampleRate), frame(atSec + seconds, sampleRate));
  return channels;
}

/** A steady DC offset of `fraction` of full scale, as a converter adds it. */
export function dcOffset(signal: Float64Array, fraction: number): Float64Array {
  for (let i = 0; i < signal.length; i++) signal[i] += fraction;
  return signal;
}

/** An open input: only a steady hiss at `levelDbfs` RMS (white, as a preamp's own noise is). */
export function openInputHiss(frames: number, levelDbfs: number, seed: number): Float64Array {
  const random = seededRandom(seed);
  const gain = dbToGain(levelDbfs) * Math.sqrt(6);
  return new Float64Array(frames).map(() => gain * (random() - random()));
}

/** Mains hum: `mainsHz` and its first harmonics, falling 6 dB each, the fundamental at `levelDbfs` peak. */
export function hum(signal: Float64Array, sampleRate: number, mainsHz: number, levelDbfs: number): Float64Array {
  for (let harmonic = 1; harmonic <= 5; harmonic++) {
    const amplitude = dbToGain(levelDbfs - 6 * (harmonic - 1));
    const step = (2 * Math.PI * mainsHz * harmonic) / sampleRate;
    for (let i = 0; i < signal.length; i++) signal[i] += amplitude * Math.sin(step * i + harmonic);
  }
  return signal;
}

/** Polarity inverted: every sample negated. */
export function invert(signal: Float64Array): Float64Array {
  for (let i = 0; i < signal.length; i++) signal[i] = -signal[i];
  return signal;
}

/** Rounds to `bits`-bit codes (a 16-bit recorder's output padded into a 24-bit file). */
export function quantise(signal: Float64Array, bits: number): Float64Array {
  const scale = 2 ** (bits - 1);
  for (let i = 0; i < signal.length; i++) signal[i] = Math.round(signal[i] * scale) / scale;
  return signal;
}

/** Replaces the samples at `atSec` (and the next `count - 1`) with `value` (NaN, ±Infinity). */
export function poison(signal: Float64Array, sampleRate: number, atSec: number, count: number, value: number): Float64Array {
  const start = frame(atSec, sampleRate);
  for (let i = start; i < Math.min(signal.length, start + count); i++) signal[i] = value;
  return signal;
}

/** A float stage gained `gainDb` from `fromSec` to `toSec`: samples beyond full scale, not clipped. */
export function floatOverFullScale(signal: Float64Array, sampleRate: number, fromSec: number, toSec: number, peakDbfs: number): Float64Array {
  const start = frame(fromSec, sampleRate), end = Math.min(signal.length, frame(toSec, sampleRate));
  const gain = dbToGain(peakDbfs) / peakOf(signal.subarray(start, end));
  for (let i = start; i < end; i++) signal[i] *= gain;
  return signal;
}

/** Room tone replacing programme: a whole channel of steady noise at `levelDbfs` (for noise-floor faults). */
export function noisyRoom(signal: Float64Array, sampleRate: number, levelDbfs: number, seed: number): Float64Array {
  const tone = roomTone(signal.length, sampleRate, levelDbfs, seed);
  for (let i = 0; i < signal.length; i++) signal[i] += tone[i];
  return signal;
}
