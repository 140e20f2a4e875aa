import type { AnalysisReport } from '@/dsp/types';
import type { Take } from '@/models';
import type { Decision, TakeStatus, Verdict } from '@/models/Take';

/** A take as lists show it (no report). Safe to import from client components as a type. */
export interface TakeSummary {
  id: number;
  sessionId: number;
  recorderId: number | null;
  recorderLabel: string | null;
  originalName: string;
  bytes: number;
  sha256: string;
  format: { sampleRate: number | null; bitsPerSample: number | null; channels: number | null; encoding: string | null };
  durationSec: number | null;
  status: TakeStatus;
  progress: number;
  error: string | null;
  effectiveBits: number | null;
  truePeakDbtp: number | null;
  integratedLufs: number | null;
  noiseFloorDbfs: number | null;
  clipEvents: number | null;
  verdict: Verdict | null;
  decision: Decision;
  decidedBy: string | null;
  decidedAt: string | null;
  decisionNote: string | null;
  uploadedAt: string;
  measuredAt: string | null;
}

/** A take with its full measurement report. */
export interface TakeDetail extends TakeSummary {
  report: AnalysisReport | null;
  hasPeaks: boolean;
}

type WithRefs = Take & { recorder?: { label: string } | null; decidedBy?: { name: string } | null };

export function toTakeSummary(take: Take): TakeSummary {
  const t = take as WithRefs;
  return {
    id: t.id,
    sessionId: t.sessionId,
    recorderId: t.recorderId,
    recorderLabel: t.recorder?.label ?? null,
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
    decision: t.decision,
    decidedBy: t.decidedBy?.name ?? null,
    decidedAt: t.decidedAt ? t.decidedAt.toISOString() : null,
    decisionNote: t.decisionNote,
    uploadedAt: t.createdAt.toISOString(),
    measuredAt: t.measuredAt ? t.measuredAt.toISOString() : null,
  };
}

export function toTakeDetail(take: Take): TakeDetail {
  const report = typeof take.report === 'string' ? (JSON.parse(take.report) as AnalysisReport) : take.report;
  return { ...toTakeSummary(take), report, hasPeaks: !!take.peaksKey };
}
