import type { Metadata } from 'next';
import Link from 'next/link';
import { requireActor } from '@/lib/auth/guard';
import { loadPage } from '@/lib/pages';
import { getSession } from '@/lib/sessions';

export const metadata: Metadata = { title: 'Session' };

export default async function SessionPage({ params }: { params: Promise<{ id: string }> }) {
  const { session } = await loadPage(async () => {
    const actor = await requireActor('session:view');
    const id = Number((await params).id);
    return { actor, session: await getSession(actor, Number.isInteger(id) && id > 0 ? id : 0) };
  });
  return (
    <article>
      <p className="mb-2 text-sm">
        <Link href="/sessions" className="text-accent hover:underline">
          ← All sessions
        </Link>
      </p>
      <header className="mb-6">
        <h1 className="text-2xl font-semibold">{session.title}</h1>
        <dl className="mt-2 flex flex-wrap gap-x-6 gap-y-1 text-sm text-muted">
          <div><dt className="inline">Show / client: </dt><dd className="inline text-ink">{session.client ?? '—'}</dd></div>
          <div><dt className="inline">Recorded on: </dt><dd className="inline font-mono text-ink">{session.recordedOn ?? '—'}</dd></div>
          <div><dt className="inline">Room: </dt><dd className="inline text-ink">{session.room ?? '—'}</dd></div>
          <div><dt className="inline">Engineer: </dt><dd className="inline text-ink">{session.engineer?.name ?? '—'}</dd></div>
          <div><dt className="inline">Producer: </dt><dd className="inline text-ink">{session.producer?.name ?? '—'}</dd></div>
          <div><dt className="inline">Delivery spec: </dt><dd className="inline text-ink">{session.deliverySpec?.name ?? 'Takeproof defaults'}</dd></div>
          <div><dt className="inline">Status: </dt><dd className="inline text-ink">{session.status === 'open' ? '○ Open' : '● Closed'}</dd></div>
        </dl>
        {session.notes && <p className="mt-3 max-w-prose whitespace-pre-line">{session.notes}</p>}
      </header>
      <section className="tp-card p-6 text-muted" aria-label="Takes">
        {session.takeCount === 0 ? 'No takes in this session yet.' : `${session.takeCount} takes in this session.`}
      </section>
    </article>
  );
}
