import type { Metadata } from 'next';
import { SessionCreateForm } from '@/components/SessionCreateForm';
import { SessionList } from '@/components/SessionList';
import { SwrProvider } from '@/components/SwrProvider';
import { requireActor } from '@/lib/auth/guard.server';
import { can } from '@/lib/auth/policy';
import { peopleOptions, specOptions } from '@/lib/studio/formOptions.server';
import { loadPage } from '@/lib/http/pages.server';
import { listSessions } from '@/lib/sessions/service.server';
import { sessionsKey } from '@/lib/http/swrKeys';

export const metadata: Metadata = { title: 'Sessions' };

export default async function SessionsPage() {
  const { actor, sessions, specs, producers } = await loadPage(async () => {
    const actor = await requireActor('session:view');
    return { actor, sessions: await listSessions(actor), specs: await specOptions(actor), producers: await peopleOptions(actor, 'producer') };
  });
  const mayCreate = can(actor.role, 'session:create');
  return (
    <SwrProvider fallback={{ [sessionsKey()]: { sessions } }}>
      <h1 className="mb-4 text-2xl font-semibold">Recording sessions</h1>
      <div className="grid gap-6 lg:grid-cols-[1fr_22rem]">
        <SessionList />
        {mayCreate && (
          <section aria-labelledby="new-session" className="tp-card p-4">
            <h2 id="new-session" className="mb-3 text-lg font-semibold">
              Start a session
            </h2>
            <SessionCreateForm specs={specs} producers={producers} />
          </section>
        )}
      </div>
    </SwrProvider>
  );
}
