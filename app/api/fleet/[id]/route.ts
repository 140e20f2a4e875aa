import { requireActor } from '@/lib/auth/guard.server';
import { AppError } from '@/lib/errors';
import { fleetAlerts, recorderRecentTakes, recorderTrends } from '@/lib/fleet/service.server';
import { parsePeriod } from '@/lib/fleet/views';
import { idParam, json, route } from '@/lib/http/route.server';
import { getRecorder } from '@/lib/recorders/service.server';

type Context = { params: Promise<{ id: string }> };

/** One recorder's weekly trends over `days`, its open alerts and its latest takes. */
export const GET = route<Context>(async (request, { params }) => {
  const actor = await requireActor('fleet:view');
  const id = await idParam(params, 'recorder');
  const period = parsePeriod(new URL(request.url).searchParams.get('days') ?? '90');
  if (period === null) throw new AppError('invalid:period', 'Some fields need attention.', { fields: { days: ['Use 7, 30, 90 or all'] } });
  const recorder = await getRecorder(actor, id);
  const [weeks, recentTakes, alerts] = await Promise.all([recorderTrends(actor, id, period), recorderRecentTakes(actor, id), fleetAlerts(actor, { recorderId: id })]);
  return json({ recorder, period, weeks, recentTakes, alerts });
});
