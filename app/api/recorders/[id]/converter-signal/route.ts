import { requireActor } from '@/lib/auth/guard.server';
import { checkSignalDownload } from '@/lib/converterChecks/service.server';
import { signalFormatQuerySchema } from '@/lib/converterChecks/schema';
import { idParam, parseQuery, route, send } from '@/lib/http/route.server';

type Context = { params: Promise<{ id: string }> };

/** `?rate=&bits=&channels=` (each optional: the recorder's usual format): the check signal as a WAV download. */
export const GET = route<Context>(async (request, { params }) => {
  const actor = await requireActor('converter:check');
  const id = await idParam(params, 'recorder');
  const query = parseQuery(request, signalFormatQuerySchema);
  return send(await checkSignalDownload(actor, id, query));
});
