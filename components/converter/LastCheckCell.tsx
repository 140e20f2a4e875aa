import Link from 'next/link';
import { formatDate } from '@/lib/format';
import type { LastConverterCheck } from '@/lib/converterChecks/views';
import { VerdictMark } from '../StatusMarks';

/** A recorder's latest converter check: its date (a link to it), its result, and drift or overdue marks. */
export function LastCheckCell({ check }: { check: LastConverterCheck | null }) {
  if (!check) return <span className="text-muted">Never</span>;
  return (
    <>
      <Link href={`/converter-checks/${check.checkId}`} className="font-mono text-accent underline-offset-2 hover:underline">
        {formatDate(check.measuredAt)}
      </Link>
      <div className="text-xs">
        <VerdictMark verdict={check.state} />
        {check.drifted && <span className="ml-2 font-semibold text-warn">▲ Drift</span>}
        {check.overdue && <span className="ml-2 font-semibold text-warn">◷ Overdue</span>}
      </div>
    </>
  );
}
