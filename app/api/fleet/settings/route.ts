import { requireActor } from '@/lib/auth/guard.server';
import { setCheckInterval } from '@/lib/converterChecks/service.server';
import { converterIntervalSchema } from '@/lib/converterChecks/schema';
import { json, parseJson, route } from '@/lib/http/route.server';

/** The studio's converter-check interval, days. */
export const PATCH = route(async (request) => {
  const actor = await requireActor('recorder:manage');
  const { converterCheckIntervalDays } = await parseJson(request, converterIntervalSchema);
  return json(await setCheckInterval(actor, converterCheckIntervalDays));
});
