import type { Metadata } from 'next';
import Link from 'next/link';
import { SpecForm } from '@/components/SpecForm';
import { requireActor } from '@/lib/auth/guard.server';
import { DEFAULT_THRESHOLDS } from '@/lib/specs/service.server';
import { loadPage } from '@/lib/http/pages.server';

export const metadata: Metadata = { title: 'New delivery spec' };

export default async function NewSpecPage() {
  await loadPage(() => requireActor('spec:manage'));
  return (
    <div className="max-w-5xl">
      <p className="mb-2 text-sm">
        <Link href="/specs" className="text-accent hover:underline">← All delivery specs</Link>
      </p>
      <h1 className="mb-1 text-2xl font-semibold">New delivery spec</h1>
      <p className="mb-4 max-w-prose text-muted">It starts from Takeproof’s defaults; change what your delivery asks for.</p>
      <SpecForm mode="create" spec={{ name: '', description: null, thresholds: DEFAULT_THRESHOLDS }} />
    </div>
  );
}
