/**
 * Throughput as workers are added: uploads the same generated batch of takes (stereo and 8-track,
 * 48 kHz/24-bit, through the upload service as the web server runs it) once per worker count,
 * then starts that many compiled workers and waits until every take is measured.
 * Prints: workers, audio hours measured per wall-clock hour, takes per minute, queue wait
 * p50/p95 (from the moment the workers start until a worker claims the take), peak RSS and CPU
 * time per worker. Run by scripts/bench-scale.sh (its own MariaDB and storage).
 *
 *   npm run bench:scale   (-- --workers 1,2,4 to choose the counts)
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync, openAsBlob, readFileSync } from 'node:fs';
import os from 'node:os';
import { join } from 'node:path';
import { Op } from 'sequelize';
import { db } from '@/lib/db/connection.server';
import { createSession } from '@/lib/sessions/service.server';
import { receiveTakes } from '@/lib/takes/uploads.server';
import { Take, User } from '@/models';
import type { Actor } from '@/lib/auth/views';
import { generateProgrammeTake } from './benchTakes';

/**
 * The batch: a realistic mix kept small enough to run three times in a few minutes on two cores
 * (12 takes, 1–4 minutes, a quarter of them 8-track; 27 minutes of audio).
 */
const BATCH: { minutes: number; channels: number }[] = [
  { minutes: 1, channels: 2 }, { minutes: 2, channels: 2 }, { minutes: 3, channels: 2 }, { minutes: 4, channels: 2 },
  { minutes: 1, channels: 8 }, { minutes: 2, channels: 2 }, { minutes: 3, channels: 2 }, { minutes: 1, channels: 2 },
  { minutes: 2, channels: 8 }, { minutes: 4, channels: 2 }, { minutes: 1, channels: 8 }, { minutes: 3, channels: 2 },
];

interface WorkerFigures {
  peakRssMb: number;
  cpuSec: number;
}

/** Reads a process's peak RSS (VmHWM) and CPU time (utime + stime of all its threads) from /proc. */
function sample(pid: number, into: WorkerFigures): void {
  try {
    const hwm = /VmHWM:\s+(\d+) kB/.exec(readFileSync(`/proc/${pid}/status`, 'utf8'));
    if (hwm) into.peakRssMb = Math.max(into.peakRssMb, Number(hwm[1]) / 1024);
    const fields = readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1].split(' ');
    into.cpuSec = (Number(fields[11]) + Number(fields[12])) / 100;
  } catch {
    // exited
  }
}

const percentile = (values: number[], p: number) => {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.min(sorted.length - 1, Math.max(0, Math.ceil((p / 100) * sorted.length) - 1))];
};

async function batchFiles(): Promise<string[]> {
  const files: string[] = [];
  for (const [index, take] of BATCH.entries()) {
    const path = join('var', 'bench', 'scale', `take-${index + 1}-${take.minutes}min-${take.channels}ch.wav`);
    if (!existsSync(path)) await generateProgrammeTake(path, take.minutes * 60, { sampleRate: 48000, channels: take.channels, coding: 'pcm24' }, 300 + index);
    files.push(path);
  }
  return files;
}

async function upload(actor: Actor, files: string[], label: string): Promise<number[]> {
  const session = await createSession(actor, { title: `Scale bench ${label} ${new Date().toISOString()}` });
  const form = new FormData();
  for (const file of files) form.append('file', await openAsBlob(file, { type: 'audio/wav' }), file.split('/').pop()!);
  const takes = await receiveTakes(actor, session.id, new Request('http://bench.local/upload', { method: 'POST', body: form }));
  return takes.map((t) => t.id);
}

async function run(actor: Actor, files: string[], workers: number) {
  const takeIds = await upload(actor, files, `${workers} worker(s)`);
  const claimedAt = new Map<number, number>();
  const figures: WorkerFigures[] = Array.from({ length: workers }, () => ({ peakRssMb: 0, cpuSec: 0 }));
  const started = Date.now();
  const children: ChildProcess[] = Array.from({ length: workers }, () =>
    spawn(process.execPath, ['--conditions=react-server', 'var/build/worker.mjs'], { env: process.env, stdio: 'ignore' }),
  );
  const poll = setInterval(() => children.forEach((child, i) => sample(child.pid!, figures[i])), 100);
  let audioSec = 0;
  for (;;) {
    const takes = await Take.findAll({ where: { id: { [Op.in]: takeIds } }, attributes: ['id', 'status', 'durationSec'], raw: true });
    for (const t of takes) if (t.status !== 'queued' && !claimedAt.has(t.id)) claimedAt.set(t.id, Date.now());
    if (takes.every((t) => t.status === 'measured' || t.status === 'unreadable')) {
      audioSec = takes.reduce((sum, t) => sum + (t.durationSec ?? 0), 0);
      break;
    }
    await new Promise((r) => setTimeout(r, 100));
  }
  const wallSec = (Date.now() - started) / 1000;
  children.forEach((child, i) => sample(child.pid!, figures[i]));
  clearInterval(poll);
  await Promise.all(children.map((child) => new Promise((resolve) => child.once('exit', resolve).kill('SIGTERM'))));
  const waits = takeIds.map((id) => ((claimedAt.get(id) ?? Date.now()) - started) / 1000);
  return { workers, wallSec, audioSec, takes: takeIds.length, waits, figures };
}

async function main() {
  const countsArg = process.argv.indexOf('--workers');
  const counts = countsArg >= 0 ? process.argv[countsArg + 1].split(',').map(Number) : [1, 2, 4];
  db();
  const files = await batchFiles();
  const user = await User.findOne({ where: { email: 'engineer@demo.test' } });
  if (!user) throw new Error('The demo engineer is missing; run the seed first.');
  const actor: Actor = { id: user.id, studioId: user.studioId, role: user.role, name: user.name, email: user.email };
  const audioMin = BATCH.reduce((sum, t) => sum + t.minutes, 0);
  process.stdout.write(`Batch: ${BATCH.length} takes, ${audioMin} min of 48 kHz/24-bit audio (${BATCH.filter((t) => t.channels === 8).length} of them 8-track); ${os.availableParallelism()} cores here.\n\n`);
  process.stdout.write(`${'workers'.padEnd(9)}${'audio h / h'.padStart(12)}${'takes / min'.padStart(13)}${'wait p50 s'.padStart(12)}${'wait p95 s'.padStart(12)}${'peak RSS MB / worker'.padStart(22)}${'CPU s / worker'.padStart(16)}${'wall s'.padStart(9)}\n`);
  const results = [];
  for (const workers of counts) {
    const r = await run(actor, files, workers);
    results.push(r);
    const rss = r.figures.map((f) => f.peakRssMb.toFixed(0)).join(' ');
    const cpu = r.figures.map((f) => f.cpuSec.toFixed(0)).join(' ');
    process.stdout.write(
      `${String(workers).padEnd(9)}${(r.audioSec / r.wallSec).toFixed(0).padStart(12)}${((60 * r.takes) / r.wallSec).toFixed(1).padStart(13)}${percentile(r.waits, 50).toFixed(1).padStart(12)}${percentile(r.waits, 95).toFixed(1).padStart(12)}${rss.padStart(22)}${cpu.padStart(16)}${r.wallSec.toFixed(0).padStart(9)}\n`,
    );
  }
  // What more cores would give: the batch needs this much CPU; with a worker per core and no other
  // bottleneck, throughput grows with the cores until the database or storage limits it.
  const one = results[0];
  const cpuPerAudioHour = one.figures.reduce((sum, f) => sum + f.cpuSec, 0) / (one.audioSec / 3600);
  process.stdout.write(
    `\nCPU time per hour of audio (1 worker): ${cpuPerAudioHour.toFixed(0)} s, so one core measures about ${(3600 / cpuPerAudioHour).toFixed(0)} audio hours per hour;` +
      ` N cores with N workers would give about N × that while MariaDB and storage keep up. On ${os.availableParallelism()} cores the figure flattens once there are as many workers as cores.\n`,
  );
  await db().close();
}

main().catch(async (error) => {
  process.stderr.write(`${error instanceof Error ? error.stack : String(error)}\n`);
  await db().close().catch(() => undefined);
  process.exitCode = 1;
});
