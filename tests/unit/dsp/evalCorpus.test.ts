import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { reasonOf } from '../../../dsp/findings';
import { analyzeFile } from '../../../dsp/pipeline';
import { buildTake } from '../../../scripts/eval/build';
import { ALL_CLEAN_TAKES, ALL_FAULT_TAKES } from '../../../scripts/eval/allTakes';
import { faultFound, falseAlarms } from '../../../scripts/eval/score';

/**
 * The quick slice of the evaluation corpus (`npm run eval` runs all of it): realistic clean takes made
 * with general tools (espeak-ng speech in several voices, rates and levels, two-mic conversations,
 * sox music-like material, ambience, room tone, 5.1, poly with iXML), and planted faults of stated size.
 * Sources of the checks: clipping, dropouts, DC, dead channels, polarity, NaN and float over-range
 * [common practice]; true peak ITU-R BS.1770-4 Annex 2 with the EBU R 128 limit; loudness ITU-R BS.1770-4 /
 * EBU Tech 3341; 997 Hz tone AES17 / IEC 61606; effective bits per WAVEFORMATEXTENSIBLE (unused low bits zero);
 * noise floor, hum, bandwidth and aliasing [common practice] (dense masters, sweeps and tone-only takes among the clean).
 */
const FOLDER = join('var', 'eval');

describe('clean takes: no warning or failure beyond comparisons with the delivery spec', () => {
  it.each(ALL_CLEAN_TAKES.filter((take) => take.slice).map((take) => [take.id, take] as const))('%s', async (_, take) => {
    const report = await analyzeFile(buildTake(take, FOLDER));
    expect(falseAlarms(report).map((finding) => finding.message)).toEqual([]);
    if (take.id.startsWith('poly')) {
      expect(report.file.layout).toBe('poly');
      expect(report.channels.slice(0, 5).map((channel) => channel.name)).toEqual(['MixL', 'MixR', 'Boom', 'Lav Anna', 'Lav Ben']);
      expect(report.channels.slice(0, 5).every((channel) => channel.integratedLufs !== null)).toBe(true);
      expect(report.loudness.integratedLufs).toBeNull();
    }
    if (take.id.startsWith('surround')) expect(report.channels.map((channel) => channel.name)).toEqual(['L', 'R', 'C', 'LFE', 'Ls', 'Rs']);
  });
});

describe('planted faults: each found at the right time and on the right channel', () => {
  it.each(ALL_FAULT_TAKES.filter((take) => take.slice).map((take) => [take.id, take] as const))('%s', async (_, take) => {
    const report = await analyzeFile(buildTake(take, FOLDER));
    expect(faultFound(take, report), `${take.description}: ${report.findings.map((finding) => finding.message).join(' | ')}`).toBe(true);
    const reason = reasonOf(report.findings);
    expect(reason).not.toBeNull();
    expect(reason!.length).toBeLessThanOrEqual(90);
  });
});
