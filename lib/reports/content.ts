/**
 * What a session report says, worked out once for the e-mail, the PDF and the CSV alike.
 * Pure (no server imports): the data is loaded by data.server.ts.
 */
import type { SessionSummary } from '@/lib/sessions/views';
import type { TakeSummary } from '@/lib/takes/views';
import { describeFormat, formatDuration, formatMeasure } from '@/lib/format';
import { DECISION_STATUS, VERDICT_STATUS, statusText } from '@/lib/status';

export interface ReportData {
  studio: string;
  session: SessionSummary;
  takes: TakeSummary[];
  counts: {
    verdict: { pass: number; warn: number; fail: number; none: number };
    decision: { approved: number; rejected: number; pending: number };
  };
  generatedAt: Date;
  /** The session's page in Takeproof, for the link back from the e-mail. */
  sessionUrl: string;
}

/** Display text of one take's cells, shared by the e-mail and the PDF. */
export function takeCells(t: TakeSummary) {
  const verdict = VERDICT_STATUS[t.verdict ?? 'none'];
  const decision = DECISION_STATUS[t.decision];
  return {
    name: t.originalName,
    format: describeFormat(t.format),
    duration: formatDuration(t.durationSec),
    verdict,
    reason: t.reason,
    decision,
    truePeak: formatMeasure(t.truePeakDbtp, 1, 'dBTP'),
    loudness: formatMeasure(t.integratedLufs, 1, 'LUFS'),
    noiseFloor: formatMeasure(t.noiseFloorDbfs, 1, 'dBFS'),
    effectiveBits: t.effectiveBits == null ? '—' : String(t.effectiveBits),
    clips: t.clipEvents == null ? '—' : String(t.clipEvents),
    note: [t.decisionNote, t.decidedBy ? `${decision.word} by ${t.decidedBy}` : null].filter(Boolean).join(' · '),
    problem: t.status === 'unreadable' ? (t.error ?? 'The file could not be read.') : t.status === 'queued' || t.status === 'measuring' ? 'Still being measured.' : null,
  };
}

export function sessionDetails(data: ReportData): [string, string][] {
  const s = data.session;
  return [
    ['Show / client', s.client ?? '—'],
    ['Recorded on', s.recordedOn ?? '—'],
    ['Room', s.room ?? '—'],
    ['Engineer', s.engineer?.name ?? '—'],
    ['Producer', s.producer?.name ?? '—'],
    ['Delivery spec', s.deliverySpec?.name ?? 'Takeproof defaults'],
    ['Takes', String(data.takes.length)],
  ];
}

export function summaryLines(data: ReportData): string[] {
  const v = data.counts.verdict;
  const d = data.counts.decision;
  return [
    `Verdicts: ${statusText(VERDICT_STATUS.fail)} ${v.fail} · ${statusText(VERDICT_STATUS.warn)} ${v.warn} · ${statusText(VERDICT_STATUS.pass)} ${v.pass}${v.none ? ` · ${statusText(VERDICT_STATUS.none)} ${v.none}` : ''}`,
    `Decisions: ${statusText(DECISION_STATUS.approved)} ${d.approved} · ${statusText(DECISION_STATUS.rejected)} ${d.rejected} · ${statusText(DECISION_STATUS.pending)} ${d.pending}`,
  ];
}

/** A file name made only of safe ASCII characters, e.g. `harbour-lights-episode-12-report`. */
export function reportFileBase(data: ReportData): string {
  const slug = data.session.title
    .normalize('NFKD')
    .replace(/[^\x20-\x7e]/g, '')
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 60);
  return `session-${data.session.id}${slug ? `-${slug}` : ''}-report`;
}
