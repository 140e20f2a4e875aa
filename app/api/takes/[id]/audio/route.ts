import { requireActor } from '@/lib/auth/guard.server';
import { idParam, parseQuery, route, send } from '@/lib/http/route.server';
import { takeAudioStream } from '@/lib/review/audio.server';
import { audioQuerySchema } from '@/lib/review/schema';

type Context = { params: Promise<{ id: string }> };

/** The stored WAV of a take, whole or one byte range; `?download=1` offers it for saving instead of playing it in place. */
export const GET = route<Context>(async (request, { params }) => {
  const actor = await requireActor('session:view');
  const id = await idParam(params, 'take');
  const { download } = parseQuery(request, audioQuerySchema);
  const audio = await takeAudioStream(actor, id, { range: request.headers.get('range'), ifRange: request.headers.get('if-range'), download });
  return send(audio);
});
