import { requireActor } from '@/lib/auth/guard.server';
import { AppError } from '@/lib/errors';
import { fleetOverview } from '@/lib/fleet/service.server';
import { parsePeriod } from '@/lib/fleet/views';
import { json, route } from '@/lib/http/route.server';

export const GET = route(async (request) => {
  const actor = await requireActor('fleet:view');
  const period = parsePeriod(new URL(request.url).searchParams.get('days'));
  if (period === null) throw new AppError('invalid:period', 'Some fields need attention.', { fields: { days: ['Use 7, 30, 90 or all'] } });
  return json(await fleetOverview(actor, period));
});
