import { DECISION_LABEL, VERDICT_LABEL } from '@/lib/glossary';
import type { Decision, TakeStatus, Verdict } from '@/models/Take';

// Every status pairs a colour with a shape and a word, so it reads without colour too.
const VERDICT_TONE = { pass: 'text-pass', warn: 'text-warn', fail: 'text-fail' } as const;
const DECISION_TONE = { pending: 'text-muted', approved: 'text-pass', rejected: 'text-fail' } as const;

export function VerdictMark({ verdict }: { verdict: Verdict | null }) {
  if (!verdict) return <span className="text-muted">—</span>;
  const v = VERDICT_LABEL[verdict];
  return (
    <span className={`inline-flex items-center gap-1 font-semibold ${VERDICT_TONE[verdict]}`}>
      <span aria-hidden="true">{v.mark}</span>
      {v.word}
    </span>
  );
}

export function DecisionMark({ decision }: { decision: Decision }) {
  const d = DECISION_LABEL[decision];
  return (
    <span className={`inline-flex items-center gap-1 font-semibold ${DECISION_TONE[decision]}`}>
      <span aria-hidden="true">{d.mark}</span>
      {d.word}
    </span>
  );
}

/** Where a take is in its measurement, with live progress while it is measured. */
export function TakeStatusMark({ status, progress, error }: { status: TakeStatus; progress: number; error: string | null }) {
  if (status === 'measuring') {
    return (
      <span className="inline-flex min-w-28 items-center gap-2" title="Being measured">
        <span className="font-mono text-xs">{Math.round(progress)} %</span>
        <span className="h-1.5 w-16 overflow-hidden rounded bg-sunken" role="progressbar" aria-valuenow={Math.round(progress)} aria-valuemin={0} aria-valuemax={100} aria-label="Measuring">
          <span className="block h-full bg-accent" style={{ width: `${progress}%` }} />
        </span>
      </span>
    );
  }
  if (status === 'queued') return <span className="text-muted">◷ Queued</span>;
  if (status === 'unreadable') {
    return (
      <span className="font-semibold text-fail" title={error ?? undefined}>
        ✕ Unreadable
      </span>
    );
  }
  return <span className="text-muted">Measured</span>;
}
