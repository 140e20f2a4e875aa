import 'server-only';
import { analyzeConverterCheck, ConverterCheckError } from '@/dsp/converter';
import { UnreadableWavError } from '@/dsp/reader/UnreadableWavError';
import { ConverterCheck } from '@/models';
import { db } from '@/lib/db/connection.server';
import { recordMeasuredCheck } from '@/lib/converterChecks/judgement.server';
import { storage } from '@/lib/storage/storage.server';
import { MAX_ATTEMPTS, finishJob, heartbeat, requeueJob, type ClaimedJob } from './queue.server';

/** How often a running check measurement renews its claim, ms. */
const HEARTBEAT_MS = 1000;

/**
 * Measures the converter check of a claimed job: the engine reads the recording from storage
 * (three passes), then the report is judged and stored (lib/converterChecks/judgement.server.ts).
 * A recording without a complete check signal, or not a WAV, ends as `unreadable` with the
 * engine's message; any other fault goes back to the queue until MAX_ATTEMPTS.
 */
export async function measureConverterCheck(job: ClaimedJob, workerId: string): Promise<'measured' | 'unreadable' | 'requeued' | 'lost'> {
  const check = await ConverterCheck.findByPk(job.converterCheckId!, { attributes: ['id', 'storageKey'] });
  if (!check) {
    await finishJob(job, 'failed', 'The converter check was deleted.');
    return 'unreadable';
  }
  const giveUp = async (message: string, lastError = message) => {
    await ConverterCheck.update({ status: 'unreadable', progress: 0, error: message }, { where: { id: check.id } });
    await finishJob(job, 'failed', lastError);
    return 'unreadable' as const;
  };
  if (job.attempts > MAX_ATTEMPTS) return giveUp(`Takeproof could not finish measuring this recording after ${MAX_ATTEMPTS} tries. Upload it once more.`, 'too many attempts');

  // The analysis reports no progress; the claim is renewed while it runs.
  let beat: Promise<boolean> = Promise.resolve(true);
  const timer = setInterval(() => {
    beat = beat.then((alive) => (alive ? heartbeat(job, workerId, 0) : false), () => true);
  }, HEARTBEAT_MS);
  try {
    const report = await analyzeConverterCheck(() => storage().getRange(check.storageKey));
    clearInterval(timer);
    if (!(await beat) || !(await heartbeat(job, workerId, 100))) return 'lost';
    await db().transaction((transaction) => recordMeasuredCheck(check.id, report, transaction));
    await finishJob(job, 'done');
    return 'measured';
  } catch (error) {
    clearInterval(timer);
    if (error instanceof UnreadableWavError || error instanceof ConverterCheckError) return giveUp(error.message);
    const message = (error as Error).message ?? String(error);
    console.error(`Measuring converter check ${check.id} failed (attempt ${job.attempts}):`, message);
    if (job.attempts >= MAX_ATTEMPTS) return giveUp(`Takeproof could not measure this recording: ${message}`, message);
    await ConverterCheck.update({ status: 'queued', progress: 0 }, { where: { id: check.id } });
    await requeueJob(job, message);
    return 'requeued';
  }
}
