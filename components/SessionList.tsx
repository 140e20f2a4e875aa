'use client';

import Link from 'next/link';
import { DataTable } from './DataTable';
import { useState } from 'react';
import useSWR from 'swr';
import { type ApiError } from '@/lib/http/fetcher';
import { sessionsKey } from '@/lib/http/swrKeys';
import type { SessionSummary } from '@/lib/sessions/views';
import { FormMessage } from './FormMessage';
import { StatusMark } from './StatusMarks';
import { SESSION_STATUS } from '@/lib/status';

/** The studio's sessions with search and an open/closed filter. */
export function SessionList() {
  const [q, setQ] = useState('');
  const [status, setStatus] = useState('all');
  const { data, error, isLoading } = useSWR<{ sessions: SessionSummary[] }, ApiError>(sessionsKey(q.trim(), status));
  const sessions = data?.sessions ?? [];

  return (
    <section aria-labelledby="sessions-heading" className="tp-card">
      <div className="flex flex-wrap items-end gap-3 border-b border-line p-4">
        <h2 id="sessions-heading" className="mr-auto text-lg font-semibold">
          Sessions
        </h2>
        <label className="text-sm">
          <span className="tp-label">Search</span>
          <input className="tp-input w-56" type="search" value={q} onChange={(e) => setQ(e.target.value)} placeholder="Title, client or room" />
        </label>
        <label className="text-sm">
          <span className="tp-label">Status</span>
          <select className="tp-input" value={status} onChange={(e) => setStatus(e.target.value)}>
            <option value="all">All</option>
            <option value="open">Open</option>
            <option value="closed">Closed</option>
          </select>
        </label>
      </div>
      <FormMessage error={error?.message} className="p-4" />
      {!error && isLoading && !data && <p className="p-4 text-muted">Loading sessions…</p>}
      {!error && data && sessions.length === 0 && (
        <p className="p-6 text-muted">{q || status !== 'all' ? 'No session matches this search.' : 'No sessions yet. Start one with the form on this page.'}</p>
      )}
      {sessions.length > 0 && (
        <DataTable head={['Title', 'Show / client', 'Date', 'Room', 'Takes', 'Status']} empty={null}>
          {sessions.map((s) => (
            <tr key={s.id} className="border-t border-line">
              <td className="px-4 py-2">
                <Link href={`/sessions/${s.id}`} className="font-semibold text-accent underline-offset-2 hover:underline">
                  {s.title}
                </Link>
              </td>
              <td className="px-4 py-2">{s.client ?? '—'}</td>
              <td className="px-4 py-2 font-mono">{s.recordedOn ?? '—'}</td>
              <td className="px-4 py-2">{s.room ?? '—'}</td>
              <td className="px-4 py-2 font-mono">{s.takeCount}</td>
              <td className="px-4 py-2"><StatusMark status={SESSION_STATUS[s.status]} className="font-normal" /></td>
            </tr>
          ))}
        </DataTable>
      )}
    </section>
  );
}
