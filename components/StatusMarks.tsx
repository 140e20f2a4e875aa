import type { Decision, TakeStatus, Verdict } from '@/models/Take';

// Every status pairs a colour with a shape and a word, so it reads without colour too.
const VERDICT = {
  pass: { shape: '✓', word: 'Pass', tone: 'text-pass' },
  warn: { shape: '▲', word: 'Warn', tone: 'text-warn' },
  fail: { shape: '✕', word: 'Fail', tone: 'text-fail' },
} as const;

const DECISION = {
  pending: { shape: '○', word: 'Pending', tone: 'text-muted' },
  approved: { shape: '●', word: 'Approved', tone: 'text-pass' },
  rejected: { shape: '■', word: 'Rejected', tone: 'text-fail' },
} as const;

export function VerdictMark({ verdict }: { verdict: Verdict | null }) {
  if (!verdict) return <span className="text-muted">—</span>;
  const v = VERDICT[verdict];
  return (
    <span className={`inline-flex items-center gap-1 font-semibold ${v.tone}`}>
      <span aria-hidden="true">{v.shape}</span>
      {v.word}
    </span>
  );
}

export function DecisionMark({ decision }: { decision: Decision }) {
  const d = DECISION[decision];
  return (
    <span className={`inline-flex items-center gap-1 font-semibold ${d.tone}`}>
      <span aria-hidden="true">{d.shape}</span>
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
