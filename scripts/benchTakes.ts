import { once } from 'node:events';
import { createWriteStream } from 'node:fs';
import { mkdir, rename } from 'node:fs/promises';
import { dirname } from 'node:path';
import { ProgrammeGenerator } from '../tests/support/testSignals';
import { bytesPerFrame, encodeSamples, streamingHeader, type WavLayout } from '../tests/support/wavWriter';

/** Writes a WAV of programme-like material (deterministic for a seed), streamed so any length fits in memory. */
export async function generateProgrammeTake(path: string, seconds: number, layout: WavLayout, seed = 2024): Promise<void> {
  await mkdir(dirname(path), { recursive: true });
  const frames = Math.round(seconds * layout.sampleRate);
  const partial = `${path}.partial`;
  const out = createWriteStream(partial);
  out.write(streamingHeader(layout, frames * bytesPerFrame(layout)));
  const generator = new ProgrammeGenerator(layout.sampleRate, layout.channels, seed);
  const blockFrames = 48000;
  const block = Array.from({ length: layout.channels }, () => new Float64Array(blockFrames));
  for (let done = 0; done < frames; done += blockFrames) {
    const n = Math.min(blockFrames, frames - done);
    generator.fill(block, n);
    if (!out.write(encodeSamples(block, layout.coding, 0, n))) await once(out, 'drain');
  }
  out.end();
  await once(out, 'finish');
  await rename(partial, path);
}
