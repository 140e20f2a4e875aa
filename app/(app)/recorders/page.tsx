import type { Metadata } from 'next';
import Link from 'next/link';
import { DataTable } from '@/components/DataTable';
import { RecorderForm } from '@/components/RecorderForm';
import { requireActor } from '@/lib/auth/guard.server';
import { loadPage } from '@/lib/http/pages.server';
import { listRecorders } from '@/lib/recorders/service.server';
import { StatusMark } from '@/components/StatusMarks';
import { RECORDER_STATUS } from '@/lib/status';

export const metadata: Metadata = { title: 'Recorders' };

export default async function RecordersPage({ searchParams }: { searchParams: Promise<{ retired?: string }> }) {
  const showRetired = (await searchParams).retired === 'show';
  const recorders = await loadPage(async () => listRecorders(await requireActor('recorder:manage'), { status: showRetired ? 'all' : 'active' }));
  return (
    <div>
      <p className="mb-2 text-sm">
        <Link href="/fleet" className="text-accent hover:underline">← Fleet</Link>
      </p>
      <h1 className="mb-1 text-2xl font-semibold">Recorders</h1>
      <p className="mb-4 max-w-prose text-muted">The interfaces, field recorders and stage boxes of the studio. Takes are assigned to a recorder by its originator match text.</p>
      <div className="grid gap-6 lg:grid-cols-[1fr_24rem]">
        <section className="tp-card" aria-labelledby="recorders-heading">
          <div className="flex flex-wrap items-center gap-3 border-b border-line p-4">
            <h2 id="recorders-heading" className="mr-auto text-lg font-semibold">
              {showRetired ? 'All recorders' : 'Recorders in service'}
            </h2>
            <Link href={showRetired ? '/recorders' : '/recorders?retired=show'} className="tp-button-quiet">
              {showRetired ? 'Hide retired' : 'Show retired'}
            </Link>
          </div>
          <DataTable head={['Label', 'Make and model', 'Location', 'Match text', 'Takes', 'Status']} empty={recorders.length === 0 ? 'No recorders yet. Add the first with the form on this page.' : null}>
            {recorders.map((r) => (
              <tr key={r.id} className="border-t border-line">
                <td className="px-4 py-2">
                  <Link href={`/recorders/${r.id}`} className="font-semibold text-accent underline-offset-2 hover:underline">
                    {r.label}
                  </Link>
                </td>
                <td className="px-4 py-2">{r.makeModel ?? '—'}</td>
                <td className="px-4 py-2">{r.location ?? '—'}</td>
                <td className="px-4 py-2 font-mono">{r.bextMatch ?? '—'}</td>
                <td className="px-4 py-2 font-mono">{r.takeCount}</td>
                <td className="px-4 py-2"><StatusMark status={RECORDER_STATUS[r.active ? 'active' : 'retired']} className="font-normal" /></td>
              </tr>
            ))}
          </DataTable>
        </section>
        <section className="tp-card p-4" aria-labelledby="new-recorder">
          <h2 id="new-recorder" className="mb-3 text-lg font-semibold">
            Add a recorder
          </h2>
          <RecorderForm mode="create" />
        </section>
      </div>
    </div>
  );
}
