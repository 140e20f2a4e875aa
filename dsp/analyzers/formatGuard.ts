import type { AudioFormat } from '../types';

/** Lowest and highest sample rates the spectral analyzers accept, Hz. */
export const MIN_ANALYSIS_RATE_HZ = 1000;
export const MAX_ANALYSIS_RATE_HZ = 768_000;

/**
 * Rejects a format no analyzer could measure, with a message naming the analyzer.
 * @throws RangeError on a non-finite or out-of-range sample rate or channel count.
 */
export function assertAnalysableFormat(format: AudioFormat, analyzer: string): void {
  const { sampleRate, channels } = format;
  if (!Number.isFinite(sampleRate) || sampleRate < MIN_ANALYSIS_RATE_HZ || sampleRate > MAX_ANALYSIS_RATE_HZ) {
    throw new RangeError(
      `${analyzer}: sample rate ${sampleRate} Hz is outside ${MIN_ANALYSIS_RATE_HZ}–${MAX_ANALYSIS_RATE_HZ} Hz.`,
    );
  }
  if (!Number.isInteger(channels) || channels < 1 || channels > 64) {
    throw new RangeError(`${analyzer}: channel count ${channels} must be an integer from 1 to 64.`);
  }
}

/** Frames the header declares, or null when it does not say. */
export function declaredFrames(format: AudioFormat): number | null {
  if (format.declaredDataBytes === null || !(format.blockAlign > 0)) return null;
  return Math.floor(format.declaredDataBytes / format.blockAlign);
}

/** Hann window w[n] = 0.5 − 0.5·cos(2πn/N), periodic form (DFT-even), for Welch averaging. */
export function hannWindow(size: number): Float64Array {
  const w = new Float64Array(size);
  for (let n = 0; n < size; n++) w[n] = 0.5 - 0.5 * Math.cos((2 * Math.PI * n) / size);
  return w;
}

export function isPowerOfTwo(n: number): boolean {
  return Number.isInteger(n) && n >= 2 && (n & (n - 1)) === 0;
}
