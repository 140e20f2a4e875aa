import { requireActor } from '@/lib/auth/guard.server';
import { json, route } from '@/lib/http/route.server';
import { getOutboxMessage } from '@/lib/mail/outbox.server';

type Context = { params: Promise<{ id: string }> };

export const GET = route<Context>(async (_request, { params }) => {
  const actor = await requireActor('mail:view');
  return json(await getOutboxMessage(actor, (await params).id));
});
