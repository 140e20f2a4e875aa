import type { ConverterFinding, ConverterReport } from '@/dsp/converter/report';
import type { ConverterThresholds } from '@/dsp/converter/thresholds';
import type { TakeStatus, Verdict } from '@/models/Take';

/** Shapes of converter checks as the API answers and pages show them; safe to import from client components. */

/** A check in a recorder's history (no report). */
export interface ConverterCheckSummary {
  id: number;
  recorderId: number;
  originalName: string;
  bytes: number;
  status: TakeStatus;
  progress: number;
  error: string | null;
  /** Worst severity of the findings (info counts as pass); null until measured. */
  state: Verdict | null;
  isBaseline: boolean;
  /** The report's drift findings (against the baseline), in plain words. */
  drift: string[];
  format: { sampleRate: number; bitsPerSample: number; channels: number; encoding: string } | null;
  uploadedBy: string | null;
  uploadedAt: string;
  measuredAt: string | null;
  baselineSetBy: string | null;
  baselineSetAt: string | null;
}

/** A check with its full report, what it was judged against, and the baseline's report for comparison. */
export interface ConverterCheckDetail extends ConverterCheckSummary {
  recorderLabel: string;
  recorderMakeModel: string | null;
  report: ConverterReport | null;
  thresholds: ConverterThresholds;
  /** Whether the studio set its own thresholds for this recorder model (otherwise Takeproof's defaults). */
  thresholdsAreDefault: boolean;
  baseline: { id: number; measuredAt: string | null; report: ConverterReport } | null;
}

/** The format a check signal is written at. */
export interface SignalFormatView {
  sampleRate: number;
  bitsPerSample: 16 | 24 | 32;
  channels: number;
}

/** A recorder's converter-check page: the checks over time and what a new one is written at and judged against. */
export interface RecorderChecksView {
  recorder: { id: number; label: string; makeModel: string | null; active: boolean };
  checks: ConverterCheckSummary[];
  usualFormat: SignalFormatView & { basis: 'takes' | 'default' };
  thresholds: ConverterThresholds;
  thresholdsAreDefault: boolean;
  intervalDays: number;
  /** When the next check is due (the last measured check plus the studio's interval); null before the first. */
  dueAt: string | null;
}

/** The fleet table's "last converter check" cell. */
export interface LastConverterCheck {
  checkId: number;
  measuredAt: string;
  state: Verdict | null;
  drifted: boolean;
  overdue: boolean;
}

/** The worst severity of a check's findings; info is a pass. */
export function stateOfFindings(findings: ConverterFinding[]): Verdict {
  if (findings.some((f) => f.severity === 'fail')) return 'fail';
  if (findings.some((f) => f.severity === 'warn')) return 'warn';
  return 'pass';
}

/** Drift findings: a change against the recorder's baseline beyond a threshold. */
export function driftFindings(findings: ConverterFinding[]): ConverterFinding[] {
  return findings.filter((f) => f.basis === 'baseline' && f.severity !== 'info');
}

/**
 * Whether a measured check may serve as the recorder's baseline: the signal did not clip and
 * every channel carried it (no failure of how the check was made).
 */
export function isAcceptable(findings: ConverterFinding[]): boolean {
  return !findings.some((f) => f.basis === 'check' && f.severity === 'fail');
}

/** Shown wherever the check signal is offered. */
export const PLAYBACK_CAUTION =
  'The check signal starts with six quiet beeps rising in level, then gets loud (up to −1 dB FS). Play it into the recorder’s line inputs, never into monitors or headphones at level; turn monitoring down before you start. Your studio’s own rules and specifications come first.';

/** Shown wherever converter levels are shown, because take reports refer levels differently. */
export const LEVEL_REFERENCE_NOTE =
  'Levels here are in dB FS with a full-scale sine at 0 dB FS (AES17). Take reports refer RMS levels to a full-scale square wave, so the same noise reads 3.01 dB lower on a take report than here.';
