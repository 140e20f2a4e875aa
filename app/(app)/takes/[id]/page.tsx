import type { Metadata } from 'next';
import { SwrProvider } from '@/components/SwrProvider';
import { TakeReview } from '@/components/review/TakeReview';
import { requireActor } from '@/lib/auth/guard.server';
import { env } from '@/lib/env.server';
import { can } from '@/lib/auth/policy';
import { loadPage } from '@/lib/http/pages.server';
import { idParam } from '@/lib/http/route.server';
import { getSession } from '@/lib/sessions/service.server';
import { specForSession } from '@/lib/specs/sessionSpec.server';
import { takeCommentsKey, takeKey } from '@/lib/http/swrKeys';
import { listComments, sessionNeighbours } from '@/lib/review/service.server';
import { getTake } from '@/lib/takes/service.server';

export const metadata: Metadata = { title: 'Take review' };

export default async function TakePage({ params }: { params: Promise<{ id: string }> }) {
  const data = await loadPage(async () => {
    const actor = await requireActor('session:view');
    const id = await idParam(params, 'take');
    const take = await getTake(actor, id);
    const [session, spec, comments, neighbours] = await Promise.all([
      getSession(actor, take.sessionId),
      specForSession(take.sessionId),
      listComments(actor, id),
      sessionNeighbours(actor, take),
    ]);
    return { actor, take, session, spec, comments, neighbours };
  });
  const { actor, take, session, spec, comments, neighbours } = data;
  return (
    <SwrProvider fallback={{ [takeKey(take.id)]: take, [takeCommentsKey(take.id)]: { comments } }}>
      <TakeReview
        takeId={take.id}
        session={{ id: session.id, title: session.title }}
        spec={spec}
        neighbours={neighbours}
        canDecide={can(actor.role, 'take:decide')}
        canComment={can(actor.role, 'take:comment')}
        viewer={{ id: actor.id, role: actor.role }}
        maxUploadBytes={env().UPLOAD_MAX_BYTES}
      />
    </SwrProvider>
  );
}
