import type { Metadata } from 'next';
import Link from 'next/link';
import { SpecArchiveButton } from '@/components/SpecArchiveButton';
import { SpecDuplicateButton } from '@/components/SpecDuplicateButton';
import { SpecForm } from '@/components/SpecForm';
import { requireActor } from '@/lib/auth/guard.server';
import { getSpec } from '@/lib/specs/service.server';
import { loadPage } from '@/lib/http/pages.server';
import { idParam } from '@/lib/http/route.server';

export const metadata: Metadata = { title: 'Delivery spec' };

export default async function SpecPage({ params, searchParams }: { params: Promise<{ id: string }>; searchParams: Promise<{ created?: string }> }) {
  const spec = await loadPage(async () => {
    const actor = await requireActor('spec:manage');
    return getSpec(actor, await idParam(params, 'spec'));
  });
  const { created } = await searchParams;
  return (
    <div className="max-w-5xl">
      <p className="mb-2 text-sm">
        <Link href="/specs" className="text-accent hover:underline">← All delivery specs</Link>
      </p>
      <div className="mb-1 flex flex-wrap items-center gap-3">
        <h1 className="mr-auto text-2xl font-semibold">{spec.name}</h1>
        <SpecDuplicateButton specId={spec.id} specName={spec.name} />
        <SpecArchiveButton specId={spec.id} archived={spec.archived} />
      </div>
      <p className="mb-4 text-muted">
        {spec.archived && <strong className="text-ink">Archived: not offered for new sessions. </strong>}
        Used by {spec.sessionCount} session{spec.sessionCount === 1 ? '' : 's'}. Changing a threshold judges their takes again from the stored measurements; no audio is read again.
      </p>
      {created && (
        <p role="status" className="mb-4 text-sm text-pass">
          <span aria-hidden="true">✓ </span>Spec saved.
        </p>
      )}
      <SpecForm mode="edit" spec={spec} />
    </div>
  );
}
