import { requireActor } from '@/lib/auth/guard';
import { idParam, json, route } from '@/lib/http';
import { resendInvitation } from '@/lib/team';

type Context = { params: Promise<{ id: string }> };

/** Sends an invited person a new link; the previous one stops working. */
export const POST = route<Context>(async (_request, { params }) => {
  const actor = await requireActor('user:manage');
  return json(await resendInvitation(actor, await idParam(params, 'user')), 202);
});
