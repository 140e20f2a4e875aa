// The analysis worker: claims measurement jobs (takes and converter checks) from MariaDB and runs the dsp engine on them.
// Any number may run, on this machine or others that reach the same database and storage.
import os from 'node:os';
import { randomBytes } from 'node:crypto';
import { db } from '@/lib/db/connection.server';
import { claimJob, requeueJob, type ClaimedJob } from '@/lib/jobs/queue.server';
import { describeJob, runJob } from '@/lib/jobs/run.server';

const workerId = `${os.hostname()}:${process.pid}:${randomBytes(3).toString('hex')}`;
const IDLE_POLL_MS = Number(process.env.WORKER_POLL_MS ?? 1000);
let current: ClaimedJob | null = null;
let stopping = false;

async function stop(signal: string) {
  if (stopping) return;
  stopping = true;
  // Hand an unfinished job straight back so another worker (or the next start) picks it up at once.
  if (current) await requeueJob(current, `worker stopped by ${signal}`, true).catch(() => undefined);
  await db().close().catch(() => undefined);
  process.exit(0);
}
process.on('SIGTERM', () => void stop('SIGTERM'));
process.on('SIGINT', () => void stop('SIGINT'));

console.log(`Analysis worker ${workerId} is waiting for takes.`);
while (!stopping) {
  try {
    current = await claimJob(workerId);
    if (!current) {
      await new Promise((r) => setTimeout(r, IDLE_POLL_MS));
      continue;
    }
    const started = Date.now();
    const outcome = await runJob(current, workerId);
    console.log(`${describeJob(current)}: ${outcome} in ${((Date.now() - started) / 1000).toFixed(1)} s`);
    current = null;
  } catch (error) {
    // The database may be restarting: wait and try again rather than dying.
    console.error(`Worker loop error: ${(error as Error).message}`);
    current = null;
    await new Promise((r) => setTimeout(r, 2000));
  }
}
