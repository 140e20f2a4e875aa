import { requireActor } from '@/lib/auth/guard.server';
import { createSpec, listSpecs } from '@/lib/specs/service.server';
import { json, parseJson, route } from '@/lib/http/route.server';
import { createSpecSchema, specErrorMap } from '@/lib/specs/schema';

export const GET = route(async () => {
  const actor = await requireActor('spec:manage');
  return json({ specs: await listSpecs(actor) });
});

export const POST = route(async (request) => {
  const actor = await requireActor('spec:manage');
  const input = await parseJson(request, createSpecSchema, { error: specErrorMap });
  return json(await createSpec(actor, input), 201);
});
