import 'server-only';
import { AnalysisJob, Recorder, Take, User } from '@/models';
import { audit } from '@/lib/audit/record.server';
import { db } from '@/lib/db/connection.server';
import { AppError } from '@/lib/errors';
import { findSession } from '@/lib/sessions/service.server';
import type { AnalysisReport } from '@/dsp/types';
import { worstFirst } from './order';
import type { TakeDetail, TakeSummary } from './views';
import type { Actor } from '@/lib/auth/views';
import { jsonColumn } from '@/lib/db/jsonColumn';
import { mayRemoveTake } from '@/lib/auth/policy';
import { storage } from '@/lib/storage/storage.server';

type WithRefs = Take & { recorder?: { label: string } | null; decidedBy?: { name: string } | null };

export function toTakeSummary(take: Take): TakeSummary {
  const t = take as WithRefs;
  return {
    id: t.id,
    sessionId: t.sessionId,
    recorderId: t.recorderId,
    recorderLabel: t.recorder?.label ?? null,
    uploadedById: t.uploadedById,
    originalName: t.originalName,
    bytes: Number(t.bytes),
    sha256: t.sha256,
    format: { sampleRate: t.sampleRate, bitsPerSample: t.bitsPerSample, channels: t.channels, encoding: t.encoding },
    durationSec: t.durationSec,
    status: t.status,
    progress: t.progress,
    error: t.error,
    effectiveBits: t.effectiveBits,
    truePeakDbtp: t.truePeakDbtp,
    integratedLufs: t.integratedLufs,
    noiseFloorDbfs: t.noiseFloorDbfs,
    clipEvents: t.clipEvents,
    verdict: t.verdict,
    reason: t.verdict === 'pass' ? null : t.reason,
    decision: t.decision,
    decidedBy: t.decidedBy?.name ?? null,
    decidedAt: t.decidedAt ? t.decidedAt.toISOString() : null,
    decisionNote: t.decisionNote,
    uploadedAt: t.createdAt.toISOString(),
    measuredAt: t.measuredAt ? t.measuredAt.toISOString() : null,
  };
}

export function toTakeDetail(take: Take): TakeDetail {
  const report = jsonColumn<AnalysisReport | null>(take.report);
  return { ...toTakeSummary(take), report, hasPeaks: !!take.peaksKey, waveformMissing: take.waveformMissing };
}

const refs = [
  { model: Recorder, as: 'recorder', attributes: ['label'] },
  { model: User, as: 'decidedBy', attributes: ['name'] },
];

/** Loads a take of the actor's studio; 404 for a missing one or one of another studio. */
export async function findTake(actor: Actor, id: number, withReport = false): Promise<Take> {
  db();
  const take = await Take.findOne({
    where: { id, studioId: actor.studioId },
    include: refs,
    attributes: withReport ? undefined : { exclude: ['report'] },
  });
  if (!take) throw new AppError('not_found:take', 'This take does not exist, or belongs to another studio.');
  return take;
}

export async function getTake(actor: Actor, id: number): Promise<TakeDetail> {
  return toTakeDetail(await findTake(actor, id, true));
}

/** The takes of one session, worst verdict first, without their reports. */
export async function listSessionTakes(actor: Actor, sessionId: number): Promise<TakeSummary[]> {
  await findSession(actor, sessionId);
  const takes = await Take.findAll({ where: { sessionId }, include: refs, attributes: { exclude: ['report'] } });
  return takes.map(toTakeSummary).sort(worstFirst);
}

/** Queues a take to be measured again (e.g. after a worker fault or a new analyzer version). */
export async function remeasureTake(actor: Actor, id: number): Promise<TakeSummary> {
  const take = await findTake(actor, id);
  if (take.status === 'queued' || take.status === 'measuring') {
    throw new AppError('conflict:take_busy', 'This take is already waiting to be measured.');
  }
  await db().transaction(async (transaction) => {
    await take.update({ status: 'queued', progress: 0, error: null }, { transaction });
    const [job] = await AnalysisJob.findOrCreate({ where: { takeId: id }, defaults: { takeId: id, workerId: null, heartbeatAt: null, lastError: null }, transaction });
    await job.update({ state: 'queued', purpose: 'measure', runAfter: null, attempts: 0, workerId: null, heartbeatAt: null, lastError: null }, { transaction });
    await audit(actor, 'take.remeasure', { type: 'take', id }, null, transaction);
  });
  return toTakeSummary(await findTake(actor, id));
}

/**
 * Removes a take with its comments, its measuring job, its stored file and its waveform file; the
 * same file may then be uploaded again. The uploader may remove their own take until somebody
 * decides on it; a studio manager may remove any. A take being measured is left alone until done.
 */
export async function removeTake(actor: Actor, id: number): Promise<void> {
  const take = await findTake(actor, id);
  if (!mayRemoveTake(actor, take)) {
    throw new AppError(
      'forbidden:take',
      take.decision === 'pending' ? 'Only the engineer who uploaded this take, or a studio manager, can remove it.' : 'This take has a decision; only a studio manager can remove it now.',
    );
  }
  const keys = [take.storageKey, take.peaksKey].filter((key): key is string => !!key);
  await db().transaction(async (transaction) => {
    // Read again under a row lock, so a worker cannot start measuring it in between.
    const locked = await Take.findByPk(id, { attributes: ['id', 'status'], lock: transaction.LOCK.UPDATE, transaction });
    if (locked?.status === 'measuring') throw new AppError('conflict:take_busy', `“${take.originalName}” is being measured right now; remove it once it is done.`);
    await take.destroy({ transaction });
    await audit(actor, 'take.remove', { type: 'take', id }, { sessionId: take.sessionId, name: take.originalName, sha256: take.sha256, decision: take.decision }, transaction);
  });
  // After the commit: a file left behind by a crash here shows up in `npm run check:storage`.
  await Promise.all(keys.map((key) => storage().delete(key)));
}
