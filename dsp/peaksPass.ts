import type { Readable } from 'node:stream';
import { WaveformPeaksAnalyzer, type WaveformPeaksResult } from './analyzers/waveformPeaks';
import { openWav } from './reader/wavReader';

/**
 * Writes only the waveform peaks file of a take (the same file `analyzeStream` writes with
 * `peaksPath`), for a take already measured whose peaks file was lost. One cheap pass: no other analyzer runs.
 */
export async function writePeaksFile(readable: Readable, options: { peaksPath: string; reopenAt?: (byteOffset: number) => Readable }): Promise<WaveformPeaksResult> {
  const wav = await openWav(readable, { reopenAt: options.reopenAt }).catch((error: unknown) => {
    readable.destroy();
    throw error;
  });
  const peaks = new WaveformPeaksAnalyzer(wav.format, { outputPath: options.peaksPath });
  for await (const block of wav.blocks()) peaks.push(block);
  return peaks.finish();
}
