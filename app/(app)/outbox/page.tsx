import type { Metadata } from 'next';
import Link from 'next/link';
import { requireActor } from '@/lib/auth/guard.server';
import { listOutbox } from '@/lib/mail/outbox.server';
import { loadPage } from '@/lib/http/pages.server';
import { formatDateTime } from '@/lib/format';

export const metadata: Metadata = { title: 'Outbox' };

export default async function OutboxPage() {
  const messages = await loadPage(async () => listOutbox(await requireActor('mail:view')));
  return (
    <div>
      <h1 className="text-2xl font-semibold">Outbox</h1>
      <p className="mb-6 mt-1 max-w-prose text-muted">E-mail this studio sent, as the local mail catcher received it. Nothing here has left this machine.</p>
      <section className="tp-card" aria-labelledby="caught">
        <h2 id="caught" className="border-b border-line p-4 text-lg font-semibold">
          {messages.length} {messages.length === 1 ? 'message' : 'messages'}
        </h2>
        {messages.length === 0 ? (
          <p className="p-6 text-muted">No e-mail has been caught yet.</p>
        ) : (
          <div className="overflow-x-auto">
            <table className="w-full text-left text-sm">
              <thead className="bg-sunken text-muted">
                <tr>
                  <th scope="col" className="px-4 py-2 font-semibold">Received (UTC)</th>
                  <th scope="col" className="px-4 py-2 font-semibold">To</th>
                  <th scope="col" className="px-4 py-2 font-semibold">Subject</th>
                  <th scope="col" className="px-4 py-2 font-semibold">Attachments</th>
                </tr>
              </thead>
              <tbody>
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
              </tbody>
            </table>
          </div>
        )}
      </section>
    </div>
  );
}
