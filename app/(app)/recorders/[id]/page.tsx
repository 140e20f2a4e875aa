import type { Metadata } from 'next';
import Link from 'next/link';
import { RecorderForm } from '@/components/RecorderForm';
import { requireActor } from '@/lib/auth/guard.server';
import { loadPage } from '@/lib/http/pages.server';
import { idParam } from '@/lib/http/route.server';
import { getRecorder } from '@/lib/recorders/service.server';
import { StatusMark } from '@/components/StatusMarks';
import { RECORDER_STATUS } from '@/lib/status';

export const metadata: Metadata = { title: 'Recorder' };

export default async function RecorderEditPage({ params, searchParams }: { params: Promise<{ id: string }>; searchParams: Promise<{ created?: string }> }) {
  const recorder = await loadPage(async () => {
    const actor = await requireActor('recorder:manage');
    return getRecorder(actor, await idParam(params, 'recorder'));
  });
  const { created } = await searchParams;
  return (
    <div className="max-w-3xl">
      <p className="mb-2 text-sm">
        <Link href="/recorders" className="text-accent hover:underline">← All recorders</Link>
      </p>
      <h1 className="text-2xl font-semibold">{recorder.label}</h1>
      <p className="mb-4 mt-1 text-muted">
        <StatusMark status={RECORDER_STATUS[recorder.active ? 'active' : 'retired']} className="font-normal" /> · {recorder.takeCount} takes ·{' '}
        <Link href={`/fleet/${recorder.id}`} className="text-accent underline">
          Trends and alerts
        </Link>{' '}
        ·{' '}
        <Link href={`/recorders/${recorder.id}/converter`} className="text-accent underline">
          Check the converter
        </Link>
      </p>
      {created && (
        <p role="status" className="mb-4 text-sm text-pass">
          <span aria-hidden="true">✓ </span>Recorder added.
        </p>
      )}
      <section className="tp-card p-4">
        <RecorderForm mode="edit" recorder={recorder} />
      </section>
    </div>
  );
}
