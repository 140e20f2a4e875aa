import Link from 'next/link';
import { requireActor } from '@/lib/auth/guard.server';
import { loadPage } from '@/lib/http/pages.server';
import { DashboardTakeList } from '@/components/DashboardTakeList';
import { FleetAlertsSummary } from '@/components/FleetAlertsSummary';
import { can } from '@/lib/auth/policy';
import { openSessionsFor, recentRejects, takesAwaitingReview, takesInMeasurement } from '@/lib/overview/overview.server';

const GREETING = {
  engineer: 'Your open sessions and the takes still being measured. Upload the takes after each session; Takeproof measures every one.',
  producer: 'Takes waiting for your decision, failing ones first. Approve what goes to the edit, reject what needs a retake.',
  manager: 'The studio at a glance: what needs review, recent rejects and sessions in progress across every room.',
} as const;

export default async function OverviewPage() {
  const data = await loadPage(async () => {
    const actor = await requireActor('session:view');
    const uploads = can(actor.role, 'take:upload');
    return {
      actor,
      sessions: await openSessionsFor(actor, !can(actor.role, 'session:oversee')),
      measuring: uploads ? await takesInMeasurement(actor) : null,
      review: can(actor.role, 'take:decide') ? await takesAwaitingReview(actor) : null,
      rejects: can(actor.role, 'fleet:view') ? await recentRejects(actor) : null,
    };
  });
  const { actor, sessions } = data;
  return (
    <div>
      <h1 className="text-2xl font-semibold">Hello, {actor.name.split(' ')[0]}</h1>
      <p className="mb-6 mt-1 max-w-prose text-muted">{GREETING[actor.role]}</p>
      <div className="grid gap-6 lg:grid-cols-2">
      {data.review && <DashboardTakeList title="Awaiting your review" takes={data.review} show="verdict" empty="Nothing to review: every measured take has a decision." />}
      {data.measuring && <DashboardTakeList title="Still measuring" takes={data.measuring} show="status" empty="None of your uploads is waiting to be measured." />}
      {data.rejects && <DashboardTakeList title="Recent rejects" takes={data.rejects} show="reject" empty="No take has been rejected yet." />}
      <section className="tp-card" aria-labelledby="open-sessions">
        <h2 id="open-sessions" className="border-b border-line p-4 text-lg font-semibold">
          Open sessions
        </h2>
        {sessions.length === 0 ? (
          <p className="p-6 text-muted">
            No open sessions. <Link href="/sessions" className="text-accent underline">Start one</Link>.
          </p>
        ) : (
          <ul>
            {sessions.slice(0, 10).map((s) => (
              <li key={s.id} className="flex items-center justify-between border-t border-line px-4 py-3 first:border-t-0">
                <Link href={`/sessions/${s.id}`} className="font-semibold text-accent hover:underline">
                  {s.title}
                </Link>
                <span className="text-sm text-muted">
                  {s.client ?? 'No client'} · <span className="font-mono">{s.recordedOn ?? 'undated'}</span>
                </span>
              </li>
            ))}
          </ul>
        )}
      </section>
      </div>
      {can(actor.role, 'fleet:view') && <FleetAlertsSummary actor={actor} />}
    </div>
  );
}
