// A simulated recorder for the demo's converter checks: the check signal as Takeproof writes it goes
// through a little crosstalk, a small second-order nonlinearity, a gain per channel, a low-pass filter
// and white noise, with seconds of noise around it, and is quantised to 24 bits. Each demo check is
// then measured by the real engine, so every figure the demo shows comes from an analysis.
import wavefile from 'wavefile';
import { checkSignalWav } from '@/dsp/converter/signalWriter';
import { seededRandom } from '../../dsp/util/seededRandom';

export interface DemoConverter {
  gainsDb: [number, number];
  /** White noise at the output, RMS over the whole band, dB FS re a full-scale sine. */
  noiseDbfs: number;
  /** y = x + a2·x². */
  secondOrder: number;
  /** Eighth-order Butterworth low-pass, −3 dB at this frequency. */
  lowPassHz: number;
  /** Leakage of each channel into the other, dB. */
  crosstalkDb: number;
  seed: number;
}

export const DEMO_SIGNAL_FORMAT = { sampleRate: 48_000, bitsPerSample: 24 as const, channels: 2 };
const LEAD_SEC = 2;
const FULL_SCALE_24 = 2 ** 23;

/** Standard normal numbers by the Box–Muller transform. */
function gaussian(random: () => number): () => number {
  return () => Math.sqrt(-2 * Math.log(1 - random())) * Math.cos(2 * Math.PI * random());
}

type Section = { b0: number; b1: number; b2: number; a1: number; a2: number };

/**
 * Butterworth low-pass as second-order sections: bilinear transform with the cut-off pre-warped
 * (K = tan(π·fc/fs); section k has Q = 1/(2·sin((2k − 1)π/(2n))), a textbook design), so the
 * response is 3 dB down at the cut-off exactly.
 */
function butterworth(hz: number, order: number, rate: number): Section[] {
  const k = Math.tan((Math.PI * hz) / rate);
  return Array.from({ length: order / 2 }, (_, i) => {
    const q = 1 / (2 * Math.sin(((2 * i + 1) * Math.PI) / (2 * order)));
    const norm = 1 / (1 + k / q + k * k);
    const b0 = k * k * norm;
    return { b0, b1: 2 * b0, b2: b0, a1: 2 * (k * k - 1) * norm, a2: (1 - k / q + k * k) * norm };
  });
}

/** One section in direct form II transposed, in place. */
function filter(x: Float64Array, c: Section): void {
  let s1 = 0;
  let s2 = 0;
  for (let n = 0; n < x.length; n++) {
    const y = c.b0 * x[n] + s1;
    s1 = c.b1 * x[n] - c.a1 * y + s2;
    s2 = c.b2 * x[n] - c.a2 * y;
    // A decaying state would sink into subnormal numbers, which are very slow to compute with.
    if (Math.abs(s1) < 1e-200) s1 = 0;
    if (Math.abs(s2) < 1e-200) s2 = 0;
    x[n] = y;
  }
}

/** The check signal recorded through `converter`: a 48 kHz, 24-bit stereo WAV file's bytes. */
export function recordThrough(converter: DemoConverter): Buffer {
  const { sampleRate: rate } = DEMO_SIGNAL_FORMAT;
  const source = new wavefile.WaveFile(checkSignalWav(DEMO_SIGNAL_FORMAT));
  const played = source.getSamples(false, Float64Array) as unknown as Float64Array[];
  const lead = LEAD_SEC * rate;
  const frames = played[0].length + 2 * lead;
  const inputs = played.map((x) => {
    const padded = new Float64Array(frames);
    for (let n = 0; n < x.length; n++) padded[lead + n] = x[n] / FULL_SCALE_24;
    return padded;
  });
  const leak = 10 ** (converter.crosstalkDb / 20);
  const noise = gaussian(seededRandom(converter.seed));
  const sigma = 10 ** (converter.noiseDbfs / 20) * Math.SQRT1_2;
  const sections = butterworth(converter.lowPassHz, 8, rate);
  const recorded = inputs.map((x, c) => {
    const other = inputs[1 - c];
    const gain = 10 ** (converter.gainsDb[c] / 20);
    const y = new Float64Array(frames);
    for (let n = 0; n < frames; n++) {
      const v = x[n] + leak * other[n];
      y[n] = gain * (v + converter.secondOrder * v * v);
    }
    for (const section of sections) filter(y, section);
    const codes = new Int32Array(frames);
    for (let n = 0; n < frames; n++) codes[n] = Math.max(-FULL_SCALE_24, Math.min(FULL_SCALE_24 - 1, Math.round((y[n] + sigma * noise()) * FULL_SCALE_24)));
    return codes;
  });
  const out = new wavefile.WaveFile();
  out.fromScratch(recorded.length, rate, '24', recorded as unknown as number[][]);
  return Buffer.from(out.toBuffer());
}
