import { requireActor } from '@/lib/auth/guard.server';
import { idParam, json, parseJson, route } from '@/lib/http/route.server';
import { commentSchema } from '@/lib/review/schema';
import { addComment, listComments } from '@/lib/review/service.server';

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
