import type { Metadata } from 'next';
import Link from 'next/link';
import { SpecDuplicateButton } from '@/components/SpecDuplicateButton';
import { requireActor } from '@/lib/auth/guard.server';
import { listSpecs } from '@/lib/specs/service.server';
import { loadPage } from '@/lib/http/pages.server';
import { formatKhz } from '@/lib/format';
import { SPEC_PRECEDENCE_NOTE } from '@/lib/specs/fields';

export const metadata: Metadata = { title: 'Delivery specs' };

export default async function SpecsPage() {
  const specs = await loadPage(async () => listSpecs(await requireActor('spec:manage')));
  return (
    <div>
      <div className="mb-2 flex flex-wrap items-center gap-3">
        <h1 className="mr-auto text-2xl font-semibold">Delivery specs</h1>
        <Link href="/specs/new" className="tp-button">
          New spec
        </Link>
      </div>
      <p className="mb-2 max-w-prose text-muted">The thresholds each session’s takes are judged against. A session without a spec uses Takeproof’s defaults.</p>
      <p className="mb-6 max-w-prose rounded-md border border-line bg-sunken p-3 text-sm">
        <strong>Note: </strong>
        {SPEC_PRECEDENCE_NOTE}
      </p>
      {specs.length === 0 ? (
        <p className="tp-card p-6 text-muted">No delivery specs yet. Create one to judge takes against your delivery’s own numbers.</p>
      ) : (
        <div className="tp-card overflow-x-auto">
          <table className="w-full text-left text-sm">
            <thead className="bg-sunken text-muted">
              <tr>
                <th scope="col" className="px-4 py-2 font-semibold">Name</th>
                <th scope="col" className="px-4 py-2 font-semibold">Loudness</th>
                <th scope="col" className="px-4 py-2 font-semibold">True peak</th>
                <th scope="col" className="px-4 py-2 font-semibold">Effective bits</th>
                <th scope="col" className="px-4 py-2 font-semibold">Format</th>
                <th scope="col" className="px-4 py-2 font-semibold">Sessions</th>
                <th scope="col" className="px-4 py-2 font-semibold"><span className="sr-only">Actions</span></th>
              </tr>
            </thead>
            <tbody>
              {specs.map((s) => (
                <tr key={s.id} className="border-t border-line">
                  <td className="px-4 py-2">
                    <Link href={`/specs/${s.id}`} className="font-semibold text-accent underline-offset-2 hover:underline">
                      {s.name}
                    </Link>
                    {s.archived && <div className="text-xs font-semibold text-muted">Archived: not offered for new sessions</div>}
                    {s.description && <div className="max-w-md text-xs text-muted">{s.description}</div>}
                  </td>
                  <td className="px-4 py-2 font-mono">
                    {s.thresholds.loudnessTargetLufs} LUFS ±{s.thresholds.loudnessToleranceLu} LU{s.thresholds.loudnessIsStrict ? ' (strict)' : ''}
                  </td>
                  <td className="px-4 py-2 font-mono">≤ {s.thresholds.maxTruePeakDbtp} dBTP</td>
                  <td className="px-4 py-2 font-mono">≥ {s.thresholds.minEffectiveBits} bits</td>
                  <td className="px-4 py-2 font-mono">
                    {s.thresholds.requiredSampleRate ? formatKhz(s.thresholds.requiredSampleRate) : 'any rate'}, {s.thresholds.requiredBitDepth ? `${s.thresholds.requiredBitDepth}-bit` : 'any depth'}
                  </td>
                  <td className="px-4 py-2 font-mono">{s.sessionCount}</td>
                  <td className="px-4 py-2 text-right">
                    <span className="inline-flex gap-2">
                      <Link href={`/specs/${s.id}`} className="tp-button-quiet" aria-label={`Edit ${s.name}`}>
                        Edit
                      </Link>
                      <SpecDuplicateButton specId={s.id} specName={s.name} />
                    </span>
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </div>
  );
}
