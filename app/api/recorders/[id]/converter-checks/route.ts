import { requireActor } from '@/lib/auth/guard.server';
import { receiveConverterCheck, recorderChecks } from '@/lib/converterChecks/service.server';
import { idParam, json, route } from '@/lib/http/route.server';

type Context = { params: Promise<{ id: string }> };

export const GET = route<Context>(async (_request, { params }) => {
  const actor = await requireActor('converter:check');
  return json(await recorderChecks(actor, await idParam(params, 'recorder')));
});

/** multipart/form-data: one `file` part, the recording of the check signal (WAV). */
export const POST = route<Context>(async (request, { params }) => {
  const actor = await requireActor('converter:check');
  return json(await receiveConverterCheck(actor, await idParam(params, 'recorder'), request), 201);
}, { body: 'multipart' });
