import { afterAll, describe, expect, it } from 'vitest';
import { aWeightingDb } from '../../../dsp/converter/aWeighting';
import { analyzeConverterCheckFile } from '../../../dsp/converter/analyzeCheck';
import { checkSignalLayout, sectionNamed } from '../../../dsp/converter/checkSignal';
import { checkSignalWav } from '../../../dsp/converter/signalWriter';
import { tempDirectory } from '../../support/tempFiles';
import { decodeWav } from '../../support/wavStreams';
import { encodeSamples, wavFile } from '../../support/wavWriter';

const temp = tempDirectory();
afterAll(() => temp.remove());

/**
 * IEC 61672-1 A-weighting table at the exact base-10 frequencies 1000·10^(n/10) Hz, tabulated to
 * 0.1 dB (as reproduced by third-octave.com and lichtbeeldgeluid.nl).
 */
const IEC_61672_A_DB: [number, number][] = [
  [-20, -70.4], [-19, -63.4], [-18, -56.7], [-17, -50.5], [-16, -44.7], [-15, -39.4], [-14, -34.6], [-13, -30.2], [-12, -26.2],
  [-11, -22.5], [-10, -19.1], [-9, -16.1], [-8, -13.4], [-7, -10.9], [-6, -8.6], [-5, -6.6], [-4, -4.8], [-3, -3.2], [-2, -1.9],
  [-1, -0.8], [0, 0.0], [1, 0.6], [2, 1.0], [3, 1.2], [4, 1.3], [5, 1.2], [6, 1.0], [7, 0.5], [8, -0.1], [9, -1.1], [10, -2.5],
  [11, -4.3], [12, -6.6], [13, -9.3],
];

describe('A-weighting (IEC 61672)', () => {
  it.each(IEC_61672_A_DB)('10^(%i/10) kHz reads the tabulated %f dB within rounding', (n, tabulated) => {
    expect(Math.abs(aWeightingDb(1000 * 10 ** (n / 10)) - tabulated)).toBeLessThanOrEqual(0.06);
  });

  // A tone of known level in the idle section: the unweighted idle level reads the tone, the
  // A-weighted one reads it plus the table's weighting at that frequency.
  it.each([
    [-10, -19.1],
    [0, 0.0],
    [10, -2.5],
  ])('a −50 dB FS tone at 10^(%i/10) kHz in the idle section reads %f dB A-weighted', async (n, tabulated) => {
    const rate = 48000;
    const hz = 1000 * 10 ** (n / 10);
    const { channels } = await decodeWav(checkSignalWav({ sampleRate: rate, bitsPerSample: 24, channels: 1 }), 1 << 20);
    const idle = sectionNamed(checkSignalLayout(1), 'idle');
    const from = Math.round((idle.startSec + 0.1) * rate);
    const to = Math.round((idle.startSec + idle.durationSec - 0.1) * rate);
    for (let i = from; i < to; i++) channels[0][i] = 10 ** (-50 / 20) * Math.sin((2 * Math.PI * hz * (i - from)) / rate);
    const path = temp.write(`idle-tone-${n}.wav`, wavFile({ sampleRate: rate, channels: 1, coding: 'pcm24' }, encodeSamples(channels, 'pcm24')));
    const report = await analyzeConverterCheckFile(path);
    expect(report.channels[0].noiseFloorDbfs!).toBeCloseTo(-50, 1);
    expect(Math.abs(report.channels[0].noiseFloorDbfsA! - (-50 + tabulated))).toBeLessThanOrEqual(0.1);
  });
});
