import { requireActor } from '@/lib/auth/guard.server';
import { idParam, json, route } from '@/lib/http/route.server';
import { resendInvitation } from '@/lib/team/service.server';

type Context = { params: Promise<{ id: string }> };

/** Sends an invited person a new link; the previous one stops working. */
export const POST = route<Context>(async (_request, { params }) => {
  const actor = await requireActor('user:manage');
  return json(await resendInvitation(actor, await idParam(params, 'user')), 202);
});
