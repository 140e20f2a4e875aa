import { requireActor } from '@/lib/auth/guard';
import { json, route } from '@/lib/http';
import { getOutboxMessage } from '@/lib/mail/outbox';

type Context = { params: Promise<{ id: string }> };

export const GET = route<Context>(async (_request, { params }) => {
  const actor = await requireActor('mail:view');
  return json(await getOutboxMessage(actor, (await params).id));
});
