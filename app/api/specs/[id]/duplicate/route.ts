import { requireActor } from '@/lib/auth/guard.server';
import { duplicateSpec } from '@/lib/specs/service.server';
import { AppError } from '@/lib/errors';
import { idParam, json, route } from '@/lib/http/route.server';
import { duplicateSpecSchema, specErrorMap } from '@/lib/specs/schema';

type Context = { params: Promise<{ id: string }> };

export const POST = route<Context>(async (request, { params }) => {
  const actor = await requireActor('spec:manage');
  const id = await idParam(params, 'spec');
  // The body is optional: without one the copy is named "Copy of …".
  const text = await request.text();
  let body: unknown = {};
  if (text.trim()) {
    try {
      body = JSON.parse(text);
    } catch {
      throw new AppError('invalid:json', 'The request body is not valid JSON.');
    }
  }
  return json(await duplicateSpec(actor, id, duplicateSpecSchema.parse(body, { error: specErrorMap })), 201);
});
