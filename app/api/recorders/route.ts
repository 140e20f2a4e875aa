import { requireActor } from '@/lib/auth/guard.server';
import { json, parseJson, parseQuery, route } from '@/lib/http/route.server';
import { createRecorder, listRecorders } from '@/lib/recorders/service.server';
import { createRecorderSchema, recorderQuerySchema } from '@/lib/recorders/schema';

export const GET = route(async (request) => {
  const actor = await requireActor('recorder:manage');
  const query = parseQuery(request, recorderQuerySchema);
  return json({ recorders: await listRecorders(actor, query) });
});

export const POST = route(async (request) => {
  const actor = await requireActor('recorder:manage');
  const input = await parseJson(request, createRecorderSchema);
  return json(await createRecorder(actor, input), 201);
});
