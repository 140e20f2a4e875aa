import { requireActor } from '@/lib/auth/guard';
import { AppError } from '@/lib/errors';
import { fleetOverview } from '@/lib/fleet';
import { parsePeriod } from '@/lib/fleetViews';
import { json, route } from '@/lib/http';

export const GET = route(async (request) => {
  const actor = await requireActor('fleet:view');
  const period = parsePeriod(new URL(request.url).searchParams.get('days'));
  if (period === null) throw new AppError('invalid:period', 'Some fields need attention.', { fields: { days: ['Use 7, 30, 90 or all'] } });
  return json(await fleetOverview(actor, period));
});
