import { requireActor } from '@/lib/auth/guard.server';
import { idParam, json, parseJson, route } from '@/lib/http/route.server';
import { updateUserSchema } from '@/lib/team/schema';
import { updateMember } from '@/lib/team/service.server';

type Context = { params: Promise<{ id: string }> };

/** `{ role?, active? }`: change a role, deactivate or reactivate; 409 when it would leave no active manager. */
export const PATCH = route<Context>(async (request, { params }) => {
  const actor = await requireActor('user:manage');
  const id = await idParam(params, 'user');
  const patch = await parseJson(request, updateUserSchema);
  return json(await updateMember(actor, id, patch));
});
