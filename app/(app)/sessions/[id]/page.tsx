import type { Metadata } from 'next';
import Link from 'next/link';
import { SessionReportPanel } from '@/components/SessionReportPanel';
import { SessionSettings } from '@/components/SessionSettings';
import { SwrProvider } from '@/components/SwrProvider';
import { TakeTable } from '@/components/TakeTable';
import { TakeUploader } from '@/components/TakeUploader';
import { requireActor } from '@/lib/auth/guard.server';
import { env } from '@/lib/env.server';
import { can } from '@/lib/auth/policy';
import { recorderOptions, specOptions } from '@/lib/studio/formOptions.server';
import { loadPage } from '@/lib/http/pages.server';
import { idParam } from '@/lib/http/route.server';
import { getSession } from '@/lib/sessions/service.server';
import { sessionTakesKey } from '@/lib/http/swrKeys';
import { listSessionTakes } from '@/lib/takes/service.server';
import { StatusMark } from '@/components/StatusMarks';
import { SESSION_STATUS } from '@/lib/status';

export const metadata: Metadata = { title: 'Session' };

export default async function SessionPage({ params }: { params: Promise<{ id: string }> }) {
  const { actor, session, takes, recorders, specs } = await loadPage(async () => {
    const actor = await requireActor('session:view');
    const session = await getSession(actor, await idParam(params, 'session'));
    return { actor, session, takes: await listSessionTakes(actor, session.id), recorders: await recorderOptions(actor), specs: await specOptions(actor, session.deliverySpec?.id ?? null) };
  });
  const takesKey = sessionTakesKey(session.id);
  const mayUpload = can(actor.role, 'take:upload') && session.status === 'open';
  return (
    <SwrProvider fallback={{ [takesKey]: { takes } }}>
      <article className="space-y-6">
        <div>
          <p className="mb-2 text-sm">
            <Link href="/sessions" className="text-accent hover:underline">
              ← All sessions
            </Link>
          </p>
          <h1 className="text-2xl font-semibold">{session.title}</h1>
          <dl className="mt-2 flex flex-wrap gap-x-6 gap-y-1 text-sm text-muted">
            <div><dt className="inline">Show / client: </dt><dd className="inline text-ink">{session.client ?? '—'}</dd></div>
            <div><dt className="inline">Recorded on: </dt><dd className="inline font-mono text-ink">{session.recordedOn ?? '—'}</dd></div>
            <div><dt className="inline">Room: </dt><dd className="inline text-ink">{session.room ?? '—'}</dd></div>
            <div><dt className="inline">Engineer: </dt><dd className="inline text-ink">{session.engineer?.name ?? '—'}</dd></div>
            <div><dt className="inline">Producer: </dt><dd className="inline text-ink">{session.producer?.name ?? '—'}</dd></div>
            <div><dt className="inline">Status: </dt><dd className="inline text-ink"><StatusMark status={SESSION_STATUS[session.status]} className="font-normal" /></dd></div>
          </dl>
          {session.notes && <p className="mt-3 max-w-prose whitespace-pre-line">{session.notes}</p>}
        </div>
        {can(actor.role, 'session:edit') && (
          <SessionSettings sessionId={session.id} specId={session.deliverySpec?.id ?? null} status={session.status} specs={specs} takesKey={takesKey} />
        )}
        <p className="max-w-prose text-xs text-muted">
          Verdicts follow the session’s delivery spec ({session.deliverySpec?.name ?? 'Takeproof defaults'}). The studio’s and the broadcaster’s own delivery specs and local rules take precedence over Takeproof’s defaults.
        </p>
        {mayUpload && <TakeUploader sessionId={session.id} recorders={recorders} takesKey={takesKey} maxBytes={env().UPLOAD_MAX_BYTES} />}
        <TakeTable takesKey={takesKey} viewer={{ id: actor.id, role: actor.role }} />
        <SessionReportPanel sessionId={session.id} maySend={can(actor.role, 'report:send')} />
      </article>
    </SwrProvider>
  );
}
