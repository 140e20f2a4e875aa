import type { Metadata } from 'next';
import Link from 'next/link';
import { DataTable } from '@/components/DataTable';
import { requireActor } from '@/lib/auth/guard.server';
import { auditFilterOptions, listAuditEvents } from '@/lib/audit/log.server';
import { loadPage } from '@/lib/http/pages.server';
import { auditQuerySchema, type AuditQuery } from '@/lib/audit/schema';
import type { AuditPage } from '@/lib/audit/views';
import { formatDateTime } from '@/lib/format';
import { actionWords, detailWords, subjectWords } from '@/lib/audit/words';

export const metadata: Metadata = { title: 'Audit log' };

type Search = Record<string, string | string[] | undefined>;

export default async function AuditLogPage({ searchParams }: { searchParams: Promise<Search> }) {
  const raw = Object.fromEntries(Object.entries(await searchParams).map(([k, v]) => [k, Array.isArray(v) ? v[0] : v])) as Record<string, string | undefined>;
  const parsed = auditQuerySchema.safeParse(raw);
  const query: AuditQuery = parsed.success ? parsed.data : { page: 1 };
  const problems = parsed.success ? [] : parsed.error.issues.map((i) => i.message);
  const { result, options } = await loadPage(async () => {
    const actor = await requireActor('audit:view');
    return { result: (await listAuditEvents(actor, query)) as AuditPage, options: await auditFilterOptions(actor) };
  });
  const pageHref = (page: number) => {
    const p = new URLSearchParams();
    for (const [k, v] of Object.entries(query)) if (v !== undefined && k !== 'page') p.set(k, String(v));
    p.set('page', String(page));
    return `/audit?${p.toString()}`;
  };

  return (
    <div>
      <h1 className="mb-4 text-2xl font-semibold">Audit log</h1>
      <form method="get" action="/audit" className="tp-card mb-6 grid gap-4 p-4 sm:grid-cols-3 lg:grid-cols-6" aria-label="Filter the audit log">
        <div>
          <label htmlFor="action" className="tp-label">Action</label>
          <select id="action" name="action" className="tp-input" defaultValue={query.action ?? ''}>
            <option value="">Any</option>
            {options.actions.map((a) => (
              <option key={a} value={a}>{actionWords(a)}</option>
            ))}
          </select>
        </div>
        <div>
          <label htmlFor="actorId" className="tp-label">Person</label>
          <select id="actorId" name="actorId" className="tp-input" defaultValue={query.actorId ? String(query.actorId) : ''}>
            <option value="">Anyone</option>
            {options.people.map((p) => (
              <option key={p.id} value={p.id}>{p.name}</option>
            ))}
          </select>
        </div>
        <div>
          <label htmlFor="subjectType" className="tp-label">Object type</label>
          <select id="subjectType" name="subjectType" className="tp-input" defaultValue={query.subjectType ?? ''}>
            <option value="">Any</option>
            {options.subjectTypes.map((t) => (
              <option key={t} value={t}>{subjectWords(t)}</option>
            ))}
          </select>
        </div>
        <div>
          <label htmlFor="from" className="tp-label">From (UTC)</label>
          <input id="from" name="from" type="date" className="tp-input" defaultValue={query.from ?? ''} />
        </div>
        <div>
          <label htmlFor="to" className="tp-label">To (UTC)</label>
          <input id="to" name="to" type="date" className="tp-input" defaultValue={query.to ?? ''} />
        </div>
        <div className="flex items-end gap-2">
          <button type="submit" className="tp-button">Filter</button>
          <Link href="/audit" className="tp-button-quiet">Clear</Link>
        </div>
        {problems.length > 0 && (
          <p role="alert" className="tp-field-error sm:col-span-3 lg:col-span-6">
            <span aria-hidden="true">✕ </span>
            {problems.join(' ')} The filters were not applied.
          </p>
        )}
      </form>

      <section className="tp-card" aria-labelledby="events">
        <h2 id="events" className="border-b border-line p-4 text-lg font-semibold">
          {result.total} {result.total === 1 ? 'event' : 'events'}, newest first
        </h2>
        <DataTable head={['When (UTC)', 'Person', 'Action', 'Object', 'Details']} empty={result.events.length === 0 ? 'No event matches these filters.' : null}>
          {result.events.map((e) => (
            <tr key={e.id} className="border-t border-line align-top">
              <td className="whitespace-nowrap px-4 py-2 font-mono">{formatDateTime(e.at)}</td>
              <td className="px-4 py-2">{e.actor?.name ?? '—'}</td>
              <td className="px-4 py-2">{actionWords(e.action)}</td>
              <td className="px-4 py-2">
                {subjectWords(e.subjectType)}
                {e.subjectName ? ` “${e.subjectName}”` : ''}
              </td>
              <td className="break-words px-4 py-2 text-muted">{detailWords(e.action, e.detail)}</td>
            </tr>
          ))}
        </DataTable>
        <nav aria-label="Pages" className="flex items-center gap-3 border-t border-line p-4 text-sm">
          {result.page > 1 ? <Link className="tp-button-quiet" href={pageHref(result.page - 1)}>← Newer</Link> : null}
          <span className="text-muted">Page {result.page} of {result.pages}</span>
          {result.page < result.pages ? <Link className="tp-button-quiet" href={pageHref(result.page + 1)}>Older →</Link> : null}
        </nav>
      </section>
    </div>
  );
}
