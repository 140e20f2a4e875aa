import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';
import { analyzeConverterCheckFile } from '../../../dsp/converter/analyzeCheck';
import type { ConverterReport } from '../../../dsp/converter/report';
import { comparePlanted, outOfTolerance, recordThroughConverter, simulatedConverter as converter, type AcceptanceCase } from '../../support/converterAcceptance';
import { tempDirectory } from '../../support/tempFiles';

/**
 * Acceptance at 44.1 and 48 kHz (96 kHz and more channels: converterCheckHighRate.test.ts): the
 * check signal Takeproof writes, passed through a simulated converter with known impairments and
 * surrounded by seconds of noise, must give back each planted value. The expected values come from
 * the planted parameters by textbook formulas (tests/support/converterSimulation.ts: the filter's
 * exact response, white-noise and quantisation powers, TPDF dither power after Lipshitz et al. 1992,
 * the second harmonic of x + a2·x², IEEE 1241 ENOB); the clock error is made by sox `speed`.
 * Cut-offs stay below 0.85 × Nyquist, where sox's resampler is flat, so the planted filter alone
 * sets the band edge.
 */

const root = fileURLToPath(new URL('../../../', import.meta.url));
const temp = tempDirectory();
afterAll(() => temp.remove());

const cli = (...args: string[]) => spawnSync(join(root, 'node_modules', '.bin', 'tsx'), ['dsp/cli.ts', ...args], { cwd: root, encoding: 'utf8', timeout: 120_000 });

const cases: AcceptanceCase[] = [
  { rate: 44100, converter: converter({ bits: 16, gainsDb: [-0.6], lowPass: { cutoffHz: 15000, order: 4 }, noiseDbfs: -82, clockPpm: -200, secondOrder: 0.003, leadSec: 6.5, seed: 11 }) },
  { rate: 44100, converter: converter({ bits: 16, gainsDb: [0.2, -0.4], inverted: [false, true], lowPass: { cutoffHz: 17500, order: 8 }, noiseDbfs: -88, clockPpm: 120, crosstalk: [{ from: 0, into: 1, db: -68 }], delaySamples: [0, 17], seed: 12 }) },
  { rate: 44100, converter: converter({ bits: 24, gainsDb: [-1], noiseDbfs: -104, clockPpm: 55, secondOrder: 0.0008, leadSec: 3.1, seed: 13 }) },
  { rate: 44100, converter: converter({ bits: 24, gainsDb: [-0.3, 0.4], inverted: [true, false], lowPass: { cutoffHz: 16000, order: 6 }, noiseDbfs: -96, clockPpm: -90, crosstalk: [{ from: 1, into: 0, db: -84 }], delaySamples: [31, 0], seed: 14 }) },
  { rate: 48000, converter: converter({ bits: 16, gainsDb: [0.5], lowPass: { cutoffHz: 20000, order: 8 }, noiseDbfs: -74, clockPpm: 200, leadSec: 5, seed: 21 }) },
  { rate: 48000, converter: converter({ bits: 16, gainsDb: [-0.2, -0.9], inverted: [false, true], lowPass: { cutoffHz: 15000, order: 4 }, noiseDbfs: -90, clockPpm: -60, crosstalk: [{ from: 0, into: 1, db: -75 }], delaySamples: [0, 45], seed: 22 }) },
  { rate: 48000, converter: converter({ bits: 24, gainsDb: [0.1], lowPass: { cutoffHz: 19000, order: 6 }, noiseDbfs: -110, clockPpm: -150, secondOrder: 0.0005, seed: 23 }) },
  { rate: 48000, converter: converter({ bits: 24, gainsDb: [-0.5, 0.25], inverted: [false, true], lowPass: { cutoffHz: 18000, order: 4 }, noiseDbfs: -70, clockPpm: 75, crosstalk: [{ from: 0, into: 1, db: -62 }], delaySamples: [0, 12], leadSec: 7, seed: 24 }) },
];

describe('converter check at 44.1 and 48 kHz: planted converter impairments are recovered', () => {
  it.each(cases)('$rate Hz, $converter.bits-bit, $converter.gainsDb.length channel(s), $converter.clockPpm ppm', async (testCase) => {
    const report = await analyzeConverterCheckFile(await recordThroughConverter(testCase, temp.path));
    expect(outOfTolerance(comparePlanted(report, testCase))).toEqual([]);
  });

  it('works end to end through the command line: --make-converter-signal, then --converter-check --json', async () => {
    const testCase: AcceptanceCase = { rate: 48000, converter: converter({ bits: 24, gainsDb: [-0.7, 0.3], inverted: [true, false], lowPass: { cutoffHz: 16500, order: 6 }, noiseDbfs: -94, clockPpm: -170, crosstalk: [{ from: 0, into: 1, db: -72 }], delaySamples: [0, 38], leadSec: 8, seed: 51 }) };
    const signal = temp.path('cli-signal.wav');
    const written = cli('--make-converter-signal', signal, '--rate', '48000', '--bits', '24', '--channels', '2');
    expect(written.status, written.stderr).toBe(0);
    expect(written.stderr).toMatch(/line inputs, not into monitors or headphones/);
    const run = cli('--converter-check', await recordThroughConverter(testCase, temp.path, signal), '--json');
    expect(run.status, run.stderr).toBe(0);
    const report = JSON.parse(run.stdout) as ConverterReport;
    expect(report.levelReference).toMatch(/full-scale sine reads 0 dB FS/);
    expect(outOfTolerance(comparePlanted(report, testCase))).toEqual([]);
    expect(report.findings.map((finding) => finding.check)).toEqual(expect.arrayContaining(['polarity', 'clock', 'delay', 'band-edge', 'crosstalk']));
  });
});
