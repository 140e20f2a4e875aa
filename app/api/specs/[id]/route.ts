import { requireActor } from '@/lib/auth/guard.server';
import { getSpec, updateSpec } from '@/lib/specs/service.server';
import { idParam, json, parseJson, route } from '@/lib/http/route.server';
import { specErrorMap, updateSpecSchema } from '@/lib/specs/schema';

type Context = { params: Promise<{ id: string }> };

export const GET = route<Context>(async (_request, { params }) => {
  const actor = await requireActor('spec:manage');
  return json(await getSpec(actor, await idParam(params, 'spec')));
});

export const PATCH = route<Context>(async (request, { params }) => {
  const actor = await requireActor('spec:manage');
  const id = await idParam(params, 'spec');
  const patch = await parseJson(request, updateSpecSchema, { error: specErrorMap });
  return json(await updateSpec(actor, id, patch));
});
