import { Readable } from 'node:stream';
import { describe, expect, it } from 'vitest';
import { LevelsAnalyzer } from '../../../dsp/analyzers/levels';
import { openWav } from '../../../dsp/reader/wavReader';
import { streamingHeader, type WavLayout } from '../../support/wavWriter';

const RATE = 48000;
const PATTERN_FRAMES = 131072; // 1 MiB of float64 samples
const CYCLES_PER_PATTERN = 2731; // a whole number of cycles, so the pattern repeats seamlessly: f = 2731·48000/131072 ≈ 1000.1 Hz
const AMPLITUDE = 0.5;

/** A generated RF64 stream: header, then one 1 MiB pattern pushed again and again. Never held whole. */
function generatedRf64(layout: WavLayout, dataBytes: number): Readable {
  const pattern = Buffer.alloc(PATTERN_FRAMES * 8);
  for (let n = 0; n < PATTERN_FRAMES; n++) pattern.writeDoubleLE(AMPLITUDE * Math.sin((2 * Math.PI * CYCLES_PER_PATTERN * n) / PATTERN_FRAMES), n * 8);
  let remaining = dataBytes;
  let headerSent = false;
  return new Readable({
    highWaterMark: 4 * pattern.length,
    read() {
      if (!headerSent) {
        headerSent = true;
        this.push(streamingHeader(layout, dataBytes));
        return;
      }
      if (remaining === 0) {
        this.push(null);
        return;
      }
      const size = Math.min(pattern.length, remaining);
      remaining -= size;
      this.push(size === pattern.length ? pattern : pattern.subarray(0, size));
    },
  });
}

describe('RF64 take larger than 4 GiB, streamed', () => {
  // The reader and one analyzer over 4 GiB + 64 MiB (537 million frames, about 3.1 hours at 48 kHz):
  // the full pipeline over the same stream would take minutes on two cores.
  it('reads every frame with 64-bit ds64 sizes, measures it, and keeps memory flat', async () => {
    const layout: WavLayout = { sampleRate: RATE, channels: 1, coding: 'float64' };
    const dataBytes = 2 ** 32 + 64 * 2 ** 20;
    const expectedFrames = dataBytes / 8;
    const wav = await openWav(generatedRf64(layout, dataBytes));
    expect(wav.format.container).toBe('RF64');
    expect(wav.format.declaredDataBytes).toBe(dataBytes);
    const levels = new LevelsAnalyzer(wav.format);
    let blocks = 0;
    let earlyRss = 0;
    let lastStart = -1;
    for await (const block of wav.blocks()) {
      levels.push(block);
      lastStart = block.startFrame;
      // RSS once the read is under way (a tenth of the way in), against the end, over 90 % more audio.
      if (++blocks === Math.round(expectedFrames / 65536 / 10)) earlyRss = process.memoryUsage().rss;
    }
    const lateRss = process.memoryUsage().rss;
    expect(wav.framesRead()).toBe(expectedFrames);
    expect(lastStart + 65536).toBe(expectedFrames);
    expect(wav.metadata.headerIssues).toEqual([]);
    const [channel] = levels.finish().channels;
    // A 0.5 FS sine over whole cycles: peak -6.02 dBFS, mean square 0.125 (-9.03 dBFS RMS), no DC.
    expect(20 * Math.log10(channel.samplePeak)).toBeCloseTo(-6.02, 2);
    expect(channel.meanSquare).toBeCloseTo(0.125, 9);
    expect(Math.abs(channel.dcOffset)).toBeLessThan(1e-12);
    const growthMb = (lateRss - earlyRss) / 2 ** 20;
    expect(growthMb).toBeLessThan(32);
  }, 170_000);
});
