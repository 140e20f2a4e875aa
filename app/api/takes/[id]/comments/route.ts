import { requireActor } from '@/lib/auth/guard';
import { idParam, json, parseJson, route } from '@/lib/http';
import { commentSchema } from '@/lib/schemas/take';
import { addComment, listComments } from '@/lib/takeReview';

type Context = { params: Promise<{ id: string }> };

export const GET = route<Context>(async (_request, { params }) => {
  const actor = await requireActor('session:view');
  return json({ comments: await listComments(actor, await idParam(params, 'take')) });
});

/** `{ atSec, body }` → 201 with the comment. */
export const POST = route<Context>(async (request, { params }) => {
  const actor = await requireActor('take:comment');
  const id = await idParam(params, 'take');
  return json(await addComment(actor, id, await parseJson(request, commentSchema)), 201);
});
