import type { AnalysisReport } from '@/dsp/types';
import type { Decision, TakeStatus, Verdict } from '@/models/Take';

/** A take as lists show it (no report). Safe to import from client components as a type. */
export interface TakeSummary {
  id: number;
  sessionId: number;
  recorderId: number | null;
  recorderLabel: string | null;
  uploadedById: number | null;
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
  /** Why the verdict is what it is, in one line; null for a pass or an unmeasured take. */
  reason: string | null;
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
  /** Measured, but the waveform file could not be stored yet; Takeproof writes it again by itself. */
  waveformMissing: boolean;
}
