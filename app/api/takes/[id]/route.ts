import { requireActor } from '@/lib/auth/guard.server';
import { idParam, json, route } from '@/lib/http/route.server';
import { getTake, removeTake } from '@/lib/takes/service.server';

type Context = { params: Promise<{ id: string }> };

export const GET = route<Context>(async (_request, { params }) => {
  const actor = await requireActor('session:view');
  return json(await getTake(actor, await idParam(params, 'take')));
});

export const DELETE = route<Context>(async (_request, { params }) => {
  const actor = await requireActor('take:remove');
  await removeTake(actor, await idParam(params, 'take'));
  return new Response(null, { status: 204 });
});
