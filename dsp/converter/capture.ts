import type { Readable } from 'node:stream';
import { openWav } from '../reader/wavReader';

/**
 * Second pass: keeps frames [from, to) of every channel in memory (float32 is exact for 24-bit
 * PCM and float32 files; 32-bit PCM keeps 24 bits, far below any converter's noise).
 */
export async function captureSpan(readable: Readable, from: number, to: number): Promise<Float32Array[]> {
  const opened = await openWav(readable);
  const span = Math.max(0, to - from);
  const channels = Array.from({ length: opened.format.channels }, () => new Float32Array(span));
  for await (const block of opened.blocks()) {
    const blockEnd = block.startFrame + block.frames;
    if (blockEnd <= from) continue;
    const first = Math.max(from, block.startFrame);
    const last = Math.min(to, blockEnd);
    for (let c = 0; c < channels.length; c++) {
      channels[c].set(block.channels[c].subarray(first - block.startFrame, last - block.startFrame), first - from);
    }
    if (blockEnd >= to) break;
  }
  return channels;
}
