/**
 * A-weighting of IEC 61672-1: the analogue response evaluated at each frequency (no bilinear
 * transform, so nothing is warped near Nyquist).
 * R_A(f) = 12194²·f⁴ / ((f² + 20.6²)·√((f² + 107.7²)(f² + 737.9²))·(f² + 12194²)),
 * A(f) = 20·log10 R_A(f) + 2.00 dB (0 dB at 1 kHz).
 */

const F1 = 20.6;
const F2 = 107.7;
const F3 = 737.9;
const F4 = 12194;
const NORMALISATION_DB = 2.0;

/** A-weighting gain at a frequency, dB (−∞ at 0 Hz). */
export function aWeightingDb(hz: number): number {
  const f2 = hz * hz;
  const response = (F4 * F4 * f2 * f2) / ((f2 + F1 * F1) * Math.sqrt((f2 + F2 * F2) * (f2 + F3 * F3)) * (f2 + F4 * F4));
  return 20 * Math.log10(response) + NORMALISATION_DB;
}

/** A-weighting as a power ratio (|A(f)|²). */
export function aWeightingPower(hz: number): number {
  return hz > 0 ? 10 ** (aWeightingDb(hz) / 10) : 0;
}
