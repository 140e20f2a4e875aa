/**
 * Least-squares sine fitting (IEEE 1057 / IEEE 1241 §4.1.4): the three-parameter fit at a known
 * frequency and the four-parameter fit that also refines the frequency. Used for line-up tones
 * and converter checks; the residual is the noise and distortion (NAD).
 */

export interface SineFit {
  /** Cosine amplitude. */
  a: number;
  /** Sine amplitude. */
  b: number;
  /** DC term. */
  c: number;
  /** rad/sample */
  omega: number;
  /** Sample index (in the buffer) the fit's time origin sits at. */
  origin: number;
  /** Mean square of the fit residual. */
  residualMs: number;
}

/**
 * IEEE 1057 / IEEE 1241 four-parameter sine fit x[n] ≈ a·cos(ωt) + b·sin(ωt) + c,
 * t = n − origin: Gauss–Newton on ω from a three-parameter start, over growing
 * spans (0.5 s → 2 s → all) so a small initial frequency error cannot wrap the phase.
 */
export function fitSine(x: Float64Array, from: number, length: number, omega0: number, sampleRate: number): SineFit | null {
  let omega = omega0;
  const spans = [Math.min(length, Math.round(0.5 * sampleRate)), Math.min(length, 2 * sampleRate), length].filter((v, i, arr) => i === 0 || v > arr[i - 1]);
  let fit: SineFit | null = null;
  for (const span of spans) {
    const origin = from + (span - 1) / 2;
    for (let iter = 0; iter < 6; iter++) {
      const three = solveThree(x, from, span, origin, omega);
      if (!three) return null;
      const step = solveFourStep(x, from, span, origin, omega, three.a, three.b);
      if (step === null) return null;
      omega += step;
      if (Math.abs(step) < 1e-13) break;
    }
    fit = solveThree(x, from, span, origin, omega);
    if (!fit) return null;
  }
  return fit;
}

/** Three-parameter least squares (known ω): a, b, c and the residual mean square. */
export function solveThree(x: Float64Array, from: number, length: number, origin: number, omega: number): SineFit | null {
  let scc = 0, sss = 0, scs = 0, sc = 0, ss = 0, sxc = 0, sxs = 0, sx = 0;
  for (let n = from; n < from + length; n++) {
    const t = n - origin;
    const co = Math.cos(omega * t);
    const si = Math.sin(omega * t);
    const v = x[n];
    scc += co * co; sss += si * si; scs += co * si; sc += co; ss += si;
    sxc += v * co; sxs += v * si; sx += v;
  }
  const sol = solveLinear(
    [
      [scc, scs, sc],
      [scs, sss, ss],
      [sc, ss, length],
    ],
    [sxc, sxs, sx],
  );
  if (!sol) return null;
  const [a, b, c] = sol;
  // Residual energy summed sample by sample (the closed form Σx² − θᵀAᵀx cancels badly at 140 dB SINAD).
  let r = 0;
  for (let n = from; n < from + length; n++) {
    const t = n - origin;
    const e = x[n] - (a * Math.cos(omega * t) + b * Math.sin(omega * t) + c);
    r += e * e;
  }
  return { a, b, c, omega, origin, residualMs: r / length };
}

/** One Gauss–Newton step in ω for the four-parameter model, linearised at (a, b, ω). */
function solveFourStep(x: Float64Array, from: number, length: number, origin: number, omega: number, a: number, b: number): number | null {
  const m = [[0, 0, 0, 0], [0, 0, 0, 0], [0, 0, 0, 0], [0, 0, 0, 0]];
  const rhs = [0, 0, 0, 0];
  const col = [0, 0, 0, 0];
  for (let n = from; n < from + length; n++) {
    const t = n - origin;
    const co = Math.cos(omega * t);
    const si = Math.sin(omega * t);
    col[0] = co;
    col[1] = si;
    col[2] = 1;
    col[3] = t * (-a * si + b * co);
    const v = x[n];
    for (let i = 0; i < 4; i++) {
      rhs[i] += col[i] * v;
      for (let j = i; j < 4; j++) m[i][j] += col[i] * col[j];
    }
  }
  for (let i = 0; i < 4; i++) for (let j = 0; j < i; j++) m[i][j] = m[j][i];
  // Solving for (a', b', c', Δω) with the current a, b in the derivative column gives the step directly.
  const sol = solveLinear(m, rhs);
  return sol ? sol[3] : null;
}

/** Gaussian elimination with partial pivoting; null when singular. */
export function solveLinear(matrix: number[][], rhs: number[]): number[] | null {
  const n = rhs.length;
  const a = matrix.map((row, i) => [...row, rhs[i]]);
  for (let col = 0; col < n; col++) {
    let pivot = col;
    for (let r = col + 1; r < n; r++) if (Math.abs(a[r][col]) > Math.abs(a[pivot][col])) pivot = r;
    if (!(Math.abs(a[pivot][col]) > 1e-300)) return null;
    [a[col], a[pivot]] = [a[pivot], a[col]];
    for (let r = col + 1; r < n; r++) {
      const f = a[r][col] / a[col][col];
      for (let k = col; k <= n; k++) a[r][k] -= f * a[col][k];
    }
  }
  const out = new Array<number>(n).fill(0);
  for (let r = n - 1; r >= 0; r--) {
    let s = a[r][n];
    for (let k = r + 1; k < n; k++) s -= a[r][k] * out[k];
    out[r] = s / a[r][r];
  }
  return out;
}
