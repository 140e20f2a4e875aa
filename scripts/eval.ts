/**
 * `npm run eval`: builds the evaluation corpus under var/eval/ (espeak-ng speech, sox music-like
 * material and noise; clean takes and takes with one planted fault each), analyses every take,
 * and prints per check: faults planted, found at the right time and channel, missed, and false
 * alarms on the clean takes; then the analysis time per take against ffmpeg's ebur128=peak=true
 * (loudness and true peak only) on the same files.
 * Options: --slice (only the takes `npm test` uses), --verbose (every take's alarms).
 */
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { analyzeFile } from '../dsp/pipeline';
import type { AnalysisReport } from '../dsp/types';
import { buildTake } from './eval/build';
import { ALL_TAKES } from './eval/allTakes';
import type { EvalTake } from './eval/corpus';
import { faultFound, falseAlarms, otherAlarms, rowOf } from './eval/score';

/** Rows of the table, each with the source of its check. */
const ROWS: [string, string][] = [
  ['clipping below full scale', 'flat tops at one level [common practice]'],
  ['clipping at full scale', '>= 3 samples at the top codes [common practice]'],
  ['true-peak over', 'ITU-R BS.1770-4 Annex 2; limit EBU R 128'],
  ['dropout', 'digital silence inside programme [common practice]'],
  ['DC offset', 'mean of the quiet windows [common practice]'],
  ['dead channel (digital zero)', 'EBU QC silence item; level [common practice]'],
  ['dead channel (open-input hiss)', 'steady noise, no programme; white hiss beside programme [common practice]'],
  ['polarity inversion', 'coherence-weighted cross-correlation (Carter 1973); a coincident centre in phase wins [common practice]'],
  ['hum under speech', 'mains harmonics over the floor [common practice]'],
  ['low bandwidth / upsampled', 'spectral cut-off vs declared rate [common practice]'],
  ['16-bit audio in a 24-bit file', 'unused low bits (WAVEFORMATEXTENSIBLE)'],
  ['wrong declared rate (tone)', '997 Hz tone (AES17, IEC 61606)'],
  ['NaN / infinite samples', 'IEEE 754 float coding [common practice]'],
  ['float over full scale', 'float beyond 1.0 [common practice]'],
  ['loudness outside the target', 'ITU-R BS.1770-4, EBU R 128 / Tech 3341'],
  ['noise floor', 'quietest windows [common practice]'],
];

interface Outcome {
  take: EvalTake;
  report: AnalysisReport;
  analyseMs: number;
  ffmpegMs: number;
}

function ffmpegMs(path: string): number {
  const started = process.hrtime.bigint();
  const run = spawnSync('ffmpeg', ['-hide_banner', '-nostats', '-i', path, '-af', 'ebur128=peak=true', '-f', 'null', '-'], { encoding: 'utf8' });
  if (run.status !== 0) throw new Error(`ffmpeg failed on ${path}: ${run.stderr.slice(-300)}`);
  return Number(process.hrtime.bigint() - started) / 1e6;
}

async function main(): Promise<void> {
  const slice = process.argv.includes('--slice');
  const verbose = process.argv.includes('--verbose');
  const folder = join('var', 'eval');
  const takes = ALL_TAKES.filter((take) => !slice || take.slice);
  const outcomes: Outcome[] = [];
  for (const [index, take] of takes.entries()) {
    process.stderr.write(`\r[${index + 1}/${takes.length}] ${take.id.padEnd(40)}`);
    const path = buildTake(take, folder);
    const started = process.hrtime.bigint();
    const report = await analyzeFile(path);
    const analyseMs = Number(process.hrtime.bigint() - started) / 1e6;
    outcomes.push({ take, report, analyseMs, ffmpegMs: ffmpegMs(path) });
  }
  process.stderr.write('\n');

  const rows = new Map(ROWS.map(([row, source]) => [row, { source, planted: 0, found: 0, missed: [] as string[], falseAlarms: [] as string[] }]));
  const rowFor = (name: string) => {
    if (!rows.has(name)) rows.set(name, { source: 'other', planted: 0, found: 0, missed: [], falseAlarms: [] });
    return rows.get(name)!;
  };
  const clean = outcomes.filter((outcome) => !outcome.take.expect);
  for (const { take, report } of clean) for (const finding of falseAlarms(report)) rowFor(rowOf(finding, report)).falseAlarms.push(`${take.id}: ${finding.message}`);
  const others: string[] = [];
  for (const { take, report } of outcomes.filter((outcome) => outcome.take.expect)) {
    const row = rowFor(take.row!);
    row.planted++;
    if (faultFound(take, report)) row.found++;
    else row.missed.push(`${take.id} (${take.description}): ${report.findings.map((f) => `[${f.severity}] ${f.message}`).join(' | ') || 'no findings'}`);
    for (const finding of otherAlarms(take, report)) others.push(`${take.id}: [${finding.severity}] ${finding.message}`);
  }

  console.log(`\nTakeproof evaluation: ${clean.length} clean takes, ${outcomes.length - clean.length} takes with a planted fault${slice ? ' (quick slice)' : ''}\n`);
  console.log('| check | source | planted | found | missed | false alarms on clean takes |');
  console.log('|---|---|---|---|---|---|');
  for (const [name, row] of rows) {
    if (row.planted === 0 && row.falseAlarms.length === 0 && !ROWS.some(([known]) => known === name)) continue;
    console.log(`| ${name} | ${row.source} | ${row.planted} | ${row.found} | ${row.missed.length} | ${row.falseAlarms.length} |`);
  }
  const total = (pick: (outcome: Outcome) => number) => outcomes.reduce((sum, outcome) => sum + pick(outcome), 0);
  const audioSec = total((outcome) => outcome.report.file.durationSec);
  const analyse = total((outcome) => outcome.analyseMs);
  const ffmpeg = total((outcome) => outcome.ffmpegMs);
  console.log(`\nTime per take (${outcomes.length} takes, ${audioSec.toFixed(0)} s of audio): Takeproof full analysis ${(analyse / outcomes.length).toFixed(0)} ms, ffmpeg ebur128=peak=true ${(ffmpeg / outcomes.length).toFixed(0)} ms; ratio ${(analyse / ffmpeg).toFixed(2)}.`);

  for (const [name, row] of rows) {
    for (const miss of row.missed) console.log(`\nMISSED ${name}: ${miss}`);
    for (const alarm of row.falseAlarms) console.log(`\nFALSE ALARM ${name}: ${alarm}`);
  }
  if (others.length > 0) console.log(`\nOther warnings on takes with a planted fault (not counted above):\n${others.map((line) => `  ${line}`).join('\n')}`);
  if (verbose) for (const { take, report } of outcomes) console.log(`\n${take.id}: ${report.findings.map((f) => `[${f.severity}] ${f.message}`).join('\n  ')}`);
}

main().catch((error) => {
  console.error(error instanceof Error ? error.message : error);
  process.exit(1);
});
