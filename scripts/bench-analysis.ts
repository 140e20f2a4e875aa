/**
 * Benchmark: Takeproof's full analysis of a one-hour stereo 48 kHz 24-bit take
 * against ffmpeg's ebur128 (loudness + true peak) pass and sox's stats pass.
 * Prints wall time, real-time factor and peak RSS of each. The take is
 * generated once and cached under var/bench/.
 *
 *   npm run bench            (add -- --minutes 10 for a shorter take, -- --runs 3 for more runs)
 */
import { spawn } from 'node:child_process';
import { createWriteStream, existsSync, readFileSync, statSync } from 'node:fs';
import { mkdir, rename } from 'node:fs/promises';
import { loadavg } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { once } from 'node:events';
import { ProgrammeGenerator } from '../tests/support/testSignals';
import { encodeSamples, streamingHeader, type WavLayout } from '../tests/support/wavWriter';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const layout: WavLayout = { sampleRate: 48000, channels: 2, coding: 'pcm24' };

async function generateTake(path: string, seconds: number): Promise<void> {
  await mkdir(dirname(path), { recursive: true });
  const frames = seconds * layout.sampleRate;
  const partial = `${path}.partial`;
  const out = createWriteStream(partial);
  out.write(streamingHeader(layout, frames * 6));
  const generator = new ProgrammeGenerator(layout.sampleRate, layout.channels, 2024);
  const blockFrames = 48000;
  const block = [new Float64Array(blockFrames), new Float64Array(blockFrames)];
  for (let done = 0; done < frames; done += blockFrames) {
    const n = Math.min(blockFrames, frames - done);
    generator.fill(block, n);
    if (!out.write(encodeSamples(block, layout.coding, 0, n))) await once(out, 'drain');
  }
  out.end();
  await once(out, 'finish');
  await rename(partial, path);
}

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

async function childMain(path: string): Promise<void> {
  const { analyzeFile } = await import('../dsp/pipeline');
  const started = process.hrtime.bigint();
  const report = await analyzeFile(path);
  const analysisSec = Number(process.hrtime.bigint() - started) / 1e9;
  const usage = process.resourceUsage();
  // maxRSS in kilobytes, CPU times in microseconds (getrusage), all threads included.
  const cpuSec = (usage.userCPUTime + usage.systemCPUTime) / 1e6;
  process.stdout.write(JSON.stringify({ analysisSec, cpuSec, maxRssKb: usage.maxRSS, integrated: report.loudness.integratedLufs, truePeak: report.peak.truePeakDbtp }));
}

async function main(): Promise<void> {
  const childIndex = process.argv.indexOf('--child');
  if (childIndex >= 0) return childMain(process.argv[childIndex + 1]);
  const minutesIndex = process.argv.indexOf('--minutes');
  const minutes = minutesIndex >= 0 ? Number(process.argv[minutesIndex + 1]) : 60;
  const seconds = Math.round(minutes * 60);
  const path = join(root, 'var', 'bench', `programme-${minutes}min-48k-24bit-stereo.wav`);
  if (!existsSync(path)) {
    process.stdout.write(`Generating ${minutes} min take (once) ...\n`);
    await generateTake(path, seconds);
  }
  const sizeMb = statSync(path).size / 1e6;
  process.stdout.write(`Take: ${minutes} min stereo 48 kHz 24-bit, ${sizeMb.toFixed(0)} MB\n`);
  // Warm the page cache so every tool reads from memory alike.
  await timeCommand('cat', [path]);

  const tsx = join(root, 'node_modules', '.bin', 'tsx');
  // Each tool runs `runs` times, interleaved, and its fastest run counts: other load on the
  // machine only ever slows a run down, so the minimum is the fairest figure of each.
  const runsIndex = process.argv.indexOf('--runs');
  const runs = runsIndex >= 0 ? Math.max(1, Number(process.argv[runsIndex + 1])) : 2;
  const best = <T extends RunFigures>(current: T | null, next: T) => (current === null || next.wallSec < current.wallSec ? next : current);
  let ours: (RunFigures & { stdout: string }) | null = null;
  let ffmpeg: RunFigures | null = null;
  let sox: RunFigures | null = null;
  let peakRssMb = 0;
  for (let run = 0; run < runs; run++) {
    const analysis = await timeCommand(tsx, [fileURLToPath(import.meta.url), '--child', path], true);
    const inside = JSON.parse(analysis.stdout) as { maxRssKb: number; cpuSec: number };
    peakRssMb = Math.max(peakRssMb, analysis.peakRssMb ?? 0, inside.maxRssKb / 1024);
    ours = best(ours, { ...analysis, cpuSec: inside.cpuSec });
    ffmpeg = best(ffmpeg, await timeCommand('ffmpeg', ['-hide_banner', '-nostats', '-i', path, '-af', 'ebur128=peak=true', '-f', 'null', '-']));
    sox = best(sox, await timeCommand('sox', [path, '-n', 'stats']));
  }
  const inner = JSON.parse(ours!.stdout) as { analysisSec: number; maxRssKb: number; integrated: number; truePeak: number };

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
  process.stdout.write(`\ntakeproof analysis alone (inside the process, without start-up): ${inner.analysisSec.toFixed(2)} s\n`);
  process.stdout.write(`takeproof / ffmpeg ebur128: ${(ours!.wallSec / ffmpeg!.wallSec).toFixed(2)} (target <= 1.0)\n`);
  process.stdout.write(`takeproof / sox stats:      ${(ours!.wallSec / sox!.wallSec).toFixed(2)}\n`);
  process.stdout.write(`takeproof peak RSS:         ${rows[0][1].peakRssMb!.toFixed(0)} MB (target < 250 MB)\n`);
  process.stdout.write(`integrated ${inner.integrated} LUFS, true peak ${inner.truePeak} dBTP\n`);
}

main().catch((error) => {
  process.stderr.write(`${error instanceof Error ? error.stack : String(error)}\n`);
  process.exitCode = 1;
});
