/**
 * Delay of one channel against another from a stretch where both carry the same signal: the
 * cross-correlation Σ a[n]·b[n + lag] at whole-sample lags near `around`, its magnitude's peak
 * (either polarity) refined by a parabola. Positive when `b` is later than `a`.
 */
export function channelDelay(a: Float32Array, b: Float32Array, from: number, length: number, around: number, radius = 3): number {
  const centre = Math.round(around);
  const lags: number[] = [];
  const values: number[] = [];
  for (let lag = centre - radius; lag <= centre + radius; lag++) {
    const first = Math.max(from, -lag);
    const last = Math.min(from + length, a.length, b.length - lag);
    let sum = 0;
    for (let n = first; n < last; n++) sum += a[n] * b[n + lag];
    lags.push(lag);
    values.push(Math.abs(sum));
  }
  let peak = 0;
  for (let i = 1; i < values.length; i++) if (values[i] > values[peak]) peak = i;
  if (peak === 0 || peak === values.length - 1) return lags[peak];
  const [p, q, r] = [values[peak - 1], values[peak], values[peak + 1]];
  const curvature = p - 2 * q + r;
  return lags[peak] + (curvature < 0 ? (0.5 * (p - r)) / curvature : 0);
}
