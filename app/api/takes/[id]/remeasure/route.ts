import { requireActor } from '@/lib/auth/guard.server';
import { idParam, json, route } from '@/lib/http/route.server';
import { remeasureTake } from '@/lib/takes/service.server';

type Context = { params: Promise<{ id: string }> };

export const POST = route<Context>(async (_request, { params }) => {
  const actor = await requireActor('take:remeasure');
  return json(await remeasureTake(actor, await idParam(params, 'take')), 202);
});
