// The worker: claims measurement jobs (takes and converter checks) from MariaDB and runs the dsp pipeline on them, and sends
// the report e-mails waiting in the outbox. Any number may run, on this machine or others that
// reach the same database, storage and mail server.
// It rides out a database outage: it waits with backoff, hands its job back, and goes on.
import os from 'node:os';
import { randomBytes } from 'node:crypto';
import { db } from '@/lib/db/connection.server';
import { databaseBackoffMs, isDatabaseDown, untilDatabaseAnswers } from '@/lib/db/availability.server';
import { claimJob, requeueJob, type ClaimedJob } from '@/lib/jobs/queue.server';
import { describeJob, runJob } from '@/lib/jobs/run.server';
import { sendNextQueuedMail } from '@/lib/mail/queue.server';

const workerId = `${os.hostname()}:${process.pid}:${randomBytes(3).toString('hex')}`;
const IDLE_POLL_MS = Number(process.env.WORKER_POLL_MS ?? 1000);
let current: ClaimedJob | null = null;
let stopping = false;

const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

async function stop(signal: string) {
  if (stopping) return;
  stopping = true;
  // Hand an unfinished job straight back so another worker (or the next start) picks it up at once.
  // With the database away this gives up after a few seconds: the job's heartbeat then goes stale and another worker takes it.
  if (current) await Promise.race([requeueJob(current, `worker stopped by ${signal}`, true).catch(() => undefined), sleep(5000)]);
  await db().close().catch(() => undefined);
  process.exit(0);
}
process.on('SIGTERM', () => void stop('SIGTERM'));
process.on('SIGINT', () => void stop('SIGINT'));
// Every promise of the worker is handled where it is made; should one ever slip through, it is logged
// and the worker goes on (its job's heartbeat goes stale and it is measured again), rather than exiting.
process.on('unhandledRejection', (reason) => console.error('Worker: an unhandled rejection was ignored:', reason));

/** Sends queued report e-mails beside the measurements, so a long take never holds up the mail. */
async function keepSendingMail() {
  let failures = 0;
  while (!stopping) {
    try {
      const sent = await sendNextQueuedMail();
      failures = 0;
      if (!sent) await sleep(IDLE_POLL_MS);
    } catch (error) {
      failures++;
      console.error(`Outbox error: ${(error as Error).message}`);
      await sleep(databaseBackoffMs(failures));
    }
  }
}
void keepSendingMail();

console.log(`Worker ${workerId} is waiting for takes and e-mail.`);
let failures = 0;
while (!stopping) {
  try {
    current = await claimJob(workerId);
    failures = 0;
    if (!current) {
      await sleep(IDLE_POLL_MS);
      continue;
    }
    const started = Date.now();
    const outcome = await runJob(current, workerId);
    console.log(`${describeJob(current)}: ${outcome} in ${((Date.now() - started) / 1000).toFixed(1)} s`);
    current = null;
  } catch (error) {
    failures++;
    const wait = databaseBackoffMs(failures);
    console.error(`Worker loop error: ${(error as Error).message}; trying again in ${wait / 1000} s.`);
    const job = current;
    current = null;
    // A job claimed just before the database went away is handed back once it answers.
    if (job && isDatabaseDown(error)) await untilDatabaseAnswers(`handing back the job of ${describeJob(job).toLowerCase()}`, () => requeueJob(job, 'The database could not be reached.', true)).catch(() => undefined);
    await sleep(wait);
  }
}
