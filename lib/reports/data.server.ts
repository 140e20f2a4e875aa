import 'server-only';
import type { Actor } from '@/lib/auth/guard.server';
import { getSession, type SessionSummary } from '@/lib/sessions/service.server';
import { studioName } from '@/lib/studio/studio.server';
import { listSessionTakes } from '@/lib/takes/service.server';
import type { TakeSummary } from '@/lib/takes/views';
import { DECISION_LABEL, VERDICT_LABEL } from './labels';

export interface ReportData {
  studio: string;
  session: SessionSummary;
  takes: TakeSummary[];
  counts: {
    verdict: { pass: number; warn: number; fail: number; none: number };
    decision: { approved: number; rejected: number; pending: number };
  };
  generatedAt: Date;
}

/** Everything a session report shows, read once for the e-mail, the PDF and the CSV alike. */
export async function loadReport(actor: Actor, sessionId: number): Promise<ReportData> {
  const session = await getSession(actor, sessionId);
  const takes = await listSessionTakes(actor, sessionId);
  const counts: ReportData['counts'] = { verdict: { pass: 0, warn: 0, fail: 0, none: 0 }, decision: { approved: 0, rejected: 0, pending: 0 } };
  for (const t of takes) {
    counts.verdict[t.verdict ?? 'none']++;
    counts.decision[t.decision]++;
  }
  return { studio: await studioName(actor), session, takes, counts, generatedAt: new Date() };
}

const num = (v: number | null, decimals: number, unit: string) => (v == null || !Number.isFinite(v) ? '—' : `${v.toFixed(decimals)} ${unit}`);

/** Display text of one take's cells, shared by the e-mail and the PDF. */
export function takeCells(t: TakeSummary) {
  const f = t.format;
  const format = f.sampleRate
    ? `${(f.sampleRate / 1000).toFixed(f.sampleRate % 1000 ? 1 : 0)} kHz / ${f.bitsPerSample ?? '?'}-bit${f.encoding === 'float' ? ' float' : ''} / ${f.channels === 1 ? 'mono' : f.channels === 2 ? 'stereo' : `${f.channels ?? '?'} ch`}`
    : '—';
  const verdict = VERDICT_LABEL[t.verdict ?? 'none'];
  const decision = DECISION_LABEL[t.decision];
  return {
    name: t.originalName,
    format,
    duration: t.durationSec == null ? '—' : formatClock(t.durationSec),
    verdict,
    decision,
    truePeak: num(t.truePeakDbtp, 1, 'dBTP'),
    loudness: num(t.integratedLufs, 1, 'LUFS'),
    noiseFloor: num(t.noiseFloorDbfs, 1, 'dBFS'),
    effectiveBits: t.effectiveBits == null ? '—' : String(t.effectiveBits),
    clips: t.clipEvents == null ? '—' : String(t.clipEvents),
    note: [t.decisionNote, t.decidedBy ? `${decision.word} by ${t.decidedBy}` : null].filter(Boolean).join(' · '),
    problem: t.status === 'unreadable' ? (t.error ?? 'The file could not be read.') : t.status === 'queued' || t.status === 'measuring' ? 'Still being measured.' : null,
  };
}

function formatClock(seconds: number): string {
  const s = Math.round(seconds);
  const h = Math.floor(s / 3600);
  const m = Math.floor((s % 3600) / 60);
  const rest = String(s % 60).padStart(2, '0');
  return h ? `${h}:${String(m).padStart(2, '0')}:${rest}` : `${m}:${rest}`;
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
    `Verdicts: ✓ Pass ${v.pass} · ▲ Warn ${v.warn} · ✕ Fail ${v.fail}${v.none ? ` · ○ Not measured ${v.none}` : ''}`,
    `Decisions: Approved ${d.approved} · Rejected ${d.rejected} · Pending ${d.pending}`,
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
