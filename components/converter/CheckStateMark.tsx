import type { ConverterCheckSummary } from '@/lib/converterChecks/views';
import { TakeStatusMark, VerdictMark } from '../StatusMarks';

/** A check's result: its measurement status until measured, then its judged state. */
export function CheckStateMark({ check }: { check: Pick<ConverterCheckSummary, 'status' | 'progress' | 'error' | 'state'> }) {
  if (check.status !== 'measured') return <TakeStatusMark status={check.status} progress={check.progress} error={check.error} />;
  return <VerdictMark verdict={check.state} />;
}
