import Link from 'next/link';
import { DecisionMark, TakeStatusMark, VerdictMark } from './StatusMarks';
import type { DashboardTake } from '@/lib/overview/views';

/** A short list of takes on the overview page, each linking to its review page. */
export function DashboardTakeList({ title, takes, empty, show }: { title: string; takes: DashboardTake[]; empty: string; show: 'status' | 'verdict' | 'reject' }) {
  const headingId = `dash-${title.toLowerCase().replace(/[^a-z]+/g, '-')}`;
  return (
    <section className="tp-card" aria-labelledby={headingId}>
      <h2 id={headingId} className="border-b border-line p-4 text-lg font-semibold">
        {title} <span className="font-mono text-base text-muted">({takes.length})</span>
      </h2>
      {takes.length === 0 ? (
        <p className="p-6 text-muted">{empty}</p>
      ) : (
        <ul>
          {takes.map((t) => (
            <li key={t.id} className="flex flex-wrap items-center gap-x-4 gap-y-1 border-t border-line px-4 py-3 first:border-t-0">
              <Link href={`/takes/${t.id}`} className="min-w-0 flex-1 truncate font-semibold text-accent hover:underline" title={t.name}>
                {t.name}
              </Link>
              <Link href={`/sessions/${t.sessionId}`} className="text-sm text-muted hover:underline">
                {t.sessionTitle}
              </Link>
              {show === 'status' && <TakeStatusMark status={t.status} progress={t.progress} error={null} />}
              {show === 'verdict' && <VerdictMark verdict={t.verdict} />}
              {show === 'verdict' && t.reason && <span className="basis-full text-sm">{t.reason}</span>}
              {show === 'reject' && (
                <span className="text-sm">
                  <DecisionMark decision="rejected" />
                  {t.decidedBy ? ` by ${t.decidedBy}` : ''}
                  {t.decisionNote ? ` — “${t.decisionNote}”` : ''}
                </span>
              )}
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
