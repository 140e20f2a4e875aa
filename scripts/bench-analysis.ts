/**
 * Benchmark: Takeproof's full analysis (the compiled command line, start-up included) of a
 * one-hour stereo 48 kHz 24-bit take against ffmpeg's ebur128=peak=true (loudness + true peak)
 * pass and sox's stats pass, side by side in one run; then the same against ffmpeg on every take
 * of one minute or more in the evaluation corpus. Prints wall time, real-time factor, CPU time,
 * peak RSS and the ratios. The takes are generated once and cached under var/bench/ and var/eval/.
 *
 *   npm run bench   (-- --minutes 10 for a shorter take, -- --runs 3 for more runs, -- --no-corpus)
 */
import { spawn, spawnSync } from 'node:child_process';
import { existsSync, readFileSync, statSync } from 'node:fs';
import { loadavg } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { once } from 'node:events';
import type { WavLayout } from '../tests/support/wavWriter';
import { generateProgrammeTake } from './benchTakes';
import { buildTake } from './eval/build';
import { ALL_TAKES } from './eval/allTakes';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const layout: WavLayout = { sampleRate: 48000, channels: 2, coding: 'pcm24' };

interface RunFigures {
  wallSec: number;
  /** User + system CPU time of all the process's threads, seconds (last sample before exit). */
  cpuSec: number | null;
  peakRssMb: number | null;
  exitCode: number | null;
}

/** Clock ticks per second of /proc/<pid>/stat times (USER_HZ, 100 on Linux). */
const USER_HZ = 100;

/** Runs a command, polling /proc/<pid>/status VmHWM (the kernel's peak RSS) while it runs. */
async function timeCommand(command: string, args: string[], captureStdout = false): Promise<RunFigures & { stdout: string }> {
  const started = process.hrtime.bigint();
  const child = spawn(command, args, { stdio: ['ignore', captureStdout ? 'pipe' : 'ignore', 'ignore'] });
  let stdout = '';
  child.stdout?.on('data', (data) => (stdout += data));
  let peakKb: number | null = null;
  let cpuTicks: number | null = null;
  const poll = setInterval(() => {
    try {
      const match = /VmHWM:\s+(\d+) kB/.exec(readFileSync(`/proc/${child.pid}/status`, 'utf8'));
      if (match) peakKb = Math.max(peakKb ?? 0, Number(match[1]));
      // Fields 14 and 15 of /proc/<pid>/stat (after the parenthesised name): utime and stime, in ticks.
      const fields = readFileSync(`/proc/${child.pid}/stat`, 'utf8').split(') ')[1].split(' ');
      cpuTicks = Number(fields[11]) + Number(fields[12]);
    } catch {
      // The process has just exited.
    }
  }, 20);
  const [exitCode] = (await once(child, 'exit')) as [number | null];
  clearInterval(poll);
  const wallSec = Number(process.hrtime.bigint() - started) / 1e9;
  return { wallSec, cpuSec: cpuTicks === null ? null : cpuTicks / USER_HZ, peakRssMb: peakKb === null ? null : peakKb / 1024, exitCode, stdout };
}

/** The compiled command line, as `npm run analyze` runs it. */
const CLI = join(root, 'var', 'build', 'cli.mjs');

/** Takeproof's full analysis of one file: wall, CPU (all threads) and peak RSS of the whole process, start-up included. */
async function timeOurs(path: string) {
  const run = await timeCommand(process.execPath, [CLI, '--json', path], true);
  const report = JSON.parse(run.stdout) as { file: { durationSec: number }; loudness: { integratedLufs: number | null }; peak: { truePeakDbtp: number | null } };
  return { ...run, report };
}

const ffmpegArgs = (path: string) => ['-hide_banner', '-nostats', '-i', path, '-af', 'ebur128=peak=true', '-f', 'null', '-'];

/** The evaluation corpus takes of at least a minute, each against ffmpeg, one run each (interleaved). */
async function corpusTable(): Promise<void> {
  process.stdout.write(`\nEvaluation corpus, takes of one minute or more (building missing takes in var/eval/ first) ...\n`);
  const rows: { id: string; seconds: number; ours: number; ffmpeg: number }[] = [];
  for (const take of ALL_TAKES) {
    const path = buildTake(take, join(root, 'var', 'eval'));
    const ours = await timeOurs(path);
    if (ours.report.file.durationSec < 60) continue;
    await timeCommand('cat', [path]);
    const ffmpeg = await timeCommand('ffmpeg', ffmpegArgs(path));
    rows.push({ id: take.id, seconds: ours.report.file.durationSec, ours: ours.wallSec, ffmpeg: ffmpeg.wallSec });
  }
  process.stdout.write(`${'take'.padEnd(36)}${'length s'.padStart(10)}${'takeproof s'.padStart(13)}${'ffmpeg s'.padStart(10)}${'ratio'.padStart(8)}\n`);
  for (const r of rows) {
    process.stdout.write(`${r.id.padEnd(36)}${r.seconds.toFixed(0).padStart(10)}${r.ours.toFixed(2).padStart(13)}${r.ffmpeg.toFixed(2).padStart(10)}${(r.ours / r.ffmpeg).toFixed(2).padStart(8)}\n`);
  }
  const worst = rows.reduce((max, r) => Math.max(max, r.ours / r.ffmpeg), 0);
  process.stdout.write(rows.length ? `worst ratio ${worst.toFixed(2)} over ${rows.length} takes (target <= 1.0)\n` : 'no take of one minute or more in the corpus\n');
}

async function main(): Promise<void> {
  const minutesIndex = process.argv.indexOf('--minutes');
  const minutes = minutesIndex >= 0 ? Number(process.argv[minutesIndex + 1]) : 60;
  const seconds = Math.round(minutes * 60);
  const path = join(root, 'var', 'bench', `programme-${minutes}min-48k-24bit-stereo.wav`);
  if (!existsSync(path)) {
    process.stdout.write(`Generating ${minutes} min take (once) ...\n`);
    await generateProgrammeTake(path, seconds, layout);
  }
  const sizeMb = statSync(path).size / 1e6;
  process.stdout.write(`Take: ${minutes} min stereo 48 kHz 24-bit, ${sizeMb.toFixed(0)} MB\n`);
  // Warm the page cache so every tool reads from memory alike.
  await timeCommand('cat', [path]);

  spawnSync(process.execPath, [join(root, 'scripts', 'build-engine.mjs')], { stdio: 'inherit' });
  // Each tool runs `runs` times, interleaved, and its fastest run counts: other load on the
  // machine only ever slows a run down, so the minimum is the fairest figure of each.
  const runsIndex = process.argv.indexOf('--runs');
  const runs = runsIndex >= 0 ? Math.max(1, Number(process.argv[runsIndex + 1])) : 2;
  const best = <T extends RunFigures>(current: T | null, next: T) => (current === null || next.wallSec < current.wallSec ? next : current);
  let ours: Awaited<ReturnType<typeof timeOurs>> | null = null;
  let ffmpeg: RunFigures | null = null;
  let sox: RunFigures | null = null;
  let peakRssMb = 0;
  for (let run = 0; run < runs; run++) {
    const analysis = await timeOurs(path);
    peakRssMb = Math.max(peakRssMb, analysis.peakRssMb ?? 0);
    ours = best(ours, analysis);
    ffmpeg = best(ffmpeg, await timeCommand('ffmpeg', ffmpegArgs(path)));
    sox = best(sox, await timeCommand('sox', [path, '-n', 'stats']));
  }
  const { report } = ours!;

  const rows: [string, RunFigures][] = [
    ['takeproof (full analysis)', { ...ours!, peakRssMb }],
    ['ffmpeg ebur128=peak=true', ffmpeg!],
    ['sox stats', sox!],
  ];
  process.stdout.write(`Fastest of ${runs} interleaved runs each; load average at the end: ${loadavg().map((load) => load.toFixed(1)).join(' ')}\n`);
  process.stdout.write(`\n${'tool'.padEnd(28)}${'wall s'.padStart(9)}${'x real time'.padStart(13)}${'CPU s'.padStart(9)}${'peak RSS MB'.padStart(13)}\n`);
  for (const [name, figures] of rows) {
    const rss = figures.peakRssMb === null ? '-' : figures.peakRssMb.toFixed(0);
    const cpu = figures.cpuSec === null ? '-' : figures.cpuSec.toFixed(2);
    process.stdout.write(`${name.padEnd(28)}${figures.wallSec.toFixed(2).padStart(9)}${(seconds / figures.wallSec).toFixed(0).padStart(13)}${cpu.padStart(9)}${rss.padStart(13)}${figures.exitCode === 0 ? '' : `  (exit ${figures.exitCode})`}\n`);
  }
  process.stdout.write(`\ntakeproof / ffmpeg ebur128: ${(ours!.wallSec / ffmpeg!.wallSec).toFixed(2)} (target <= 0.5)\n`);
  process.stdout.write(`takeproof / sox stats:      ${(ours!.wallSec / sox!.wallSec).toFixed(2)}\n`);
  process.stdout.write(`takeproof peak RSS:         ${rows[0][1].peakRssMb!.toFixed(0)} MB (target < 250 MB)\n`);
  process.stdout.write(`integrated ${report.loudness.integratedLufs} LUFS, true peak ${report.peak.truePeakDbtp} dBTP\n`);
  await startUp();
  if (!process.argv.includes('--no-corpus')) await corpusTable();
}

/** Start-up of the compiled command line (it answers a call without a file with its usage), best of 5, beside bare Node. */
async function startUp(): Promise<void> {
  let cli: RunFigures | null = null;
  let bare: RunFigures | null = null;
  for (let i = 0; i < 5; i++) {
    const a = await timeCommand(process.execPath, [join(root, 'scripts', 'analyze.mjs')]);
    const b = await timeCommand(process.execPath, ['-e', '0']);
    if (!cli || a.wallSec < cli.wallSec) cli = a;
    if (!bare || b.wallSec < bare.wallSec) bare = b;
  }
  process.stdout.write(`command line start-up (npm run analyze without npm): ${cli!.wallSec.toFixed(2)} s wall, ${cli!.cpuSec?.toFixed(2) ?? '-'} s CPU (target < 0.3 s); bare node: ${bare!.wallSec.toFixed(2)} s\n`);
}

main().catch((error) => {
  process.stderr.write(`${error instanceof Error ? error.stack : String(error)}\n`);
  process.exitCode = 1;
});
