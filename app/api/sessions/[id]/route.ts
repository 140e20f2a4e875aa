import { requireActor } from '@/lib/auth/guard.server';
import { idParam, json, parseJson, route } from '@/lib/http/route.server';
import { updateSessionSchema } from '@/lib/sessions/schema';
import { getSession, updateSession } from '@/lib/sessions/service.server';

type Context = { params: Promise<{ id: string }> };

export const GET = route<Context>(async (_request, { params }) => {
  const actor = await requireActor('session:view');
  return json(await getSession(actor, await idParam(params, 'session')));
});

export const PATCH = route<Context>(async (request, { params }) => {
  const actor = await requireActor('session:edit');
  const id = await idParam(params, 'session');
  const patch = await parseJson(request, updateSessionSchema);
  return json(await updateSession(actor, id, patch));
});
