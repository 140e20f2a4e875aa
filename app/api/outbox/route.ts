import { requireActor } from '@/lib/auth/guard.server';
import { json, route } from '@/lib/http/route.server';
import { listOutbox } from '@/lib/mail/outbox.server';

export const GET = route(async () => {
  const actor = await requireActor('mail:view');
  return json({ messages: await listOutbox(actor) });
});
