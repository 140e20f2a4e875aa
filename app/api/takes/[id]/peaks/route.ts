import { requireActor } from '@/lib/auth/guard';
import { idParam, json, route } from '@/lib/http';
import { peaksQuerySchema } from '@/lib/schemas/take';
import { takePeaks } from '@/lib/takeReview';

type Context = { params: Promise<{ id: string }> };

/** `?buckets=N`: the take's waveform envelope at the stored zoom level nearest N buckets. */
export const GET = route<Context>(async (request, { params }) => {
  const actor = await requireActor('session:view');
  const { buckets } = peaksQuerySchema.parse(Object.fromEntries(new URL(request.url).searchParams));
  return json(await takePeaks(actor, await idParam(params, 'take'), buckets));
});
