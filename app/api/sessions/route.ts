import { requireActor } from '@/lib/auth/guard.server';
import { json, parseJson, route } from '@/lib/http/route.server';
import { createSessionSchema, sessionQuerySchema } from '@/lib/sessions/schema';
import { createSession, listSessions } from '@/lib/sessions/service.server';

export const GET = route(async (request) => {
  const actor = await requireActor('session:view');
  const query = sessionQuerySchema.parse(Object.fromEntries(new URL(request.url).searchParams));
  return json({ sessions: await listSessions(actor, query) });
});

export const POST = route(async (request) => {
  const actor = await requireActor('session:create');
  const input = await parseJson(request, createSessionSchema);
  const session = await createSession(actor, input);
  return json(session, 201);
});
