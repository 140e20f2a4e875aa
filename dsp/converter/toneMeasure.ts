import { solveThree } from '../util/sineFit';
import type { BandPowerMeter } from './bandPower';

export interface ToneMeasure {
  /** Peak amplitude of the fitted sine, full scale 1.0. */
  amplitude: number;
  /** Mean square of everything but the sine and DC, over the whole band (IEEE 1241 NAD). */
  residualMs: number;
  /** Mean square of the residual inside the measurement band. */
  bandPower: number;
  /** The same, A-weighted (IEC 61672). */
  bandPowerA: number;
}

/**
 * A tone of known frequency: the IEEE 1241 three-parameter least-squares fit (the frequency comes
 * from the recorder's measured clock), and the power of its residual — noise and distortion, the
 * fundamental and DC removed without a notch filter — in the band [lowHz, highHz].
 * @param omega rad/sample
 */
export function measureTone(x: Float64Array, omega: number, meter: BandPowerMeter, lowHz: number, highHz: number): ToneMeasure | null {
  const origin = (x.length - 1) / 2;
  const fit = solveThree(x, 0, x.length, origin, omega);
  if (!fit) return null;
  const residual = new Float64Array(x.length);
  for (let n = 0; n < x.length; n++) {
    const t = n - origin;
    residual[n] = x[n] - (fit.a * Math.cos(omega * t) + fit.b * Math.sin(omega * t) + fit.c);
  }
  const spectrum = meter.spectrum(residual, 0, residual.length);
  return {
    amplitude: Math.hypot(fit.a, fit.b),
    residualMs: fit.residualMs,
    bandPower: meter.bandPower(spectrum, lowHz, highHz),
    bandPowerA: meter.bandPower(spectrum, lowHz, highHz, true),
  };
}
