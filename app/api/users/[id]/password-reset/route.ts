import { requireActor } from '@/lib/auth/guard.server';
import { idParam, json, route } from '@/lib/http/route.server';
import { sendPasswordReset } from '@/lib/team/service.server';

type Context = { params: Promise<{ id: string }> };

/** E-mails an active person a link to choose a new password; an earlier link stops working. */
export const POST = route<Context>(async (_request, { params }) => {
  const actor = await requireActor('user:manage');
  return json(await sendPasswordReset(actor, await idParam(params, 'user')), 202);
});
