import 'server-only';
import { createReadStream } from 'node:fs';
import { mkdtemp, rm, stat } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { Op } from 'sequelize';
import { analyzeStream } from '@/dsp/pipeline';
import { UnreadableWavError } from '@/dsp/reader/UnreadableWavError';
import type { BextInfo } from '@/dsp/types';
import { Recorder, Take } from '@/models';
import { MAX_ATTEMPTS, finishJob, heartbeat, requeueJob, type ClaimedJob } from './queue.server';
import { specForSession } from '@/lib/specs/sessionSpec.server';
import { peaksKeyFor, storage } from '@/lib/storage/storage.server';
import { measuredFields } from '@/lib/takes/verdicts.server';

/** How often a running measurement writes its progress and heartbeat, ms. */
const HEARTBEAT_MS = 1000;

/** Thrown inside a measurement when another worker has taken the job over. */
class LostClaim extends Error {}

/** Picks the studio recorder whose bext match text appears in the take's originator fields. */
export async function matchRecorder(studioId: number, bext: BextInfo | null): Promise<number | null> {
  if (!bext) return null;
  const haystack = `${bext.originator} ${bext.originatorReference}`.toLowerCase();
  const recorders = await Recorder.findAll({ where: { studioId, active: true, bextMatch: { [Op.ne]: null } }, order: [['id', 'ASC']] });
  return recorders.find((r) => r.bextMatch && haystack.includes(r.bextMatch.toLowerCase()))?.id ?? null;
}

/**
 * Measures the take of a claimed job: streams its audio from storage through the dsp pipeline,
 * stores the report, summary columns, verdict and waveform peaks. A file the analyzer refuses
 * ends as `unreadable` with the analyzer's message; any other fault sends the job back to the
 * queue until MAX_ATTEMPTS, then ends the take as `unreadable` with a plain explanation.
 */
export async function measureTake(job: ClaimedJob, workerId: string): Promise<'measured' | 'unreadable' | 'requeued' | 'lost'> {
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
  let lastBeat = 0;
  let beat: Promise<boolean> = Promise.resolve(true);
  try {
    const spec = await specForSession(take.sessionId);
    const report = await analyzeStream(storage().getRange(take.storageKey), {
      totalBytes: Number(take.bytes),
      spec,
      peaksPath,
      reopenAt: (offset) => storage().getRange(take.storageKey, { start: offset }),
      onProgress: (done, total) => {
        const now = Date.now();
        if (now - lastBeat < HEARTBEAT_MS) return;
        lastBeat = now;
        beat = beat.then((alive) => (alive ? heartbeat(job, workerId, total ? (100 * done) / total : 0) : false));
      },
    });
    if (!(await beat) || !(await heartbeat(job, workerId, 100))) throw new LostClaim();
    const peaksKey = peaksKeyFor(take.storageKey);
    const wrotePeaks = await stat(peaksPath).then(() => true, () => false);
    if (wrotePeaks) await storage().put(peaksKey, createReadStream(peaksPath));
    const recorderId = take.recorderId ?? (await matchRecorder(take.studioId, report.bext));
    await take.update({ ...measuredFields(report, spec), status: 'measured', progress: 100, error: null, measuredAt: new Date(), peaksKey: wrotePeaks ? peaksKey : null, recorderId });
    await finishJob(job, 'done');
    return 'measured';
  } catch (error) {
    if (error instanceof LostClaim) return 'lost';
    if (error instanceof UnreadableWavError) {
      await take.update({ status: 'unreadable', progress: 0, error: error.message });
      await finishJob(job, 'failed', error.message);
      return 'unreadable';
    }
    const message = (error as Error).message ?? String(error);
    console.error(`Measuring take ${take.id} failed (attempt ${job.attempts}):`, message);
    if (job.attempts >= MAX_ATTEMPTS) {
      await take.update({ status: 'unreadable', progress: 0, error: `Takeproof could not measure this file: ${message}` });
      await finishJob(job, 'failed', message);
      return 'unreadable';
    }
    await take.update({ status: 'queued', progress: 0 });
    await requeueJob(job, message);
    return 'requeued';
  } finally {
    await rm(tmp, { recursive: true, force: true });
  }
}
