import { requireActor } from '@/lib/auth/guard.server';
import { fleetQuerySchema } from '@/lib/fleet/schema';
import { recorderFleetDetail } from '@/lib/fleet/service.server';
import { idParam, json, parseQuery, route } from '@/lib/http/route.server';

type Context = { params: Promise<{ id: string }> };

/** One recorder's weekly trends over `?days=` (90 when absent), its open alerts and its latest takes. */
export const GET = route<Context>(async (request, { params }) => {
  const actor = await requireActor('fleet:view');
  const id = await idParam(params, 'recorder');
  const { days } = parseQuery(request, fleetQuerySchema(90));
  return json(await recorderFleetDetail(actor, id, days));
});
