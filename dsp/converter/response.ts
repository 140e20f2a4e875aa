import { fftOfSize } from './fftCache';
import type { MultitoneDesign } from './multitone';

/**
 * Frequency response from the recorded multitone: one FFT of the steady part under a flat-top
 * window (Heinzel, Rüdiger & Schilling, "Spectrum and spectral density estimation by the DFT",
 * 2002: HFT95, amplitude flat to 0.0044 dB within ±½ bin, side lobes −95 dB), each tone's level
 * read at the highest bin within ±3 bins of where the clock puts it, relative to the tone nearest 997 Hz.
 */

const HFT95 = [1, -1.9383379, 1.3045202, -0.402827, 0.0350665];
/** Bins searched either side of a tone's expected place (tones are at least 13 bins apart). */
const SEARCH_BINS = 3;

export interface FrequencyResponse {
  /** Nominal tone frequencies, Hz. */
  hz: number[];
  /** Level relative to the reference tone, dB. */
  db: number[];
}

/**
 * @param x steady part of the recorded multitone (at least 2^16 samples are used when present)
 * @param ratio recorded frequency / written frequency
 * @param maxHz highest tone read (tones above the recorder's Nyquist are not)
 */
export function measureResponse(x: Float64Array, sampleRate: number, design: MultitoneDesign, ratio: number, maxHz: number): FrequencyResponse {
  const size = 2 ** Math.floor(Math.log2(x.length));
  const input = new Float64Array(size);
  for (let n = 0; n < size; n++) {
    const z = (2 * Math.PI * n) / size;
    let w = 0;
    for (let k = 0; k < HFT95.length; k++) w += HFT95[k] * Math.cos(k * z);
    input[n] = x[n] * w;
  }
  const out = new Float64Array(2 * size);
  fftOfSize(size).realTransform(out, input);
  const magnitude = (hz: number) => {
    const centre = Math.round((hz * ratio * size) / sampleRate);
    let best = 0;
    for (let k = Math.max(1, centre - SEARCH_BINS); k <= Math.min(size / 2 - 1, centre + SEARCH_BINS); k++) {
      best = Math.max(best, Math.sqrt(out[2 * k] ** 2 + out[2 * k + 1] ** 2));
    }
    return best;
  };
  const reference = magnitude(design.frequenciesHz[design.referenceIndex]);
  const hz: number[] = [];
  const db: number[] = [];
  for (const frequency of design.frequenciesHz) {
    if (frequency * ratio > maxHz) break;
    hz.push(frequency);
    db.push(reference > 0 ? 20 * Math.log10(Math.max(magnitude(frequency), 1e-30) / reference) : Number.NEGATIVE_INFINITY);
  }
  return { hz, db };
}

/** Largest |level| of the response between lowHz and highHz, dB. */
export function passbandDeviation(response: FrequencyResponse, lowHz: number, highHz: number): number | null {
  let worst: number | null = null;
  response.hz.forEach((hz, i) => {
    if (hz >= lowHz && hz <= highHz) worst = Math.max(worst ?? 0, Math.abs(response.db[i]));
  });
  return worst;
}

/**
 * Upper −3 dB point: the first tone above `referenceHz` below −3 dB, placed by straight-line
 * interpolation in (log frequency, dB) from the tone before it. Null when the response never falls
 * that far.
 */
export function upperBandEdge(response: FrequencyResponse, referenceHz: number): number | null {
  const { hz, db } = response;
  for (let i = 1; i < hz.length; i++) {
    if (hz[i] <= referenceHz || db[i] >= -3) continue;
    const fraction = (db[i - 1] + 3) / (db[i - 1] - db[i]);
    return Math.exp(Math.log(hz[i - 1]) + fraction * (Math.log(hz[i]) - Math.log(hz[i - 1])));
  }
  return null;
}
