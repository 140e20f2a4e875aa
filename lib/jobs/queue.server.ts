import 'server-only';
import { QueryTypes, type Transaction } from 'sequelize';
import { AnalysisJob, ConverterCheck, Take } from '@/models';
import type { JobPurpose } from '@/models/AnalysisJob';
import { db } from '@/lib/db/connection.server';

/** A running job whose worker has not been heard from for this long is taken over by another worker. */
export const STALE_AFTER_SEC = Number(process.env.JOB_STALE_AFTER_SEC ?? 30);
/** A take that made a worker die (or fail for a reason outside the file) this many times is given up on, with a message. */
export const MAX_ATTEMPTS = 3;
/** The first wait before a job that failed for a reason outside the file is tried again; it doubles each time. */
const RETRY_BASE_SEC = Number(process.env.JOB_RETRY_BASE_SEC ?? 30);
const RETRY_LONGEST_SEC = 15 * 60;

/** A claimed job measures either a take or a converter check (the other id is null), or writes a take's missing waveform. */
export interface ClaimedJob {
  jobId: number;
  takeId: number | null;
  converterCheckId: number | null;
  attempts: number;
  purpose: JobPurpose;
}

/** Seconds to wait before try number `attempt + 1` of a job that failed `attempt` times. */
export function retryDelaySec(attempt: number): number {
  return Math.min(RETRY_LONGEST_SEC, RETRY_BASE_SEC * 2 ** Math.max(0, attempt - 1));
}

/**
 * Publishes status and progress on the row a measuring job works on. A take whose waveform alone is
 * written again stays measured and reviewable meanwhile, so waveform jobs publish nothing.
 */
async function updateSubject(job: Pick<ClaimedJob, 'takeId' | 'converterCheckId' | 'purpose'>, fields: { status?: 'queued' | 'measuring'; progress: number }, transaction?: Transaction) {
  if (job.purpose !== 'measure') return;
  const { model, id } = job.takeId !== null ? { model: Take, id: job.takeId } : { model: ConverterCheck, id: job.converterCheckId };
  if (id === null) return;
  // Both models share the status and progress columns; the cast names the common shape.
  await (model as typeof Take).update(fields, { where: { id }, transaction });
}

/**
 * Claims the oldest job that is queued (and not waiting out a backoff), or running with a stale
 * heartbeat, for `workerId`. SKIP LOCKED lets any number of workers, on any machine, claim
 * concurrently without waiting on each other.
 */
export async function claimJob(workerId: string): Promise<ClaimedJob | null> {
  const sequelize = db();
  return sequelize.transaction(async (transaction) => {
    const rows = await sequelize.query<{ id: number; takeId: number | null; converterCheckId: number | null; attempts: number; purpose: JobPurpose }>(
      `SELECT id, takeId, converterCheckId, attempts, purpose FROM analysis_jobs
        WHERE (state = 'queued' AND (runAfter IS NULL OR runAfter <= NOW()))
           OR (state = 'running' AND heartbeatAt < NOW() - INTERVAL :stale SECOND)
        ORDER BY id LIMIT 1 FOR UPDATE SKIP LOCKED`,
      { type: QueryTypes.SELECT, replacements: { stale: STALE_AFTER_SEC }, transaction },
    );
    const row = rows[0];
    if (!row) return null;
    const attempts = Number(row.attempts) + 1;
    await AnalysisJob.update({ state: 'running', workerId, heartbeatAt: sequelize.fn('NOW') as unknown as Date, attempts }, { where: { id: row.id }, transaction });
    const job: ClaimedJob = {
      jobId: Number(row.id),
      takeId: row.takeId === null ? null : Number(row.takeId),
      converterCheckId: row.converterCheckId === null ? null : Number(row.converterCheckId),
      attempts,
      purpose: row.purpose,
    };
    await updateSubject(job, { status: 'measuring', progress: 0 }, transaction);
    return job;
  });
}

/** Keeps the claim alive and publishes progress (0–100). Returns false if another worker took the job over. */
export async function heartbeat(job: ClaimedJob, workerId: string, progress: number): Promise<boolean> {
  const sequelize = db();
  const mine = { id: job.jobId, workerId, state: 'running' as const };
  const [changed] = await AnalysisJob.update({ heartbeatAt: sequelize.fn('NOW') as unknown as Date }, { where: mine });
  // MariaDB counts changed rows only: a beat within the same second changes nothing yet is still ours.
  if (changed === 0 && (await AnalysisJob.count({ where: mine })) === 0) return false;
  await updateSubject(job, { progress: Math.max(0, Math.min(100, progress)) });
  return true;
}

export async function finishJob(job: ClaimedJob, state: 'done' | 'failed', lastError: string | null = null): Promise<void> {
  await AnalysisJob.update({ state, lastError, heartbeatAt: null }, { where: { id: job.jobId } });
}

/** Puts a job back in the queue for any worker (after a fault, or when a worker stops mid-job). */
export async function requeueJob(job: ClaimedJob, lastError: string | null, undoAttempt = false): Promise<void> {
  await AnalysisJob.update(
    { state: 'queued', workerId: null, heartbeatAt: null, lastError, ...(undoAttempt ? { attempts: Math.max(0, job.attempts - 1) } : {}) },
    { where: { id: job.jobId } },
  );
  if (undoAttempt) await updateSubject(job, { status: 'queued', progress: 0 });
}

/** Puts a job back in the queue, to be claimed again only after its backoff (see retryDelaySec). */
export async function retryJobLater(job: ClaimedJob, lastError: string, purpose: JobPurpose = job.purpose): Promise<void> {
  // The database's clock, which every worker's claim compares against.
  const runAfter = db().literal(`NOW() + INTERVAL ${Math.round(retryDelaySec(job.attempts))} SECOND`) as unknown as Date;
  await AnalysisJob.update({ state: 'queued', purpose, runAfter, workerId: null, heartbeatAt: null, lastError }, { where: { id: job.jobId } });
}
