import { requireActor } from '@/lib/auth/guard';
import { idParam, json, route } from '@/lib/http';
import { remeasureTake } from '@/lib/takes';

type Context = { params: Promise<{ id: string }> };

export const POST = route<Context>(async (_request, { params }) => {
  const actor = await requireActor('take:remeasure');
  return json(await remeasureTake(actor, await idParam(params, 'take')), 202);
});
