import { requireActor } from '@/lib/auth/guard.server';
import { setModelThresholds } from '@/lib/converterChecks/service.server';
import { modelThresholdsSchema } from '@/lib/converterChecks/schema';
import { idParam, json, parseJson, route } from '@/lib/http/route.server';

type Context = { params: Promise<{ id: string }> };

/** The converter-check thresholds of this recorder's model (every recorder of the studio with its make and model). */
export const PUT = route<Context>(async (request, { params }) => {
  const actor = await requireActor('recorder:manage');
  const id = await idParam(params, 'recorder');
  const { thresholds } = await parseJson(request, modelThresholdsSchema);
  return json(await setModelThresholds(actor, id, thresholds));
});
