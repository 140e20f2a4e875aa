import { requireActor } from '@/lib/auth/guard';
import { idParam, json, parseJson, route } from '@/lib/http';
import { decisionSchema } from '@/lib/schemas/take';
import { decideTake } from '@/lib/takeReview';

type Context = { params: Promise<{ id: string }> };

/** `{ decision: 'approved' | 'rejected' | 'pending', note? }` → the updated take. */
export const POST = route<Context>(async (request, { params }) => {
  const actor = await requireActor('take:decide');
  const id = await idParam(params, 'take');
  return json(await decideTake(actor, id, await parseJson(request, decisionSchema)));
});
