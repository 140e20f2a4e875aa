import { requireActor } from '@/lib/auth/guard.server';
import { idParam, json, route } from '@/lib/http/route.server';
import { listSessionTakes } from '@/lib/takes/service.server';
import { receiveTakes } from '@/lib/takes/uploads.server';

type Context = { params: Promise<{ id: string }> };

export const GET = route<Context>(async (_request, { params }) => {
  const actor = await requireActor('session:view');
  return json({ takes: await listSessionTakes(actor, await idParam(params, 'session')) });
});

/** multipart/form-data: optional `recorderId`, then one or more `file` parts (WAV). */
export const POST = route<Context>(async (request, { params }) => {
  const actor = await requireActor('take:upload');
  const takes = await receiveTakes(actor, await idParam(params, 'session'), request);
  return json({ takes }, 201);
}, { body: 'multipart' });
