import { DECISION_STATUS, TAKE_STATUS, VERDICT_STATUS, type StatusLook, type Tone } from '@/lib/status';
import type { Decision, TakeStatus, Verdict } from '@/models/Take';

/** The page colour of each tone; always beside a mark and a word. */
export const TONE_CLASS: Record<Tone, string> = { pass: 'text-pass', warn: 'text-warn', fail: 'text-fail', muted: 'text-muted', accent: 'text-accent' };

/** Any status of lib/status.ts: its mark, its word, its tone. */
export function StatusMark({ status, className = '', children }: { status: StatusLook; className?: string; children?: React.ReactNode }) {
  return (
    <span className={`inline-flex items-center gap-1 font-semibold ${TONE_CLASS[status.tone]} ${className}`}>
      <span aria-hidden="true">{status.mark}</span>
      {children ?? status.word}
    </span>
  );
}

export function VerdictMark({ verdict }: { verdict: Verdict | null }) {
  return <StatusMark status={VERDICT_STATUS[verdict ?? 'none']} />;
}

export function DecisionMark({ decision }: { decision: Decision }) {
  return <StatusMark status={DECISION_STATUS[decision]} />;
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
  return (
    <span title={status === 'unreadable' ? (error ?? undefined) : undefined}>
      <StatusMark status={TAKE_STATUS[status]} className={status === 'unreadable' ? '' : 'font-normal'} />
    </span>
  );
}
