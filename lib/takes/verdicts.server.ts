import 'server-only';
import type { Transaction } from 'sequelize';
import { judgeReport, reasonOf, verdictOf } from '@/dsp/findings';
import type { DeliverySpec as Spec } from '@/dsp/spec';
import type { AnalysisReport } from '@/dsp/types';
import { RecordingSession, Take } from '@/models';
import { specForSession } from '@/lib/specs/sessionSpec.server';
import { jsonColumn } from '@/lib/db/jsonColumn';

/** The summary columns and verdict a report gives a take under `spec`. */
export function measuredFields(report: AnalysisReport, spec: Spec) {
  const findings = judgeReport(report, spec);
  return {
    report: { ...report, findings },
    verdict: verdictOf(findings),
    reason: reasonOf(findings),
    sampleRate: report.file.sampleRate,
    bitsPerSample: report.file.bitsPerSample,
    channels: report.file.channels,
    encoding: report.file.encoding,
    durationSec: report.file.durationSec,
    effectiveBits: report.resolution.effectiveBits,
    truePeakDbtp: report.peak.truePeakDbtp,
    integratedLufs: report.loudness.integratedLufs,
    noiseFloorDbfs: report.noise.floorDbfs,
    clipEvents: report.clipping.events.length,
    belowFullScaleClipEvents: report.clipping.events.filter((e) => e.level === 'belowFullScale').length,
    rateMismatch: (report.tone?.likelyRecordedRate != null && report.tone.likelyRecordedRate !== report.file.sampleRate) || report.bandwidth.impliedSourceRate != null,
    aliasingRisk: report.bandwidth.aliasingRisk,
  };
}

/** Re-judges every measured take of a session against its current spec, without reading audio again. */
export async function rejudgeSession(sessionId: number, transaction?: Transaction): Promise<number> {
  const spec = await specForSession(sessionId, transaction);
  const takes = await Take.findAll({ where: { sessionId, status: 'measured' }, transaction });
  for (const take of takes) {
    const report = jsonColumn<AnalysisReport | null>(take.report);
    if (!report) continue;
    const { report: judged, verdict, reason } = measuredFields(report, spec);
    await take.update({ report: judged, verdict, reason }, { transaction });
  }
  return takes.length;
}

/** Re-judges the takes of every session that uses a delivery spec (after the spec was edited). */
export async function rejudgeSpecSessions(deliverySpecId: number): Promise<void> {
  const sessions = await RecordingSession.findAll({ where: { deliverySpecId }, attributes: ['id'] });
  for (const s of sessions) await rejudgeSession(s.id);
}
