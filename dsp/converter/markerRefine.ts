import { fftOfSize } from './fftCache';
import { markerTemplate, type MarkerSweep } from './markers';

export interface RefinedMarker {
  /** Marker start in the captured span, fractional frames (parabolic peak of the correlation magnitude). */
  position: number;
  /** Normalised correlation, 0–1. */
  match: number;
  /** Real part of the complex correlation at the peak over its magnitude: near +1 same polarity, near −1 inverted. */
  polarity: number;
}

/** Spectra of the complex templates, by rate, sweep and transform size (every channel reuses them). */
const templateSpectra = new Map<string, Float64Array>();

function templateSpectrumOf(sampleRate: number, sweep: MarkerSweep, size: number): Float64Array {
  const key = `${sampleRate}:${sweep}:${size}`;
  let spectrum = templateSpectra.get(key);
  if (!spectrum) {
    const { re, im } = markerTemplate(sampleRate, sweep);
    const template = new Float64Array(2 * size);
    for (let k = 0; k < re.length; k++) {
      template[2 * k] = re[k];
      template[2 * k + 1] = im[k];
    }
    spectrum = new Float64Array(2 * size);
    fftOfSize(size).transform(spectrum, template);
    templateSpectra.set(key, spectrum);
  }
  return spectrum;
}

/**
 * Places one marker precisely in one channel: the complex correlation with the template
 * w·e^{iφ} (conjugated) at every whole-sample lag within `radius` of `around`, computed with one
 * FFT, its magnitude's peak refined by a parabola through the three highest lags.
 */
export function refineMarker(x: Float32Array, around: number, radius: number, sampleRate: number, sweep: MarkerSweep): RefinedMarker {
  const { re } = markerTemplate(sampleRate, sweep);
  const length = re.length;
  const first = Math.max(0, Math.round(around) - radius);
  const lags = Math.min(x.length - length, Math.round(around) + radius) - first + 1;
  if (lags < 1) return { position: around, match: 0, polarity: 0 };
  const size = 2 ** Math.ceil(Math.log2(lags + 2 * length));
  const fft = fftOfSize(size);
  const signal = new Float64Array(2 * size);
  for (let n = 0; n < lags - 1 + length; n++) signal[2 * n] = x[first + n];
  const signalSpectrum = new Float64Array(2 * size);
  fft.transform(signalSpectrum, signal);
  const templateSpectrum = templateSpectrumOf(sampleRate, sweep, size);
  // Circular correlation Σk x[m + k]·conj(t[k]) = IFFT(X · conj(T)); lags 0..lags−1 do not wrap.
  for (let k = 0; k < size; k++) {
    const xr = signalSpectrum[2 * k];
    const xi = signalSpectrum[2 * k + 1];
    const tr = templateSpectrum[2 * k];
    const ti = templateSpectrum[2 * k + 1];
    signal[2 * k] = xr * tr + xi * ti;
    signal[2 * k + 1] = xi * tr - xr * ti;
  }
  const correlation = new Float64Array(2 * size);
  fft.inverseTransform(correlation, signal);
  const magnitude = (m: number) => Math.sqrt(correlation[2 * m] ** 2 + correlation[2 * m + 1] ** 2);
  let peak = 0;
  for (let m = 1; m < lags; m++) if (magnitude(m) > magnitude(peak)) peak = m;
  let offset = 0;
  if (peak > 0 && peak < lags - 1) {
    const [a, b, c] = [magnitude(peak - 1), magnitude(peak), magnitude(peak + 1)];
    const curvature = a - 2 * b + c;
    if (curvature < 0) offset = (0.5 * (a - c)) / curvature;
  }
  let templateEnergy = 0;
  let windowEnergy = 0;
  for (let k = 0; k < length; k++) {
    templateEnergy += re[k] * re[k];
    windowEnergy += x[first + peak + k] ** 2;
  }
  const norm = Math.sqrt(templateEnergy * windowEnergy);
  const peakMagnitude = magnitude(peak);
  return {
    position: first + peak + offset,
    match: norm > 0 ? peakMagnitude / norm : 0,
    polarity: peakMagnitude > 0 ? correlation[2 * peak] / peakMagnitude : 0,
  };
}
