import { requireActor } from '@/lib/auth/guard.server';
import { idParam, json, route } from '@/lib/http/route.server';
import { peaksQuerySchema } from '@/lib/review/schema';
import { takePeaks } from '@/lib/review/service.server';

type Context = { params: Promise<{ id: string }> };

/** `?buckets=N`: the take's waveform envelope at the stored zoom level nearest N buckets. */
export const GET = route<Context>(async (request, { params }) => {
  const actor = await requireActor('session:view');
  const { buckets } = peaksQuerySchema.parse(Object.fromEntries(new URL(request.url).searchParams));
  return json(await takePeaks(actor, await idParam(params, 'take'), buckets));
});
