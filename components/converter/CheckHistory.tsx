'use client';

import Link from 'next/link';
import useSWR from 'swr';
import type { ApiError } from '@/lib/http/fetcher';
import { recorderChecksKey } from '@/lib/http/swrKeys';
import { formatDate, formatDateTime, describeFormat } from '@/lib/format';
import type { RecorderChecksView } from '@/lib/converterChecks/views';
import { FormMessage } from '../FormMessage';
import { CheckStateMark } from './CheckStateMark';

/** Every converter check of a recorder, newest first; refreshes while one is being measured. */
export function CheckHistory({ recorderId }: { recorderId: number }) {
  const { data, error } = useSWR<RecorderChecksView, ApiError>(recorderChecksKey(recorderId), {
    // Nothing in the cache yet (the page's fallback is not passed here) counts as still measuring.
    refreshInterval: (latest) => (!latest || latest.checks.some((c) => c.status === 'queued' || c.status === 'measuring') ? 2000 : 0),
  });
  const checks = data?.checks ?? [];
  return (
    <section className="tp-card" aria-labelledby="history-heading">
      <div className="border-b border-line p-4">
        <h2 id="history-heading" className="text-lg font-semibold">
          Check history
        </h2>
        {data && (
          <p className="text-sm text-muted">
            A check is due every {data.intervalDays} days{data.dueAt ? `; the next by ${formatDate(data.dueAt)}` : ''}. The first check that measures cleanly becomes the baseline later
            checks are compared with.
          </p>
        )}
      </div>
      <FormMessage error={error?.message} className="p-4" />
      {data && checks.length === 0 && <p className="p-4 text-muted">No converter checks yet.</p>}
      {checks.length > 0 && (
        <div className="overflow-x-auto">
          <table className="w-full text-left text-sm" aria-label="Converter checks">
            <thead className="bg-sunken text-muted">
              <tr>
                <th scope="col" className="px-3 py-2 font-semibold">Measured</th>
                <th scope="col" className="px-3 py-2 font-semibold">Result</th>
                <th scope="col" className="px-3 py-2 font-semibold">Against the baseline</th>
                <th scope="col" className="px-3 py-2 font-semibold">Format</th>
                <th scope="col" className="px-3 py-2 font-semibold">Uploaded by</th>
              </tr>
            </thead>
            <tbody>
              {checks.map((c) => (
                <tr key={c.id} className="border-t border-line" data-testid="converter-check-row">
                  <td className="px-3 py-2">
                    <Link href={`/converter-checks/${c.id}`} className="font-mono text-accent underline-offset-2 hover:underline">
                      {formatDateTime(c.measuredAt ?? c.uploadedAt)}
                    </Link>
                    <div className="text-xs text-muted">{c.originalName}</div>
                  </td>
                  <td className="px-3 py-2">
                    <CheckStateMark check={c} />
                  </td>
                  <td className="px-3 py-2">
                    {c.isBaseline ? (
                      <span className="font-semibold">⚑ Baseline</span>
                    ) : c.drift.length > 0 ? (
                      <span className="font-semibold text-warn" title={c.drift.join(' ')}>
                        ▲ {c.drift.length} {c.drift.length === 1 ? 'change' : 'changes'}
                      </span>
                    ) : c.status === 'measured' ? (
                      <span className="text-muted">● No drift</span>
                    ) : (
                      <span className="text-muted">—</span>
                    )}
                  </td>
                  <td className="px-3 py-2 text-xs">{c.format ? describeFormat(c.format) : '—'}</td>
                  <td className="px-3 py-2">{c.uploadedBy ?? '—'}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </section>
  );
}
