import { mkdtempSync, readdirSync, readFileSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { WaveformPeaksAnalyzer } from '@/dsp/analyzers/waveformPeaks';
import { pickPeaksLevel, readPeaksHeader, readPeaksLevel, toWaveformPeaks } from '@/dsp/peaksFile';
import { pcmFormat, pushInBlocks, sine, speechLike, whiteNoise } from '@/tests/support/spectralSignals';

const dir = mkdtempSync(join(tmpdir(), 'peaks-test-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** Brute-force envelope: min and max of each run of `fpb` frames (the last run may be shorter). */
function bruteForce(x: Float64Array, fpb: number): { min: number[]; max: number[] } {
  const min: number[] = [];
  const max: number[] = [];
  for (let s = 0; s < x.length; s += fpb) {
    let mn = Infinity;
    let mx = -Infinity;
    for (let i = s; i < Math.min(x.length, s + fpb); i++) {
      mn = Math.min(mn, x[i]);
      mx = Math.max(mx, x[i]);
    }
    min.push(mn);
    max.push(mx);
  }
  return { min, max };
}

describe('WaveformPeaksAnalyzer and the peaks file: min/max per bucket, checked against a brute-force computation [common practice]', () => {
  const frames = 48000 * 3 + 1234; // not a multiple of any bucket size
  const left = speechLike(frames, 48000, 0.8, 1);
  const right = whiteNoise(frames, 0.2, 2);
  right[5000] = 1; // full-scale extremes must survive
  right[5001] = -1;

  it('writes every level so that min/max match a brute-force computation to one int16 step, enclosing the samples', () => {
    const path = join(dir, 'take.peaks');
    const result = pushInBlocks(new WaveformPeaksAnalyzer(pcmFormat(48000, 2), { outputPath: path }), [left, right], [65536, 100, 4095]);
    expect(result.path).toBe(path);
    expect(result.frames).toBe(frames);
    expect(result.levels.map((l) => l.framesPerBucket)).toEqual([256, 2048, 16384]);
    const bytes = readFileSync(path);
    const header = readPeaksHeader(bytes);
    expect(header.channels).toBe(2);
    expect(header.sampleRate).toBe(48000);
    expect(header.totalFrames).toBe(frames);
    for (const fpb of [256, 2048, 16384]) {
      const level = readPeaksLevel(path, fpb);
      expect(level.min[0].length).toBe(Math.ceil(frames / fpb));
      [left, right].forEach((x, c) => {
        const ref = bruteForce(x, fpb);
        for (let b = 0; b < ref.min.length; b++) {
          // Quantised outward to steps of 1/32767.
          expect(level.min[c][b]).toBeLessThanOrEqual(ref.min[b] + 1e-7);
          expect(level.max[c][b]).toBeGreaterThanOrEqual(ref.max[b] - 1e-7);
          expect(ref.min[b] - level.min[c][b]).toBeLessThan(1 / 32767 + 1e-7);
          expect(level.max[c][b] - ref.max[b]).toBeLessThan(1 / 32767 + 1e-7);
        }
      });
      // Reading from bytes gives the same as reading from the path.
      const fromBytes = readPeaksLevel(bytes, fpb);
      expect(Array.from(fromBytes.max[1])).toEqual(Array.from(level.max[1]));
    }
    expect(readPeaksLevel(path, 256).max[1][Math.floor(5000 / 256)]).toBe(1);
    expect(readPeaksLevel(path, 256).min[1][Math.floor(5001 / 256)]).toBeCloseTo(-1, 6);
    // Size: header + table + 4 bytes per channel per bucket.
    const expectedSize = 32 + 3 * 24 + [256, 2048, 16384].reduce((s, f) => s + Math.ceil(frames / f) * 2 * 4, 0);
    expect(statSync(path).size).toBe(expectedSize);
    // No scratch files are left behind.
    expect(readdirSync(dir).filter((f) => f.endsWith('.part'))).toEqual([]);
  });

  it('handles custom levels, a mono take and a length that is an exact multiple of the finest bucket', () => {
    const path = join(dir, 'mono.peaks');
    const x = sine(64 * 10, 48000, 1000, 0.5);
    const r = pushInBlocks(new WaveformPeaksAnalyzer(pcmFormat(48000, 1), { outputPath: path, levels: [64, 128] }), [x], 17);
    expect(r.levels).toEqual([{ framesPerBucket: 64, buckets: 10 }, { framesPerBucket: 128, buckets: 5 }]);
    const level = readPeaksLevel(path, 128);
    const ref = bruteForce(x, 128);
    for (let b = 0; b < 5; b++) expect(Math.abs(level.max[0][b] - ref.max[b])).toBeLessThan(1 / 32767 + 1e-7);
  });

  it('writes a valid file for an empty take', () => {
    const path = join(dir, 'empty.peaks');
    const a = new WaveformPeaksAnalyzer(pcmFormat(44100, 2), { outputPath: path });
    const r = a.finish();
    expect(r.levels.every((l) => l.buckets === 0)).toBe(true);
    expect(readPeaksLevel(path, 2048).min[0].length).toBe(0);
  });

  it('gives a waveform view JSON shape: alternating min/max in −1…1 and the duration', () => {
    const path = join(dir, 'view.peaks');
    pushInBlocks(new WaveformPeaksAnalyzer(pcmFormat(48000, 2), { outputPath: path }), [left, right], 65536);
    const header = readPeaksHeader(readFileSync(path));
    // 145,234 frames: 568 buckets of 256 frames (too many for 500), 71 of 2048.
    const choice = pickPeaksLevel(header, 500);
    expect(choice.framesPerBucket).toBe(2048);
    const view = toWaveformPeaks(readPeaksLevel(path, choice.framesPerBucket));
    expect(view.duration).toBeCloseTo(frames / 48000, 9);
    expect(view.peaks.length).toBe(2);
    expect(view.peaks[0].length).toBe(2 * choice.bucketCount);
    expect(view.peaks.flat().every((v) => v >= -1.0001 && v <= 1)).toBe(true);
    expect(view.peaks[0][0]).toBeLessThanOrEqual(view.peaks[0][1]);
  });

  it('refuses what is not a peaks file, and levels it does not have', () => {
    expect(() => readPeaksHeader(Buffer.from('RIFF....WAVEfmt '))).toThrow(/TPPK/);
    const path = join(dir, 'take.peaks');
    expect(() => readPeaksLevel(path, 1000)).toThrow(/no level of 1000/);
  });

  it('rejects impossible configuration with a message', () => {
    const f = pcmFormat(48000, 2);
    expect(() => new WaveformPeaksAnalyzer(f, { outputPath: '' })).toThrow(/outputPath/);
    expect(() => new WaveformPeaksAnalyzer(f, { outputPath: join(dir, 'x'), levels: [] })).toThrow(/levels/);
    expect(() => new WaveformPeaksAnalyzer(f, { outputPath: join(dir, 'x'), levels: [256, 1000] })).toThrow(/multiple/);
    expect(() => new WaveformPeaksAnalyzer(f, { outputPath: join(dir, 'x'), levels: [8] })).toThrow(/16 to 2\^24/);
    expect(() => new WaveformPeaksAnalyzer(pcmFormat(0, 2), { outputPath: join(dir, 'x') })).toThrow(/sample rate/);
  });
});
