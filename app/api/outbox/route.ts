import { requireActor } from '@/lib/auth/guard';
import { json, route } from '@/lib/http';
import { listOutbox } from '@/lib/mail/outbox';

export const GET = route(async () => {
  const actor = await requireActor('mail:view');
  return json({ messages: await listOutbox(actor) });
});
