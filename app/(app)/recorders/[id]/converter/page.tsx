import type { Metadata } from 'next';
import Link from 'next/link';
import { CheckHistory } from '@/components/converter/CheckHistory';
import { CheckStart } from '@/components/converter/CheckStart';
import { ThresholdsForm } from '@/components/converter/ThresholdsForm';
import { SwrProvider } from '@/components/SwrProvider';
import { requireActor } from '@/lib/auth/guard.server';
import { can } from '@/lib/auth/policy';
import { recorderChecks } from '@/lib/converterChecks/service.server';
import { LEVEL_REFERENCE_NOTE } from '@/lib/converterChecks/views';
import { loadPage } from '@/lib/http/pages.server';
import { idParam } from '@/lib/http/route.server';
import { recorderChecksKey } from '@/lib/http/swrKeys';

export const metadata: Metadata = { title: 'Converter checks' };

export default async function RecorderConverterPage({ params }: { params: Promise<{ id: string }> }) {
  const { view, manages } = await loadPage(async () => {
    const actor = await requireActor('converter:check');
    return { view: await recorderChecks(actor, await idParam(params, 'recorder')), manages: can(actor.role, 'recorder:manage') };
  });
  const { recorder } = view;
  return (
    <SwrProvider fallback={{ [recorderChecksKey(recorder.id)]: view }}>
      <p className="mb-2 text-sm">
        <Link href="/converter-checks" className="text-accent hover:underline">← All converter checks</Link>
      </p>
      <h1 className="text-2xl font-semibold">Converter checks · {recorder.label}</h1>
      <p className="mb-4 mt-1 max-w-prose text-muted">
        {recorder.makeModel ?? 'Make not recorded'}. A check plays a known signal through the recorder’s converter and measures what comes back (AES17, IEEE 1241), apart from any
        microphone, room or performance. {LEVEL_REFERENCE_NOTE}
        {manages && (
          <>
            {' '}
            <Link href={`/recorders/${recorder.id}`} className="text-accent underline">Edit the recorder</Link>
          </>
        )}
      </p>
      <div className="grid gap-6 xl:grid-cols-[1fr_28rem]">
        <CheckHistory recorderId={recorder.id} />
        <CheckStart recorderId={recorder.id} usualFormat={view.usualFormat} active={recorder.active} />
      </div>
      {manages && (
        <section className="tp-card mt-6 p-4" aria-labelledby="thresholds-heading">
          <h2 id="thresholds-heading" className="mb-3 text-lg font-semibold">
            Thresholds for this model
          </h2>
          <ThresholdsForm recorderId={recorder.id} makeModel={recorder.makeModel} thresholds={view.thresholds} isDefault={view.thresholdsAreDefault} />
        </section>
      )}
    </SwrProvider>
  );
}
