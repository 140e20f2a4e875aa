import { FORMAT_BITS_BASE_HZ, FORMAT_BITS_STEP_HZ, FORMAT_RATE_DIVISOR } from './checkSignal';
import { fftOfSize } from './fftCache';

/**
 * Reads the format section: the written sample rate from a tone at rate / 64 Hz and the written
 * bit depth from a tone at 4000 + 100 × bits Hz. A signal written at one rate and recorded at
 * another is then still measured against the right multitone grid.
 */

export interface WrittenFormat {
  sampleRate: number | null;
  bitsPerSample: number | null;
}

/** Rates a check signal is normally written at; a reading within 0.5 % snaps to one of them. */
const STANDARD_RATES_HZ = [32000, 44100, 48000, 88200, 96000, 176400, 192000];
const SNAP_TOLERANCE = 0.005;
/** A format tone must stand this far above the median of its search band, as a power ratio (30 dB). [common practice] */
const MIN_PEAK_TO_MEDIAN = 1000;

/**
 * @param x the format section (inner part) of one channel
 * @param ratio recorded frequency / written frequency (from the clock estimate)
 */
export function identifyWrittenFormat(x: Float64Array, sampleRate: number, ratio: number): WrittenFormat {
  const size = 2 ** Math.ceil(Math.log2(4 * x.length));
  const fft = fftOfSize(size);
  const input = new Float64Array(size);
  for (let n = 0; n < x.length; n++) input[n] = x[n] * (0.5 - 0.5 * Math.cos((2 * Math.PI * n) / x.length));
  const out = new Float64Array(2 * size);
  fft.realTransform(out, input);
  const power = (k: number) => out[2 * k] ** 2 + out[2 * k + 1] ** 2;
  const binHz = sampleRate / size;

  /** Strongest peak between lowHz and highHz (written), Hz written, or null when none stands out. */
  const peakHz = (lowHz: number, highHz: number): number | null => {
    const first = Math.ceil((lowHz * ratio) / binHz);
    const last = Math.min(size / 2 - 1, Math.floor((highHz * ratio) / binHz));
    if (last <= first + 2) return null;
    let best = first;
    const values: number[] = [];
    for (let k = first; k <= last; k++) {
      values.push(power(k));
      if (power(k) > power(best)) best = k;
    }
    values.sort((a, b) => a - b);
    if (power(best) < MIN_PEAK_TO_MEDIAN * values[values.length >> 1]) return null;
    // Parabola through the log powers of the peak bin and its neighbours (Gaussian interpolation).
    const [a, b, c] = [power(best - 1), power(best), power(best + 1)].map((v) => Math.log(v + 1e-300));
    const offset = a - 2 * b + c < 0 ? (0.5 * (a - c)) / (a - 2 * b + c) : 0;
    return ((best + offset) * binHz) / ratio;
  };

  const rateTone = peakHz(400, 3200);
  let writtenRate: number | null = null;
  if (rateTone !== null) {
    const reading = FORMAT_RATE_DIVISOR * rateTone;
    writtenRate = STANDARD_RATES_HZ.find((rate) => Math.abs(reading / rate - 1) <= SNAP_TOLERANCE) ?? Math.round(reading);
  }
  const bitsTone = peakHz(5000, 7600);
  const bits = bitsTone === null ? null : Math.round((bitsTone - FORMAT_BITS_BASE_HZ) / FORMAT_BITS_STEP_HZ);
  return { sampleRate: writtenRate, bitsPerSample: bits === 16 || bits === 24 || bits === 32 ? bits : null };
}
