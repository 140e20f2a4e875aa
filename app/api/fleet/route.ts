import { requireActor } from '@/lib/auth/guard.server';
import { fleetQuerySchema } from '@/lib/fleet/schema';
import { fleetOverview } from '@/lib/fleet/service.server';
import { json, parseQuery, route } from '@/lib/http/route.server';

/** `?days=7|30|90|all` (30 when absent): one row per recorder with its statistics and alerts. */
export const GET = route(async (request) => {
  const actor = await requireActor('fleet:view');
  const { days } = parseQuery(request, fleetQuerySchema(30));
  return json(await fleetOverview(actor, days));
});
