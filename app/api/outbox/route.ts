import { requireActor } from '@/lib/auth/guard.server';
import { json, route } from '@/lib/http/route.server';
import { outboxOverview } from '@/lib/mail/outbox.server';

/** The studio's outgoing e-mail with its status (queued, sending, sent, failed), and what the local mail catcher received. */
export const GET = route(async () => json(await outboxOverview(await requireActor('mail:view'))));
