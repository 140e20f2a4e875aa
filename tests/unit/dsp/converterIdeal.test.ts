import { afterAll, describe, expect, it } from 'vitest';
import { analyzeConverterCheckFile } from '../../../dsp/converter/analyzeCheck';
import { writeCheckSignalFile } from '../../../dsp/converter/signalWriter';
import { tempDirectory } from '../../support/tempFiles';

/**
 * The check signal analysed as written — a perfect converter — against the ideal quantiser:
 * IEEE 1241 / textbook SINAD of a full-scale sine = 20·log10(2^N·√1.5) = 6.02·N + 1.76 dB, and
 * TPDF dither adds Q²/6 to the rounding error's Q²/12 (Lipshitz, Wannamaker & Vanderkooy, JAES
 * 1992): 10·log10(3) = 4.77 dB less. ENOB = (SINAD − 1.76) / 6.02 (IEEE 1241).
 */

const temp = tempDirectory();
afterAll(() => temp.remove());

const idealSinad = (bits: number) => 20 * Math.log10(2 ** bits * Math.sqrt(1.5));
const TPDF_PENALTY_DB = 10 * Math.log10(3);

describe('converter check against the ideal quantiser', () => {
  it.each([
    { bits: 16 as const, dither: false, channels: 1 },
    { bits: 16 as const, dither: true, channels: 1 },
    { bits: 24 as const, dither: false, channels: 1 },
    { bits: 24 as const, dither: true, channels: 2 },
  ])('$bits-bit, dither $dither: SINAD and ENOB of the ideal quantiser', async ({ bits, dither, channels }) => {
    const path = temp.path(`ideal-${bits}-${dither}.wav`);
    await writeCheckSignalFile(path, { sampleRate: 48000, bitsPerSample: bits, channels }, { dither });
    const report = await analyzeConverterCheckFile(path);
    const sinad = idealSinad(bits) - (dither ? TPDF_PENALTY_DB : 0);
    for (const channel of report.channels) {
      expect(Math.abs(channel.sinadDb! - sinad)).toBeLessThanOrEqual(0.1);
      expect(Math.abs(channel.enobBits! - (sinad - 1.76) / 6.02)).toBeLessThanOrEqual(0.02);
      // A perfect wire: no gain error, no clock error, flat, digital silence when idle.
      expect(Math.abs(channel.gainDb!)).toBeLessThanOrEqual(0.001);
      expect(channel.polarityInverted).toBe(false);
      expect(channel.passbandDeviationDb!).toBeLessThanOrEqual(0.01);
      expect(channel.bandEdgeHz).toBeNull();
      expect(channel.noiseFloorDbfs).toBeNull();
      expect(channel.delaySamples).toBe(0);
    }
    expect(Math.abs(report.clockErrorPpm!)).toBeLessThanOrEqual(0.01);
    expect(report.signal).toMatchObject({ writtenSampleRate: 48000, writtenBits: bits });
    if (channels > 1) expect(report.crosstalkDb).toBe(-200);
    expect(report.findings.filter((finding) => finding.severity !== 'info')).toEqual([]);
  });

  // AES17 dynamic range with TPDF dither: the error power Q²/4 spread evenly up to 24 kHz, of which
  // 20 Hz–20 kHz is measured, referred to a full-scale sine: 94.1 dB for 16 bits at 48 kHz.
  it('gives the 16-bit TPDF dynamic range of 94.1 dB at 48 kHz', async () => {
    const path = temp.path('ideal-dr-16.wav');
    await writeCheckSignalFile(path, { sampleRate: 48000, bitsPerSample: 16, channels: 1 });
    const report = await analyzeConverterCheckFile(path);
    const expected = 10 * Math.log10(0.5 / ((2 ** -30 / 4) * ((20000 - 20) / 24000)));
    expect(expected).toBeCloseTo(94.1, 1);
    expect(Math.abs(report.channels[0].dynamicRangeDb! - expected)).toBeLessThanOrEqual(0.2);
  });
});
