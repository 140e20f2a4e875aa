import { Readable } from 'node:stream';
import { openWav } from '../../dsp/reader/wavReader';
import type { Analyzer, AudioFormat } from '../../dsp/types';

/** A Readable over a buffer, cut into chunks of `chunkBytes` (odd sizes exercise the reader's joins). */
export function bufferStream(buffer: Buffer, chunkBytes = 4099): Readable {
  const chunks: Buffer[] = [];
  for (let offset = 0; offset < buffer.length; offset += chunkBytes) chunks.push(buffer.subarray(offset, offset + chunkBytes));
  return Readable.from(chunks, { objectMode: false });
}

/** Reads a WAV buffer through the streaming reader into per-channel arrays, plus its format and metadata. */
export async function decodeWav(buffer: Buffer, chunkBytes?: number) {
  const wav = await openWav(bufferStream(buffer, chunkBytes), { blockFrames: 1000 });
  const parts: Float64Array[][] = wav.format.channels ? Array.from({ length: wav.format.channels }, () => []) : [];
  for await (const block of wav.blocks()) block.channels.forEach((channel, c) => parts[c].push(channel.slice(0, block.frames)));
  const channels = parts.map((chunks) => {
    const out = new Float64Array(chunks.reduce((sum, chunk) => sum + chunk.length, 0));
    let offset = 0;
    for (const chunk of chunks) {
      out.set(chunk, offset);
      offset += chunk.length;
    }
    return out;
  });
  return { format: wav.format, metadata: wav.metadata, channels, frames: wav.framesRead() };
}

/** Runs one analyzer over a WAV buffer read by the streaming reader. */
export async function analyzeWavBuffer<R>(buffer: Buffer, makeAnalyzer: (format: AudioFormat) => Analyzer<R>): Promise<R> {
  const wav = await openWav(bufferStream(buffer));
  const analyzer = makeAnalyzer(wav.format);
  for await (const block of wav.blocks()) analyzer.push(block);
  return analyzer.finish();
}
