import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';
import { analyzeConverterCheckFile } from '../../../dsp/converter/analyzeCheck';
import type { ConverterReport } from '../../../dsp/converter/report';
import { writeCheckSignalFile } from '../../../dsp/converter/signalWriter';
import { plantedValues, simulateRecording, type SimulatedConverter } from '../../support/converterSimulation';
import { tempDirectory } from '../../support/tempFiles';

/**
 * Acceptance: the check signal Takeproof writes, passed through a simulated converter with known
 * impairments and surrounded by seconds of noise, must give back each planted value. The expected
 * values come from the planted parameters by textbook formulas (tests/support/converterSimulation.ts:
 * the filter's exact response, white-noise and quantisation powers, TPDF dither power after
 * Lipshitz et al. 1992, the second harmonic of x + a2·x², IEEE 1241 ENOB); the clock error is made
 * by sox `speed`. Tolerances are those the feature promises.
 */

const root = fileURLToPath(new URL('../../../', import.meta.url));
const temp = tempDirectory();
afterAll(() => temp.remove());

const cli = (...args: string[]) => spawnSync(join(root, 'node_modules', '.bin', 'tsx'), ['dsp/cli.ts', ...args], { cwd: root, encoding: 'utf8', timeout: 120_000 });

interface Case {
  rate: number;
  converter: SimulatedConverter;
}

const converter = (overrides: Partial<SimulatedConverter> & Pick<SimulatedConverter, 'bits' | 'gainsDb'>): SimulatedConverter => {
  const channels = overrides.gainsDb.length;
  return {
    inverted: Array(channels).fill(false),
    lowPass: { cutoffHz: 18000, order: 6 },
    noiseDbfs: -90,
    secondOrder: 0.002,
    crosstalk: [],
    delaySamples: Array(channels).fill(0),
    clockPpm: 100,
    leadSec: 4,
    tailSec: 3,
    seed: 1,
    ...overrides,
  };
};

// Rates, depths and channel counts the feature promises, each with its own impairments. Cut-offs stay
// below 0.85 × Nyquist, where sox's resampler is flat, so the planted filter alone sets the band edge.
const cases: Case[] = [
  { rate: 44100, converter: converter({ bits: 16, gainsDb: [-0.6], lowPass: { cutoffHz: 15000, order: 4 }, noiseDbfs: -82, clockPpm: -200, secondOrder: 0.003, leadSec: 6.5, seed: 11 }) },
  { rate: 44100, converter: converter({ bits: 16, gainsDb: [0.2, -0.4], inverted: [false, true], lowPass: { cutoffHz: 17500, order: 8 }, noiseDbfs: -88, clockPpm: 120, crosstalk: [{ from: 0, into: 1, db: -68 }], delaySamples: [0, 17], seed: 12 }) },
  { rate: 44100, converter: converter({ bits: 24, gainsDb: [-1], noiseDbfs: -104, clockPpm: 55, secondOrder: 0.0008, leadSec: 3.1, seed: 13 }) },
  { rate: 44100, converter: converter({ bits: 24, gainsDb: [-0.3, 0.4], inverted: [true, false], lowPass: { cutoffHz: 16000, order: 6 }, noiseDbfs: -96, clockPpm: -90, crosstalk: [{ from: 1, into: 0, db: -84 }], delaySamples: [31, 0], seed: 14 }) },
  { rate: 48000, converter: converter({ bits: 16, gainsDb: [0.5], lowPass: { cutoffHz: 20000, order: 8 }, noiseDbfs: -74, clockPpm: 200, leadSec: 5, seed: 21 }) },
  { rate: 48000, converter: converter({ bits: 16, gainsDb: [-0.2, -0.9], inverted: [false, true], lowPass: { cutoffHz: 15000, order: 4 }, noiseDbfs: -90, clockPpm: -60, crosstalk: [{ from: 0, into: 1, db: -75 }], delaySamples: [0, 45], seed: 22 }) },
  { rate: 48000, converter: converter({ bits: 24, gainsDb: [0.1], lowPass: { cutoffHz: 19000, order: 6 }, noiseDbfs: -110, clockPpm: -150, secondOrder: 0.0005, seed: 23 }) },
  { rate: 48000, converter: converter({ bits: 24, gainsDb: [-0.5, 0.25], inverted: [false, true], lowPass: { cutoffHz: 18000, order: 4 }, noiseDbfs: -70, clockPpm: 75, crosstalk: [{ from: 0, into: 1, db: -62 }], delaySamples: [0, 12], leadSec: 7, seed: 24 }) },
  { rate: 96000, converter: converter({ bits: 16, gainsDb: [-0.8], lowPass: { cutoffHz: 30000, order: 6 }, noiseDbfs: -86, clockPpm: 180, seed: 31 }) },
  { rate: 96000, converter: converter({ bits: 16, gainsDb: [0.3, 0], inverted: [true, true], lowPass: { cutoffHz: 22000, order: 8 }, noiseDbfs: -78, clockPpm: -110, crosstalk: [{ from: 1, into: 0, db: -70 }], delaySamples: [0, 60], seed: 32 }) },
  { rate: 96000, converter: converter({ bits: 24, gainsDb: [-0.1], lowPass: { cutoffHz: 40000, order: 8 }, noiseDbfs: -108, clockPpm: 50, secondOrder: 0.001, seed: 33 }) },
  { rate: 96000, converter: converter({ bits: 24, gainsDb: [0.4, -0.35], inverted: [false, true], lowPass: { cutoffHz: 25000, order: 4 }, noiseDbfs: -100, clockPpm: -200, crosstalk: [{ from: 0, into: 1, db: -88 }], delaySamples: [25, 0], leadSec: 5.5, seed: 34 }) },
  // More than two channels: crosstalk out of channel 1 and delays, each judged against channel 1.
  {
    rate: 48000,
    converter: converter({
      bits: 24, gainsDb: [0, -0.3, 0.2, -0.6], inverted: [false, false, true, false], noiseDbfs: -98, clockPpm: 140,
      crosstalk: [{ from: 0, into: 1, db: -66 }, { from: 0, into: 2, db: -78 }, { from: 0, into: 3, db: -90 }], delaySamples: [0, 12, 0, 27], seed: 41,
    }),
  },
];

const describeCase = ({ rate, converter: c }: Case) => `${rate / 1000} kHz ${c.bits}-bit ${c.gainsDb.length} ch, ${c.clockPpm} ppm, low-pass ${c.lowPass.cutoffHz / 1000} kHz, noise ${c.noiseDbfs} dB FS`;

async function recordThrough({ rate, converter: c }: Case, signalPath?: string): Promise<string> {
  const name = `${rate}-${c.bits}-${c.gainsDb.length}-${c.seed}`;
  const signal = signalPath ?? temp.path(`signal-${name}.wav`);
  if (!signalPath) await writeCheckSignalFile(signal, { sampleRate: rate, bitsPerSample: c.bits, channels: c.gainsDb.length });
  const recording = temp.path(`recording-${name}.wav`);
  await simulateRecording(signal, temp.path, c, recording);
  return recording;
}

function expectPlantedValues(report: ConverterReport, { rate, converter: c }: Case): void {
  const planted = plantedValues(c, rate, c.bits);
  expect(report.clockErrorPpm!).toBeCloseTo(planted.clockErrorPpm, 0);
  expect(Math.abs(report.clockErrorPpm! - planted.clockErrorPpm)).toBeLessThanOrEqual(2);
  report.channels.forEach((channel, i) => {
    expect(channel.dead).toBe(false);
    expect(channel.polarityInverted).toBe(planted.polarityInverted[i]);
    expect(Math.abs(channel.gainDb! - planted.gainDb[i])).toBeLessThanOrEqual(0.1);
    expect(Math.abs(channel.bandEdgeHz! / planted.bandEdgeHz - 1)).toBeLessThanOrEqual(0.03);
    expect(Math.abs(channel.noiseFloorDbfs! - planted.noiseFloorDbfs)).toBeLessThanOrEqual(1.5);
    expect(Math.abs(channel.dynamicRangeDb! - planted.dynamicRangeDb[i])).toBeLessThanOrEqual(1.5);
    expect(Math.abs(channel.thdnDb.minus1! - planted.thdnMinus1Db[i])).toBeLessThanOrEqual(2);
    expect(Math.abs(channel.thdnDb.minus20! - planted.thdnMinus20Db[i])).toBeLessThanOrEqual(2);
    expect(Math.abs(channel.enobBits! - planted.enobBits[i])).toBeLessThanOrEqual(0.3);
    expect(channel.delaySamples).toBe(planted.delaySamples[i]);
  });
  if (c.gainsDb.length > 1) {
    expect(report.interChannelDelaySamples).toBe(c.gainsDb.length === 2 ? planted.delaySamples[1] : planted.delaySamples.reduce((a, b) => (Math.abs(b) > Math.abs(a) ? b : a)));
    expect(Math.abs(report.crosstalkDb! - planted.crosstalkDb)).toBeLessThanOrEqual(2);
    const gains = planted.gainDb;
    expect(Math.abs(report.channelGainMismatchDb! - (Math.max(...gains) - Math.min(...gains)))).toBeLessThanOrEqual(0.1);
  } else {
    expect(report.crosstalkDb).toBeNull();
    expect(report.interChannelDelaySamples).toBeNull();
  }
}

describe('converter check: planted converter impairments are recovered', () => {
  it.each(cases)('$rate Hz, $converter.bits-bit, $converter.gainsDb.length channel(s)', async (testCase) => {
    const report = await analyzeConverterCheckFile(await recordThrough(testCase));
    expect(report.file.sampleRate, describeCase(testCase)).toBe(testCase.rate);
    expectPlantedValues(report, testCase);
  });

  it('crosstalk out of channel 1 is measured into each other channel', async () => {
    const testCase = cases[cases.length - 1];
    const report = await analyzeConverterCheckFile(await recordThrough(testCase));
    const { converter: c } = testCase;
    for (const path of c.crosstalk) {
      const measured = report.crosstalkPaths.find((p) => p.driven === path.from && p.into === path.into)!;
      const planted = path.db + c.gainsDb[path.into] - c.gainsDb[path.from];
      for (const db of measured.db) expect(Math.abs(db - planted)).toBeLessThanOrEqual(2);
      expect(Math.abs(report.channels[path.into].crosstalkIntoDb! - planted)).toBeLessThanOrEqual(2);
    }
  });

  it('works end to end through the command line: --make-converter-signal, then --converter-check --json', async () => {
    const testCase: Case = { rate: 48000, converter: converter({ bits: 24, gainsDb: [-0.7, 0.3], inverted: [true, false], lowPass: { cutoffHz: 16500, order: 6 }, noiseDbfs: -94, clockPpm: -170, crosstalk: [{ from: 0, into: 1, db: -72 }], delaySamples: [0, 38], leadSec: 8, seed: 51 }) };
    const signal = temp.path('cli-signal.wav');
    const written = cli('--make-converter-signal', signal, '--rate', '48000', '--bits', '24', '--channels', '2');
    expect(written.status, written.stderr).toBe(0);
    expect(written.stderr).toMatch(/line inputs, not into monitors or headphones/);
    const run = cli('--converter-check', await recordThrough(testCase, signal), '--json');
    expect(run.status, run.stderr).toBe(0);
    const report = JSON.parse(run.stdout) as ConverterReport;
    expect(report.levelReference).toMatch(/full-scale sine reads 0 dB FS/);
    expectPlantedValues(report, testCase);
    expect(report.findings.map((finding) => finding.check)).toEqual(expect.arrayContaining(['polarity', 'clock', 'delay', 'band-edge', 'crosstalk']));
  });
});
