import { requireActor } from '@/lib/auth/guard.server';
import { idParam, json, parseJson, route } from '@/lib/http/route.server';
import { duplicateSpecSchema, specErrorMap } from '@/lib/specs/schema';
import { duplicateSpec } from '@/lib/specs/service.server';

type Context = { params: Promise<{ id: string }> };

/** `{ name? }`, or no body at all: without a name the copy is called "Copy of …". */
export const POST = route<Context>(async (request, { params }) => {
  const actor = await requireActor('spec:manage');
  const id = await idParam(params, 'spec');
  const input = await parseJson(request, duplicateSpecSchema, { error: specErrorMap, optionalBody: true });
  return json(await duplicateSpec(actor, id, input), 201);
});
