import 'server-only';
import { QueryTypes, type Transaction } from 'sequelize';
import { AnalysisJob, ConverterCheck, Take } from '@/models';
import { db } from '@/lib/db/connection.server';

/** A running job whose worker has not been heard from for this long is taken over by another worker. */
export const STALE_AFTER_SEC = Number(process.env.JOB_STALE_AFTER_SEC ?? 30);
/** A take that made a worker die this many times is given up on, with a message. */
export const MAX_ATTEMPTS = 3;

/** A claimed job measures either a take or a converter check (the other id is null). */
export interface ClaimedJob {
  jobId: number;
  takeId: number | null;
  converterCheckId: number | null;
  attempts: number;
}

/** The row a job measures, whose status and progress the queue keeps up to date. */
function subjectOf(job: Pick<ClaimedJob, 'takeId' | 'converterCheckId'>) {
  return job.takeId !== null ? { model: Take, id: job.takeId } : { model: ConverterCheck, id: job.converterCheckId };
}

async function updateSubject(job: Pick<ClaimedJob, 'takeId' | 'converterCheckId'>, fields: { status?: 'queued' | 'measuring'; progress: number }, transaction?: Transaction) {
  const { model, id } = subjectOf(job);
  if (id === null) return;
  // Both models share the status and progress columns; the cast names the common shape.
  await (model as typeof Take).update(fields, { where: { id }, transaction });
}

/**
 * Claims the oldest job that is queued, or running with a stale heartbeat, for `workerId`.
 * SKIP LOCKED lets any number of workers, on any machine, claim concurrently without waiting on each other.
 */
export async function claimJob(workerId: string): Promise<ClaimedJob | null> {
  const sequelize = db();
  return sequelize.transaction(async (transaction) => {
    const rows = await sequelize.query<{ id: number; takeId: number | null; converterCheckId: number | null; attempts: number }>(
      `SELECT id, takeId, converterCheckId, attempts FROM analysis_jobs
        WHERE state = 'queued' OR (state = 'running' AND heartbeatAt < NOW() - INTERVAL :stale SECOND)
        ORDER BY id LIMIT 1 FOR UPDATE SKIP LOCKED`,
      { type: QueryTypes.SELECT, replacements: { stale: STALE_AFTER_SEC }, transaction },
    );
    const row = rows[0];
    if (!row) return null;
    const attempts = Number(row.attempts) + 1;
    await AnalysisJob.update({ state: 'running', workerId, heartbeatAt: sequelize.fn('NOW') as unknown as Date, attempts }, { where: { id: row.id }, transaction });
    const job = { jobId: Number(row.id), takeId: row.takeId === null ? null : Number(row.takeId), converterCheckId: row.converterCheckId === null ? null : Number(row.converterCheckId), attempts };
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
