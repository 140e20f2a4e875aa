import { requireActor } from '@/lib/auth/guard';
import { idParam, json, parseJson, route } from '@/lib/http';
import { getRecorder, updateRecorder } from '@/lib/recorders';
import { updateRecorderSchema } from '@/lib/schemas/recorder';

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
