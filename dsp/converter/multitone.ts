import { fftOfSize } from './fftCache';

/**
 * The frequency-response stimulus: a periodic multitone (a sum of steady sines that all
 * repeat every `periodFrames` samples, so one period is built by an inverse FFT and tiled).
 * Tones are 1/12 octave apart below 2 kHz (at least 5 Hz apart) and 1/48 octave apart from
 * 2 kHz up to 0.495 × the sample rate, so the upper −3 dB point is bracketed by tones less than
 * 1.5 % apart. A tone on the bin nearest 997 Hz is the reference the response is read against.
 */

export interface MultitoneDesign {
  sampleRate: number;
  /** Samples per period (power of two, at least one second). */
  periodFrames: number;
  /** FFT bin of each tone in one period, ascending. */
  bins: number[];
  /** Nominal frequency of each tone, Hz (bin × rate / period). */
  frequenciesHz: number[];
  /** Index (into `bins`) of the reference tone nearest 997 Hz. */
  referenceIndex: number;
}

/** Lowest tone, Hz (bottom of the AES17 audio band). */
const LOWEST_HZ = 20;
/** Highest tone as a fraction of the sample rate (just under Nyquist, above any usable band edge). */
export const HIGHEST_TONE_FRACTION = 0.495;
/** Tone spacing below SPLIT_HZ: 1/12 octave; above it: 1/48 octave. [common practice: fractional-octave grids] */
const LOW_STEP = 2 ** (1 / 12);
const HIGH_STEP = 2 ** (1 / 48);
const SPLIT_HZ = 2000;
/** Smallest spacing between tones, Hz, so each is resolved in a few seconds of analysis. */
const MIN_SPACING_HZ = 5;
/** Reference tone, Hz (AES17 test frequency). */
const REFERENCE_HZ = 997;
/** Peak of the multitone, dB FS (a full-scale sine peaks at 0 dB FS). */
const MULTITONE_PEAK_DBFS = -3;

/** The tone grid for a sample rate. Deterministic: the generator and the analysis derive the same design. */
export function designMultitone(sampleRate: number): MultitoneDesign {
  const periodFrames = 2 ** Math.ceil(Math.log2(sampleRate));
  const binHz = sampleRate / periodFrames;
  const top = HIGHEST_TONE_FRACTION * sampleRate;
  const bins = new Set<number>();
  for (let f = LOWEST_HZ; f <= top; f = Math.max(f * (f < SPLIT_HZ ? LOW_STEP : HIGH_STEP), f + MIN_SPACING_HZ)) {
    bins.add(Math.round(f / binHz));
  }
  const referenceBin = Math.round(REFERENCE_HZ / binHz);
  bins.add(referenceBin);
  const sorted = [...bins].sort((a, b) => a - b);
  return {
    sampleRate,
    periodFrames,
    bins: sorted,
    frequenciesHz: sorted.map((bin) => bin * binHz),
    referenceIndex: sorted.indexOf(referenceBin),
  };
}

/**
 * One period of the multitone, peak-normalised to MULTITONE_PEAK_DBFS, equal tone amplitudes.
 * Phases follow Schroeder's low-crest-factor rule (IEEE Trans. Inf. Theory 16, 1970) written for
 * an uneven grid: tone k's group delay sits at k/K of the period, so the phase is the integral
 * φk = φk−1 − 2π·(fk − fk−1)·τk (f in cycles per sample, τ in samples). About 13 dB crest factor.
 */
export function multitonePeriod(design: MultitoneDesign): Float64Array {
  const { periodFrames, bins } = design;
  const fft = fftOfSize(periodFrames);
  const spectrum = new Float64Array(2 * periodFrames);
  const count = bins.length;
  let phase = 0;
  bins.forEach((bin, k) => {
    if (k > 0) phase -= (2 * Math.PI * (bin - bins[k - 1]) * k) / count;
    // A real signal: the bin and its mirror carry conjugate halves.
    spectrum[2 * bin] = Math.cos(phase);
    spectrum[2 * bin + 1] = Math.sin(phase);
    spectrum[2 * (periodFrames - bin)] = Math.cos(phase);
    spectrum[2 * (periodFrames - bin) + 1] = -Math.sin(phase);
  });
  const complex = new Float64Array(2 * periodFrames);
  fft.inverseTransform(complex, spectrum);
  const period = new Float64Array(periodFrames);
  let peak = 0;
  for (let n = 0; n < periodFrames; n++) {
    period[n] = complex[2 * n];
    peak = Math.max(peak, Math.abs(period[n]));
  }
  const scale = 10 ** (MULTITONE_PEAK_DBFS / 20) / peak;
  for (let n = 0; n < periodFrames; n++) period[n] *= scale;
  return period;
}
