import 'server-only';
import { mkdtemp, rm, stat } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { Op } from 'sequelize';
import { analyzeStream } from '@/dsp/pipeline';
import { UnreadableWavError } from '@/dsp/reader/UnreadableWavError';
import type { BextInfo } from '@/dsp/types';
import { Recorder, Take } from '@/models';
import { isDatabaseDown, untilDatabaseAnswers } from '@/lib/db/availability.server';
import { MAX_ATTEMPTS, finishJob, heartbeat, requeueJob, retryJobLater, type ClaimedJob } from './queue.server';
import { storeWaveform } from './waveform.server';
import { specForSession } from '@/lib/specs/sessionSpec.server';
import { storage } from '@/lib/storage/storage.server';
import { measuredFields } from '@/lib/takes/verdicts.server';

/** How often a running measurement writes its progress and heartbeat, ms. */
const HEARTBEAT_MS = 1000;

/** What users and report e-mails read when a measurement failed for a reason that is not the file's. */
export const OUR_FAULT_MESSAGE =
  'Takeproof could not finish measuring this file because of a fault on its own side, not in the file. The details are in the server log; try “Measure again” later.';

/** Thrown inside a measurement when another worker has taken the job over. */
class LostClaim extends Error {}

export type JobOutcome = 'measured' | 'unreadable' | 'requeued' | 'lost';

/** Picks the studio recorder whose bext match text appears in the take's originator fields. */
export async function matchRecorder(studioId: number, bext: BextInfo | null): Promise<number | null> {
  if (!bext) return null;
  const haystack = `${bext.originator} ${bext.originatorReference}`.toLowerCase();
  const recorders = await Recorder.findAll({ where: { studioId, active: true, bextMatch: { [Op.ne]: null } }, order: [['id', 'ASC']] });
  return recorders.find((r) => r.bextMatch && haystack.includes(r.bextMatch.toLowerCase()))?.id ?? null;
}

/**
 * Heartbeats of a running measurement: at most one in flight, and a failed one (the database
 * restarting) is logged, never left as an unhandled rejection. The measurement goes on meanwhile.
 */
function heartbeats(job: ClaimedJob, workerId: string) {
  let lastBeat = 0;
  let inFlight = false;
  let lost = false;
  let reported = false;
  return {
    progress(percent: number) {
      const now = Date.now();
      if (inFlight || now - lastBeat < HEARTBEAT_MS) return;
      lastBeat = now;
      inFlight = true;
      heartbeat(job, workerId, percent)
        .then((alive) => {
          if (!alive) lost = true;
          reported = false;
        })
        .catch((error: unknown) => {
          if (!reported) console.warn(`Take ${job.takeId}: progress could not be saved (${(error as Error).message}); measuring goes on.`);
          reported = true;
        })
        .finally(() => {
          inFlight = false;
        });
    },
    get lost() {
      return lost;
    },
  };
}

/**
 * Measures the take of a claimed job: streams its audio from storage through the dsp pipeline,
 * stores the report, summary columns, verdict and waveform peaks. A file the analyzer refuses
 * ends as `unreadable` with the analyzer's message. While the database cannot be reached the
 * results wait (with backoff) until it answers again; a waveform file that storage refuses leaves
 * the take measured with its waveform missing, written again later. Any other fault puts the job
 * back in the queue after a backoff until MAX_ATTEMPTS, then ends the take with a plain message
 * (the details go to the log only).
 */
export async function measureTake(job: ClaimedJob, workerId: string): Promise<JobOutcome> {
  const take = job.takeId === null ? null : await Take.findByPk(job.takeId, { attributes: { exclude: ['report'] } });
  if (!take) {
    await finishJob(job, 'failed', 'The take was deleted.');
    return 'unreadable';
  }
  if (job.attempts > MAX_ATTEMPTS) {
    await take.update({ status: 'unreadable', progress: 0, error: `Takeproof could not finish measuring this file after ${MAX_ATTEMPTS} tries. The file may be damaged; try “Measure again”, or upload it once more.` });
    await finishJob(job, 'failed', 'too many attempts');
    return 'unreadable';
  }
  const tmp = await mkdtemp(path.join(os.tmpdir(), 'takeproof-peaks-'));
  const peaksPath = path.join(tmp, 'take.peaks');
  const beats = heartbeats(job, workerId);
  const saving = `saving the measurement of take ${take.id}`;
  try {
    const spec = await specForSession(take.sessionId);
    const report = await analyzeStream(storage().getRange(take.storageKey), {
      totalBytes: Number(take.bytes),
      spec,
      peaksPath,
      reopenAt: (offset) => storage().getRange(take.storageKey, { start: offset }),
      onProgress: (done, total) => beats.progress(total ? (100 * done) / total : 0),
    });
    if (beats.lost || !(await untilDatabaseAnswers(saving, () => heartbeat(job, workerId, 100)))) throw new LostClaim();
    const wrotePeaks = await stat(peaksPath).then(() => true, () => false);
    const peaksKey = wrotePeaks ? await storeWaveform(take.id, take.storageKey, peaksPath) : null;
    const waveformMissing = wrotePeaks && !peaksKey;
    await untilDatabaseAnswers(saving, async () => {
      const recorderId = take.recorderId ?? (await matchRecorder(take.studioId, report.bext));
      await take.update({ ...measuredFields(report, spec), status: 'measured', progress: 100, error: null, measuredAt: new Date(), peaksKey, waveformMissing, recorderId });
      if (waveformMissing) await retryJobLater(job, 'The waveform file could not be stored.', 'waveform');
      else await finishJob(job, 'done');
    });
    return 'measured';
  } catch (error) {
    if (error instanceof LostClaim) return 'lost';
    if (error instanceof UnreadableWavError) {
      await untilDatabaseAnswers(saving, async () => {
        await take.update({ status: 'unreadable', progress: 0, error: error.message });
        await finishJob(job, 'failed', error.message);
      });
      return 'unreadable';
    }
    if (isDatabaseDown(error)) {
      // Not the file's fault and not this try's: hand the job back once the database answers.
      console.warn(`Take ${take.id}: the database went away while measuring; the job goes back to the queue.`);
      await untilDatabaseAnswers(`handing back the job of take ${take.id}`, () => requeueJob(job, 'The database could not be reached.', true));
      return 'requeued';
    }
    console.error(`Measuring take ${take.id} failed (attempt ${job.attempts}):`, error);
    const detail = String((error as Error)?.message ?? error).slice(0, 2000);
    return untilDatabaseAnswers(saving, async () => {
      if (job.attempts >= MAX_ATTEMPTS) {
        await take.update({ status: 'unreadable', progress: 0, error: OUR_FAULT_MESSAGE });
        await finishJob(job, 'failed', detail);
        return 'unreadable' as const;
      }
      await take.update({ status: 'queued', progress: 0 });
      await retryJobLater(job, detail);
      return 'requeued' as const;
    });
  } finally {
    await rm(tmp, { recursive: true, force: true });
  }
}
