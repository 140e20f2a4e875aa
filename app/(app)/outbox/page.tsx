import type { Metadata } from 'next';
import Link from 'next/link';
import { DataTable } from '@/components/DataTable';
import { requireActor } from '@/lib/auth/guard.server';
import { outboxOverview } from '@/lib/mail/outbox.server';
import type { DeliveryView } from '@/lib/mail/views';
import { MAIL_STATUS } from '@/lib/status';
import { StatusMark } from '@/components/StatusMarks';
import { loadPage } from '@/lib/http/pages.server';
import { formatDateTime } from '@/lib/format';

export const metadata: Metadata = { title: 'Outbox' };

function DeliveryNote({ d }: { d: DeliveryView }) {
  if (d.status === 'queued' && d.nextAttemptAt) return <>Tried {d.attempts}×; next try {formatDateTime(d.nextAttemptAt)}. {d.error}</>;
  if (d.status === 'queued') return <>Waiting for a worker to send it.</>;
  return <>{d.error ?? (d.sentAt ? `Sent ${formatDateTime(d.sentAt)}` : '—')}</>;
}

export default async function OutboxPage() {
  const { deliveries, messages } = await loadPage(async () => outboxOverview(await requireActor('mail:view')));
  return (
    <div>
      <h1 className="text-2xl font-semibold">Outbox</h1>
      <p className="mb-6 mt-1 max-w-prose text-muted">E-mail this studio sends. Reports wait here until the mail server takes them; Takeproof tries again by itself when it cannot be reached.</p>
      <section className="tp-card mb-6" aria-labelledby="outgoing">
        <h2 id="outgoing" className="border-b border-line p-4 text-lg font-semibold">
          Outgoing e-mail
        </h2>
        <DataTable head={['Created (UTC)', 'Status', 'To', 'Subject', 'Note']} empty={deliveries.length === 0 ? 'Nothing has been sent yet.' : null} testId="outgoing-mail">
          {deliveries.map((d) => (
            <tr key={d.id} className="border-t border-line align-top">
              <td className="whitespace-nowrap px-4 py-2 font-mono">{formatDateTime(d.createdAt)}</td>
              <td className="whitespace-nowrap px-4 py-2">
                <StatusMark status={MAIL_STATUS[d.status]} />
              </td>
              <td className="break-all px-4 py-2">{d.recipients.join(', ')}</td>
              <td className="px-4 py-2">{d.subject}</td>
              <td className="px-4 py-2">
                <DeliveryNote d={d} />
              </td>
            </tr>
          ))}
        </DataTable>
      </section>
      <p className="mb-3 max-w-prose text-muted">As the local mail catcher received it; nothing below has left this machine.</p>
      <section className="tp-card" aria-labelledby="caught">
        <h2 id="caught" className="border-b border-line p-4 text-lg font-semibold">
          {messages.length} {messages.length === 1 ? 'message' : 'messages'}
        </h2>
        <DataTable head={['Received (UTC)', 'To', 'Subject', 'Attachments']} empty={messages.length === 0 ? 'No e-mail has been caught yet.' : null}>
          {messages.map((m) => (
            <tr key={m.id} className="border-t border-line align-top">
              <td className="whitespace-nowrap px-4 py-2 font-mono">{formatDateTime(m.receivedAt)}</td>
              <td className="break-all px-4 py-2">{m.to.join(', ')}</td>
              <td className="px-4 py-2">
                <Link href={`/outbox/${m.id}`} className="font-semibold text-accent hover:underline">
                  {m.subject || '(no subject)'}
                </Link>
              </td>
              <td className="px-4 py-2">{m.attachments.length ? m.attachments.map((a) => a.filename).join(', ') : '—'}</td>
            </tr>
          ))}
        </DataTable>
      </section>
    </div>
  );
}
