import { z } from 'zod';
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
  const body = await parseJson(request, z.unknown());
  const spec = await createSpec(actor, createSpecSchema.parse(body, { error: specErrorMap }));
  return json(spec, 201);
});
