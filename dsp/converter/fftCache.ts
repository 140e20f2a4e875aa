import FFT from 'fft.js';

/** One fft.js instance per size: building its twiddle tables costs as much as several transforms. */
const instances = new Map<number, FFT>();

/** The shared transform of a power-of-two size. */
export function fftOfSize(size: number): FFT {
  let fft = instances.get(size);
  if (!fft) {
    fft = new FFT(size);
    instances.set(size, fft);
  }
  return fft;
}
