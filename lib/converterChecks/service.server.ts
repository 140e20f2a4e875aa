import 'server-only';
import { Readable } from 'node:stream';
import { fn, col, literal, UniqueConstraintError } from 'sequelize';
import { checkSignalWavStream, assertCheckSignalFormat } from '@/dsp/converter';
import type { ConverterReport } from '@/dsp/converter/report';
import type { ConverterThresholds } from '@/dsp/converter/thresholds';
import { AnalysisJob, ConverterCheck, ConverterThresholdSet, Recorder, Studio, Take, User } from '@/models';
import { audit } from '@/lib/audit/record.server';
import { db } from '@/lib/db/connection.server';
import { jsonColumn } from '@/lib/db/jsonColumn';
import { AppError } from '@/lib/errors';
import type { BodyAnswer } from '@/lib/http/route.server';
import { findRecorder } from '@/lib/recorders/service.server';
import { newConverterCheckKey, storage } from '@/lib/storage/storage.server';
import { storeWavParts } from '@/lib/takes/uploads.server';
import type { Actor } from '@/lib/auth/views';
import { latestChecks, toLastCheck } from './fleet.server';
import { rejudgeRecorder, thresholdsFor } from './judgement.server';
import type { SignalFormatQuery } from './schema';
import { driftFindings, isAcceptable, type ConverterCheckDetail, type ConverterCheckSummary, type LastConverterCheck, type RecorderChecksView, type SignalFormatView } from './views';

const DAY_MS = 86_400_000;
const DEFAULT_FORMAT: SignalFormatView = { sampleRate: 48_000, bitsPerSample: 24, channels: 2 };
const CHECK_INCLUDE = [
  { model: User, as: 'uploadedBy', attributes: ['name'] },
  { model: User, as: 'baselineSetBy', attributes: ['name'] },
];

type CheckWithPeople = ConverterCheck & { uploadedBy?: User | null; baselineSetBy?: User | null };

function toSummary(c: CheckWithPeople, report: ConverterReport | null): ConverterCheckSummary {
  return {
    id: c.id,
    recorderId: c.recorderId,
    originalName: c.originalName,
    bytes: Number(c.bytes),
    status: c.status,
    progress: c.progress,
    error: c.error,
    state: c.state,
    isBaseline: !!c.isBaseline,
    drift: report ? driftFindings(report.findings).map((f) => f.message) : [],
    format: report ? { sampleRate: report.file.sampleRate, bitsPerSample: report.file.bitsPerSample, channels: report.file.channels, encoding: report.file.encoding } : null,
    uploadedBy: c.uploadedBy?.name ?? null,
    uploadedAt: c.createdAt.toISOString(),
    measuredAt: c.measuredAt?.toISOString() ?? null,
    baselineSetBy: c.baselineSetBy?.name ?? null,
    baselineSetAt: c.baselineSetAt?.toISOString() ?? null,
  };
}

async function findCheck(actor: Actor, id: number): Promise<CheckWithPeople> {
  db();
  const check = await ConverterCheck.findOne({ where: { id, studioId: actor.studioId }, include: CHECK_INCLUDE });
  if (!check) throw new AppError('not_found:converter_check', 'This converter check does not exist, or belongs to another studio.');
  return check;
}

/**
 * The format the recorder usually records at: the most frequent format among its measured takes
 * (a format the check signal can be written at), else 48 kHz, 24 bits, stereo.
 */
export async function usualFormat(studioId: number, recorderId: number): Promise<SignalFormatView & { basis: 'takes' | 'default' }> {
  const rows = (await Take.findAll({
    attributes: ['sampleRate', 'bitsPerSample', 'channels', [fn('COUNT', col('id')), 'n']],
    where: { studioId, recorderId, status: 'measured' },
    group: ['sampleRate', 'bitsPerSample', 'channels'],
    order: [[literal('n'), 'DESC']],
    raw: true,
  })) as unknown as { sampleRate: number | null; bitsPerSample: number | null; channels: number | null }[];
  for (const r of rows) {
    const format = { sampleRate: Number(r.sampleRate), bitsPerSample: Number(r.bitsPerSample) as 16 | 24 | 32, channels: Number(r.channels) };
    try {
      assertCheckSignalFormat(format);
      return { ...format, basis: 'takes' };
    } catch {
      // An 8-bit or very high-rate take: try the next format.
    }
  }
  return { ...DEFAULT_FORMAT, basis: 'default' };
}

/** Days after which a recorder's converter check is overdue. */
export async function converterCheckIntervalDays(studioId: number): Promise<number> {
  return (await Studio.findByPk(studioId, { attributes: ['converterCheckIntervalDays'] }))?.converterCheckIntervalDays ?? 90;
}

/** A recorder's converter checks, newest first (those still in the queue on top), with what the next check is written at and judged against. */
export async function recorderChecks(actor: Actor, recorderId: number): Promise<RecorderChecksView> {
  const recorder = await findRecorder(actor, recorderId);
  const [checks, format, judged, interval] = await Promise.all([
    ConverterCheck.findAll({ where: { studioId: actor.studioId, recorderId }, include: CHECK_INCLUDE, order: [[literal('measuredAt IS NULL'), 'DESC'], ['measuredAt', 'DESC'], ['id', 'DESC']] }),
    usualFormat(actor.studioId, recorderId),
    thresholdsFor(actor.studioId, recorder.makeModel),
    converterCheckIntervalDays(actor.studioId),
  ]);
  const lastMeasured = checks.find((c) => c.status === 'measured' && c.measuredAt);
  return {
    recorder: { id: recorder.id, label: recorder.label, makeModel: recorder.makeModel, active: !!recorder.active },
    checks: checks.map((c) => toSummary(c, c.report ? jsonColumn<ConverterReport>(c.report) : null)),
    usualFormat: format,
    thresholds: judged.thresholds,
    thresholdsAreDefault: judged.isDefault,
    intervalDays: interval,
    dueAt: lastMeasured?.measuredAt ? new Date(lastMeasured.measuredAt.getTime() + interval * DAY_MS).toISOString() : null,
  };
}

/** One check with its report, its thresholds and its recorder's baseline. */
export async function getConverterCheck(actor: Actor, id: number): Promise<ConverterCheckDetail> {
  const check = await findCheck(actor, id);
  const recorder = await findRecorder(actor, check.recorderId);
  const report = check.report ? jsonColumn<ConverterReport>(check.report) : null;
  const [judged, baseline] = await Promise.all([
    thresholdsFor(actor.studioId, recorder.makeModel),
    check.isBaseline ? null : ConverterCheck.findOne({ where: { recorderId: recorder.id, isBaseline: true } }),
  ]);
  return {
    ...toSummary(check, report),
    recorderLabel: recorder.label,
    recorderMakeModel: recorder.makeModel,
    report,
    thresholds: judged.thresholds,
    thresholdsAreDefault: judged.isDefault,
    baseline: baseline?.report ? { id: baseline.id, measuredAt: baseline.measuredAt?.toISOString() ?? null, report: jsonColumn<ConverterReport>(baseline.report) } : null,
  };
}

/** The check signal as a WAV download, at the asked format or the recorder's usual one. */
export async function checkSignalDownload(actor: Actor, recorderId: number, query: SignalFormatQuery): Promise<BodyAnswer> {
  await findRecorder(actor, recorderId);
  const usual = await usualFormat(actor.studioId, recorderId);
  const format = { sampleRate: query.rate ?? usual.sampleRate, bitsPerSample: query.bits ?? usual.bitsPerSample, channels: query.channels ?? usual.channels };
  try {
    assertCheckSignalFormat(format);
  } catch (error) {
    throw new AppError('invalid:signal_format', (error as Error).message);
  }
  const name = `takeproof-converter-check-${format.sampleRate}-${format.bitsPerSample}bit-${format.channels}ch.wav`;
  return {
    status: 200,
    headers: {
      'Content-Type': 'audio/wav',
      'Content-Disposition': `attachment; filename="${name}"`,
      'Cache-Control': 'private, no-store',
    },
    body: Readable.toWeb(checkSignalWavStream(format)) as ReadableStream<Uint8Array>,
  };
}

/** Receives one recording of the check signal for a recorder and queues it for measuring. */
export async function receiveConverterCheck(actor: Actor, recorderId: number, request: Request): Promise<ConverterCheckSummary> {
  const recorder = await findRecorder(actor, recorderId);
  if (!recorder.active) throw new AppError('conflict:recorder_retired', 'This recorder is retired. Reinstate it to check its converter.');
  const { files } = await storeWavParts(request, { newKey: () => newConverterCheckKey(), maxFiles: 1 });
  const [file] = files;
  try {
    const check = await db().transaction(async (transaction) => {
      const created = await ConverterCheck.create(
        { studioId: actor.studioId, recorderId, uploadedById: actor.id, originalName: file.originalName, storageKey: file.key, bytes: file.bytes, sha256: file.sha256 },
        { transaction },
      );
      await AnalysisJob.create({ takeId: null, converterCheckId: created.id, workerId: null, heartbeatAt: null, lastError: null }, { transaction });
      await audit(actor, 'converter_check.upload', { type: 'converter_check', id: created.id }, { recorderId, name: file.originalName, bytes: file.bytes, sha256: file.sha256 }, transaction);
      return created;
    });
    return toSummary(await findCheck(actor, check.id), null);
  } catch (error) {
    await storage().delete(file.key);
    if (error instanceof UniqueConstraintError) throw new AppError('conflict:converter_check', 'This recording was already received.');
    throw error;
  }
}

/** Makes a measured, acceptable check its recorder's baseline and judges the recorder's checks again. */
export async function makeBaseline(actor: Actor, checkId: number): Promise<ConverterCheckSummary> {
  const check = await findCheck(actor, checkId);
  if (check.status !== 'measured' || !check.report) throw new AppError('conflict:converter_check_unmeasured', 'Only a measured check can be the baseline.');
  if (!isAcceptable(jsonColumn<ConverterReport>(check.report).findings)) {
    throw new AppError('conflict:converter_check_unacceptable', 'This check clipped or missed a channel, so it cannot be the baseline. Record the check again.');
  }
  await db().transaction(async (transaction) => {
    await ConverterCheck.update({ isBaseline: false }, { where: { recorderId: check.recorderId, isBaseline: true }, transaction });
    await check.update({ isBaseline: true, baselineSetById: actor.id, baselineSetAt: new Date() }, { transaction });
    await rejudgeRecorder(check.recorderId, transaction);
    await audit(actor, 'converter_check.baseline', { type: 'converter_check', id: check.id }, { recorderId: check.recorderId }, transaction);
  });
  return toSummary(await findCheck(actor, checkId), jsonColumn<ConverterReport>((await ConverterCheck.findByPk(checkId))!.report));
}

/** Sets the thresholds of a recorder's model (every recorder of the studio with the same make and model) and judges their checks again. */
export async function setModelThresholds(actor: Actor, recorderId: number, thresholds: ConverterThresholds): Promise<RecorderChecksView> {
  const recorder = await findRecorder(actor, recorderId);
  const makeModel = recorder.makeModel;
  if (!makeModel) {
    throw new AppError('conflict:recorder_model', 'Thresholds are kept per recorder model: give this recorder its make and model first.');
  }
  await db().transaction(async (transaction) => {
    const [row, created] = await ConverterThresholdSet.findOrCreate({
      where: { studioId: actor.studioId, makeModel },
      defaults: { studioId: actor.studioId, makeModel, thresholds, updatedById: actor.id },
      transaction,
    });
    if (!created) await row.update({ thresholds, updatedById: actor.id }, { transaction });
    const sameModel = await Recorder.findAll({ where: { studioId: actor.studioId, makeModel }, attributes: ['id'], transaction });
    for (const r of sameModel) await rejudgeRecorder(r.id, transaction);
    await audit(actor, 'converter_thresholds.update', { type: 'recorder', id: recorderId }, { makeModel }, transaction);
  });
  return recorderChecks(actor, recorderId);
}

/** Sets how many days may pass between a recorder's converter checks before one is overdue. */
export async function setCheckInterval(actor: Actor, days: number): Promise<{ converterCheckIntervalDays: number }> {
  await db().transaction(async (transaction) => {
    await Studio.update({ converterCheckIntervalDays: days }, { where: { id: actor.studioId }, transaction });
    await audit(actor, 'studio.converter_interval', { type: 'studio', id: actor.studioId }, { days }, transaction);
  });
  return { converterCheckIntervalDays: days };
}

/** The studio's recorders in service, each with its latest converter check. */
export async function checksOverview(actor: Actor, now = new Date()): Promise<{ intervalDays: number; recorders: { id: number; label: string; makeModel: string | null; lastCheck: LastConverterCheck | null }[] }> {
  db();
  const [recorders, latest, interval] = await Promise.all([
    Recorder.findAll({ where: { studioId: actor.studioId, active: true }, attributes: ['id', 'label', 'makeModel'], order: [['label', 'ASC']] }),
    latestChecks(actor.studioId),
    converterCheckIntervalDays(actor.studioId),
  ]);
  return {
    intervalDays: interval,
    recorders: recorders.map((r) => {
      const c = latest.get(r.id);
      return { id: r.id, label: r.label, makeModel: r.makeModel, lastCheck: c ? toLastCheck(c, interval, now) : null };
    }),
  };
}
