import { requireActor } from '@/lib/auth/guard.server';
import { idParam, json, parseJson, route } from '@/lib/http/route.server';
import { decisionSchema } from '@/lib/review/schema';
import { decideTake } from '@/lib/review/service.server';

type Context = { params: Promise<{ id: string }> };

/** `{ decision: 'approved' | 'rejected' | 'pending', note? }` → the updated take. */
export const POST = route<Context>(async (request, { params }) => {
  const actor = await requireActor('take:decide');
  const id = await idParam(params, 'take');
  return json(await decideTake(actor, id, await parseJson(request, decisionSchema)));
});
