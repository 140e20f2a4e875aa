import type { Metadata } from 'next';
import Link from 'next/link';
import { LastCheckCell } from '@/components/converter/LastCheckCell';
import { requireActor } from '@/lib/auth/guard.server';
import { checksOverview } from '@/lib/converterChecks/service.server';
import { loadPage } from '@/lib/http/pages.server';

export const metadata: Metadata = { title: 'Converter checks' };

export default async function ConverterChecksPage() {
  const { intervalDays, recorders } = await loadPage(async () => checksOverview(await requireActor('converter:check')));
  return (
    <div className="max-w-4xl">
      <h1 className="mb-1 text-2xl font-semibold">Converter checks</h1>
      <p className="mb-4 max-w-prose text-muted">
        Each recorder’s converter, measured from a test signal Takeproof writes: play it through the recorder’s line inputs, record it, and upload the recording. A check is due every{' '}
        {intervalDays} days.
      </p>
      <section className="tp-card" aria-labelledby="recorders-heading">
        <h2 id="recorders-heading" className="border-b border-line p-4 text-lg font-semibold">
          Recorders in service
        </h2>
        {recorders.length === 0 ? (
          <p className="p-4 text-muted">No recorders in service.</p>
        ) : (
          <table className="w-full text-left text-sm">
            <thead className="bg-sunken text-muted">
              <tr>
                <th scope="col" className="px-4 py-2 font-semibold">Recorder</th>
                <th scope="col" className="px-4 py-2 font-semibold">Last converter check</th>
              </tr>
            </thead>
            <tbody>
              {recorders.map((r) => (
                <tr key={r.id} className="border-t border-line">
                  <td className="px-4 py-2">
                    <Link href={`/recorders/${r.id}/converter`} className="font-semibold text-accent underline-offset-2 hover:underline">
                      {r.label}
                    </Link>
                    <div className="text-xs text-muted">{r.makeModel ?? 'Make not recorded'}</div>
                  </td>
                  <td className="px-4 py-2">
                    <LastCheckCell check={r.lastCheck} />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </section>
    </div>
  );
}
