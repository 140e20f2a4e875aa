/**
 * Sync markers of the check signal: linear chirps (an up-sweep opens the measured part, a
 * down-sweep closes it). A chirp's matched filter gives a sharp, gain- and polarity-independent
 * correlation peak, keeps working under clock errors of a few hundred ppm (a linear chirp is
 * Doppler tolerant: a frequency offset only shifts the peak a little), and its band, 150 Hz to
 * 4 kHz, passes any plausible converter, so the sign of the peak also tells the polarity.
 */

export type MarkerSweep = 'up' | 'down';

export const MARKER_SEC = 0.5;
const MARKER_LOW_HZ = 150;
const MARKER_HIGH_HZ = 4000;
/** Cosine taper at each end, seconds: keeps the chirp's spectrum inside its band. */
const MARKER_TAPER_SEC = 0.02;
/** Highest frequency in a marker, Hz, for the analysis' decimation. */
export const MARKER_TOP_HZ = MARKER_HIGH_HZ;

export function markerFrames(sampleRate: number): number {
  return Math.round(MARKER_SEC * sampleRate);
}

/** Taper w(n) and phase φ(n) of a marker: φ(t) = 2π·(f0·t + (f1 − f0)·t²/(2T)). */
function markerShape(sampleRate: number, sweep: MarkerSweep, visit: (n: number, taper: number, phase: number) => void): void {
  const frames = markerFrames(sampleRate);
  const duration = frames / sampleRate;
  const [f0, f1] = sweep === 'up' ? [MARKER_LOW_HZ, MARKER_HIGH_HZ] : [MARKER_HIGH_HZ, MARKER_LOW_HZ];
  const taperFrames = Math.round(MARKER_TAPER_SEC * sampleRate);
  for (let n = 0; n < frames; n++) {
    const t = n / sampleRate;
    const edge = Math.min(n, frames - 1 - n);
    const taper = edge >= taperFrames ? 1 : 0.5 - 0.5 * Math.cos((Math.PI * edge) / taperFrames);
    visit(n, taper, 2 * Math.PI * (f0 * t + ((f1 - f0) * t * t) / (2 * duration)));
  }
}

/** The marker as written, unit peak amplitude: w(n)·cos φ(n). */
export function markerSamples(sampleRate: number, sweep: MarkerSweep): Float64Array {
  const out = new Float64Array(markerFrames(sampleRate));
  markerShape(sampleRate, sweep, (n, taper, phase) => {
    out[n] = taper * Math.cos(phase);
  });
  return out;
}

/**
 * The analysis template w(n)·e^{iφ(n)}: correlating a recording with its conjugate gives a
 * complex value whose magnitude is the match and whose sign (real part) at the peak is the
 * polarity, since Σ w²·cos φ·e^{−iφ} ≈ Σ w²/2 is real and positive for a matching marker.
 */
export function markerTemplate(sampleRate: number, sweep: MarkerSweep): { re: Float64Array; im: Float64Array } {
  const frames = markerFrames(sampleRate);
  const re = new Float64Array(frames);
  const im = new Float64Array(frames);
  markerShape(sampleRate, sweep, (n, taper, phase) => {
    re[n] = taper * Math.cos(phase);
    im[n] = taper * Math.sin(phase);
  });
  return { re, im };
}
