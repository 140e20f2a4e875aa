import { requireActor } from '@/lib/auth/guard.server';
import { idParam, json, parseJson, route } from '@/lib/http/route.server';
import { getRecorder, updateRecorder } from '@/lib/recorders/service.server';
import { updateRecorderSchema } from '@/lib/recorders/schema';

type Context = { params: Promise<{ id: string }> };

export const GET = route<Context>(async (_request, { params }) => {
  const actor = await requireActor('recorder:manage');
  return json(await getRecorder(actor, await idParam(params, 'recorder')));
});

export const PATCH = route<Context>(async (request, { params }) => {
  const actor = await requireActor('recorder:manage');
  const id = await idParam(params, 'recorder');
  const patch = await parseJson(request, updateRecorderSchema);
  return json(await updateRecorder(actor, id, patch));
});
