import { requireActor } from '@/lib/auth/guard.server';
import { idParam, json, route } from '@/lib/http/route.server';
import { retryDelivery } from '@/lib/mail/retry.server';

type Context = { params: Promise<{ id: string }> };

/** Sends a failed e-mail again → 202 with the delivery's new state. */
export const POST = route<Context>(async (_request, { params }) => {
  const actor = await requireActor();
  const delivery = await retryDelivery(actor, await idParam(params, 'delivery'));
  // One object is answered bare; `delivery` is kept for the clients that read it there.
  return json({ ...delivery, delivery }, 202);
});
