import { createReadStream, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { NoiseFloorAnalyzer, type NoiseFloorResult } from '@/dsp/analyzers/noiseFloor';
import { SpectrumAnalyzer, type BandwidthResult } from '@/dsp/analyzers/spectrum';
import { ToneAnalyzer, type ToneResult } from '@/dsp/analyzers/tone';
import { WaveformPeaksAnalyzer } from '@/dsp/analyzers/waveformPeaks';
import { readPeaksLevel, type PeaksLevel } from '@/dsp/peaksFile';
import { openWav } from '@/dsp/reader/wavReader';
import type { AudioFormat } from '@/dsp/types';
import { DEMO_TAKES, makeSamples } from '@/scripts/make-samples';

/**
 * Runs each demo take through the spectral analyzers (read by the project's
 * streaming reader) and checks that the problem the take was made to show is
 * found, and that the clean take shows none of them.
 */

interface Measured {
  format: AudioFormat;
  bandwidth: BandwidthResult;
  noise: NoiseFloorResult;
  tone: ToneResult | null;
  peaks: PeaksLevel;
  /** Decoded samples of the first 12 s, for checks on the file's own data. */
  channels: Float64Array[];
}

const dir = mkdtempSync(join(tmpdir(), 'demo-takes-'));
const measured = new Map<string, Measured>();

async function measure(file: string): Promise<Measured> {
  const path = join(dir, file);
  const wav = await openWav(createReadStream(path));
  const { format } = wav;
  const spectrum = new SpectrumAnalyzer(format);
  const noise = new NoiseFloorAnalyzer(format);
  const tone = new ToneAnalyzer(format);
  const peaksPath = `${path}.peaks`;
  const peaks = new WaveformPeaksAnalyzer(format, { outputPath: peaksPath });
  const channels = Array.from({ length: format.channels }, () => new Float64Array(12 * format.sampleRate));
  for await (const block of wav.blocks()) {
    for (const a of [spectrum, noise, tone, peaks]) a.push(block);
    for (let c = 0; c < format.channels; c++) {
      const room = channels[c].length - block.startFrame;
      if (room > 0) channels[c].set(block.channels[c].subarray(0, Math.min(block.frames, room)), block.startFrame);
    }
  }
  const peaksResult = peaks.finish();
  return {
    format,
    bandwidth: spectrum.finish(),
    noise: noise.finish(),
    tone: tone.finish(),
    peaks: readPeaksLevel(peaksResult.path, 2048),
    channels,
  };
}

/** Runs of at least `minRun` consecutive samples equal to `value`. */
function runsAt(x: Float64Array, value: number, minRun = 3): number {
  let runs = 0;
  let len = 0;
  for (let i = 0; i <= x.length; i++) {
    if (i < x.length && x[i] === value) len++;
    else {
      if (len >= minRun) runs++;
      len = 0;
    }
  }
  return runs;
}

beforeAll(async () => {
  const written = makeSamples(dir);
  expect(written.length).toBe(DEMO_TAKES.length);
  for (const take of DEMO_TAKES) measured.set(take.file, await measure(take.file));
}, 240_000);

afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('demo takes through the spectral analyzers', () => {
  it('take-01 (clean): full bandwidth, no implied rate, no aliasing risk, no hum, no tone, a quiet floor', () => {
    const m = measured.get('take-01-clean-interview.wav')!;
    expect(m.format.sampleRate).toBe(48000);
    expect(m.format.bitsPerSample).toBe(24);
    expect(m.bandwidth.effectiveHz!).toBeGreaterThan(0.42 * 48000);
    expect(m.bandwidth.impliedSourceRate).toBeNull();
    expect(m.bandwidth.aliasingRisk).toBe(false);
    expect(m.noise.humHz).toBeNull();
    expect(m.noise.floorDbfs!).toBeLessThan(-70);
    expect(m.tone).toBeNull();
  });

  it('take-02 (hot preamp): the file carries flat tops at −3 dBFS (left) and full-scale codes (right); nothing spectral is flagged', () => {
    const m = measured.get('take-02-hot-preamp.wav')!;
    const flat = Math.round(10 ** (-3 / 20) * 2 ** 23) / 2 ** 23;
    const left = m.channels[0].subarray(3 * 48000, 6 * 48000);
    expect(runsAt(left, flat) + runsAt(left, -flat)).toBeGreaterThanOrEqual(3);
    const right = m.channels[1].subarray(8 * 48000, 10 * 48000);
    expect(runsAt(right, 1 - 2 ** -23) + runsAt(right, -1)).toBeGreaterThanOrEqual(3);
    // The peaks file shows the right channel reaching full scale in 8–10 s only.
    const bucketSec = 2048 / 48000;
    const fullScaleBuckets = Array.from(m.peaks.max[1]).flatMap((v, b) => (v >= 1 - 2 ** -15 ? [b * bucketSec] : []));
    expect(fullScaleBuckets.length).toBeGreaterThan(0);
    expect(fullScaleBuckets.every((t) => t >= 8 - bucketSec && t < 10)).toBe(true);
    expect(Math.max(...m.peaks.max[0])).toBeLessThanOrEqual(flat + 1 / 32767);
    expect(m.noise.humHz).toBeNull();
    expect(m.tone).toBeNull();
    expect(m.bandwidth.impliedSourceRate).toBeNull();
  });

  it('take-03 (16-bit padded): every sample has its low 8 bits zero; the spectrum is full band', () => {
    const m = measured.get('take-03-16bit-padded.wav')!;
    let lowBits = 0;
    let bit8 = 0;
    for (const x of m.channels) {
      for (let i = 0; i < x.length; i++) {
        const code = Math.round(x[i] * 2 ** 23);
        lowBits |= code & 0xff;
        bit8 |= code & 0x100;
      }
    }
    expect(lowBits).toBe(0);
    expect(bit8).not.toBe(0); // the 16-bit LSB is in use: the data is 16-bit, not coarser
    expect(m.bandwidth.impliedSourceRate).toBeNull();
    expect(m.noise.humHz).toBeNull();
  });

  it('take-04 (narrowband guest): content ends near 7.8 kHz, implied source rate 16000', () => {
    const m = measured.get('take-04-remote-guest-narrowband.wav')!;
    expect(m.bandwidth.effectiveHz!).toBeGreaterThan(7400);
    expect(m.bandwidth.effectiveHz!).toBeLessThan(8000);
    expect(m.bandwidth.impliedSourceRate).toBe(16000);
    expect(m.bandwidth.aliasingRisk).toBe(false);
  });

  it('take-05 (mains hum): 50 Hz hum found, floor raised to about −50 dBFS', () => {
    const m = measured.get('take-05-mains-hum.wav')!;
    expect(m.noise.humHz).toBe(50);
    expect(Math.abs(m.noise.floorDbfs! + 50)).toBeLessThan(2);
  });

  it('take-06 (line-up tone): 1 kHz at −18 dBFS from 0 to 3 s, no rate problem', () => {
    const t = measured.get('take-06-lineup-tone.wav')!.tone!;
    expect(t).not.toBeNull();
    expect(t.startSec).toBeLessThan(0.02);
    expect(Math.abs(t.endSec - 3)).toBeLessThan(0.02);
    expect(Math.abs(t.frequencyHz - 1000)).toBeLessThan(0.1);
    expect(Math.abs(t.levelDbfs + 18)).toBeLessThan(0.1);
    expect(t.likelyRecordedRate).toBeNull();
    // A clean generator tone in 24 bits: far better than a 16-bit converter (98 dB).
    expect(t.sinadDb).toBeGreaterThan(100);
  });

  it('take-07 (mislabelled rate): the 1 kHz tone reads 1000 × 48000/44100 Hz, recorded at 44100', () => {
    const t = measured.get('take-07-mislabelled-rate.wav')!.tone!;
    expect(Math.abs(t.frequencyHz - (1000 * 48000) / 44100)).toBeLessThan(0.1);
    expect(t.likelyRecordedRate).toBe(44100);
  });

  it('writes nothing over existing takes', () => {
    expect(makeSamples(dir)).toEqual([]);
  });
});
