import type { Metadata } from 'next';
import Link from 'next/link';
import { requireActor } from '@/lib/auth/guard.server';
import { getOutboxMessage } from '@/lib/mail/outbox.server';
import { loadPage } from '@/lib/http/pages.server';
import { formatBytes, formatDateTime } from '@/lib/format';

export const metadata: Metadata = { title: 'Outbox message' };

export default async function OutboxMessagePage({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const m = await loadPage(async () => getOutboxMessage(await requireActor('mail:view'), id));
  return (
    <article>
      <p className="mb-2 text-sm">
        <Link href="/outbox" className="text-accent hover:underline">
          ← Outbox
        </Link>
      </p>
      <h1 className="mb-3 text-2xl font-semibold">{m.subject || '(no subject)'}</h1>
      <dl className="tp-card mb-4 grid gap-x-4 gap-y-1 p-4 text-sm sm:grid-cols-[8rem_1fr]">
        <dt className="text-muted">Received</dt>
        <dd className="font-mono">{formatDateTime(m.receivedAt)}</dd>
        <dt className="text-muted">From</dt>
        <dd className="break-all">{m.from}</dd>
        <dt className="text-muted">To</dt>
        <dd className="break-all">{m.to.join(', ')}</dd>
        <dt className="text-muted">Attachments</dt>
        <dd>{m.attachments.length ? m.attachments.map((a) => `${a.filename} (${a.contentType}, ${formatBytes(a.size)})`).join(' · ') : '—'}</dd>
      </dl>
      <section className="tp-card p-4" aria-label="Message text">
        <pre className="whitespace-pre-wrap break-words font-mono text-sm">{m.text || '(this message has no plain-text part)'}</pre>
      </section>
    </article>
  );
}
