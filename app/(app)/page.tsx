import Link from 'next/link';
import { requireActor } from '@/lib/auth/guard';
import { loadPage } from '@/lib/pages';
import { listSessions } from '@/lib/sessions';

const GREETING = {
  engineer: 'Your open sessions. Upload the takes after each session and Takeproof measures every one.',
  producer: 'Sessions with takes to review. Approve what goes to the edit, reject what needs a retake.',
  manager: 'The studio at a glance: sessions in progress across every room.',
} as const;

export default async function OverviewPage() {
  const { actor, sessions } = await loadPage(async () => {
    const actor = await requireActor('session:view');
    return { actor, sessions: await listSessions(actor, { status: 'open' }) };
  });
  return (
    <div>
      <h1 className="text-2xl font-semibold">Hello, {actor.name.split(' ')[0]}</h1>
      <p className="mb-6 mt-1 max-w-prose text-muted">{GREETING[actor.role]}</p>
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
                  {s.client ?? 'No client'} · <span className="font-mono">{s.recordedOn ?? 'undated'}</span> · {s.takeCount} takes
                </span>
              </li>
            ))}
          </ul>
        )}
      </section>
    </div>
  );
}
