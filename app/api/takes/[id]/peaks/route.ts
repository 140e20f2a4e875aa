import { requireActor } from '@/lib/auth/guard.server';
import { idParam, json, parseQuery, route } from '@/lib/http/route.server';
import { peaksQuerySchema } from '@/lib/review/schema';
import { takePeaks } from '@/lib/review/service.server';

type Context = { params: Promise<{ id: string }> };

/** `?buckets=N`: the take's waveform envelope at the stored zoom level nearest N buckets. */
export const GET = route<Context>(async (request, { params }) => {
  const actor = await requireActor('session:view');
  const id = await idParam(params, 'take');
  const { buckets } = parseQuery(request, peaksQuerySchema);
  return json(await takePeaks(actor, id, buckets));
});
