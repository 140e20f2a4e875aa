import { afterAll, describe, expect, it } from 'vitest';
import { analyzeConverterCheckFile } from '../../../dsp/converter/analyzeCheck';
import { comparePlanted, outOfTolerance, recordThroughConverter, simulatedConverter as converter, type AcceptanceCase } from '../../support/converterAcceptance';
import { tempDirectory } from '../../support/tempFiles';

/**
 * Acceptance at 96 kHz and with more than two channels (the method and its sources:
 * converterCheck.test.ts and tests/support/converterSimulation.ts).
 */

const temp = tempDirectory();
afterAll(() => temp.remove());

const cases: AcceptanceCase[] = [
  { rate: 96000, converter: converter({ bits: 16, gainsDb: [-0.8], lowPass: { cutoffHz: 30000, order: 6 }, noiseDbfs: -86, clockPpm: 180, seed: 31 }) },
  { rate: 96000, converter: converter({ bits: 16, gainsDb: [0.3, 0], inverted: [true, true], lowPass: { cutoffHz: 22000, order: 8 }, noiseDbfs: -78, clockPpm: -110, crosstalk: [{ from: 1, into: 0, db: -70 }], delaySamples: [0, 60], seed: 32 }) },
  { rate: 96000, converter: converter({ bits: 24, gainsDb: [-0.1], lowPass: { cutoffHz: 40000, order: 8 }, noiseDbfs: -108, clockPpm: 50, secondOrder: 0.001, seed: 33 }) },
  { rate: 96000, converter: converter({ bits: 24, gainsDb: [0.4, -0.35], inverted: [false, true], lowPass: { cutoffHz: 25000, order: 4 }, noiseDbfs: -100, clockPpm: -200, crosstalk: [{ from: 0, into: 1, db: -88 }], delaySamples: [25, 0], leadSec: 5.5, seed: 34 }) },
  // More than two channels: crosstalk out of channel 1 into each other channel, delays against channel 1.
  {
    rate: 48000,
    converter: converter({
      bits: 24, gainsDb: [0, -0.3, 0.2, -0.6], inverted: [false, false, true, false], noiseDbfs: -98, clockPpm: 140,
      crosstalk: [{ from: 0, into: 1, db: -66 }, { from: 0, into: 2, db: -78 }, { from: 0, into: 3, db: -90 }], delaySamples: [0, 12, 0, 27], seed: 41,
    }),
  },
];

describe('converter check at 96 kHz and on four channels: planted converter impairments are recovered', () => {
  it.each(cases)('$rate Hz, $converter.bits-bit, $converter.gainsDb.length channel(s), $converter.clockPpm ppm', async (testCase) => {
    const report = await analyzeConverterCheckFile(await recordThroughConverter(testCase, temp.path));
    expect(outOfTolerance(comparePlanted(report, testCase))).toEqual([]);
    if (testCase.converter.gainsDb.length > 2) {
      // Each leak out of channel 1 is seen in the channel it reaches.
      for (const path of testCase.converter.crosstalk) {
        const planted = path.db + testCase.converter.gainsDb[path.into] - testCase.converter.gainsDb[path.from];
        expect(Math.abs(report.channels[path.into].crosstalkIntoDb! - planted)).toBeLessThanOrEqual(2);
      }
    }
  });
});
