import { requireActor } from '@/lib/auth/guard.server';
import { makeBaseline } from '@/lib/converterChecks/service.server';
import { idParam, json, route } from '@/lib/http/route.server';

type Context = { params: Promise<{ id: string }> };

/** Makes this check its recorder's baseline; the recorder's checks are judged again against it. */
export const POST = route<Context>(async (_request, { params }) => {
  const actor = await requireActor('recorder:manage');
  return json(await makeBaseline(actor, await idParam(params, 'converter_check')));
});
