import { requireActor } from '@/lib/auth/guard.server';
import { idParam, json, route } from '@/lib/http/route.server';
import { replaceTakeFile } from '@/lib/takes/uploads.server';

type Context = { params: Promise<{ id: string }> };

/** multipart/form-data: one `file` part (WAV) that replaces the take's audio; comments and history stay. */
export const PUT = route<Context>(async (request, { params }) => {
  const actor = await requireActor('take:upload');
  return json(await replaceTakeFile(actor, await idParam(params, 'take'), request));
}, { body: 'multipart' });
