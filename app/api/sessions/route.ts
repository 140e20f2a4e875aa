import { requireActor } from '@/lib/auth/guard.server';
import { json, parseJson, parseQuery, route } from '@/lib/http/route.server';
import { createSessionSchema, sessionQuerySchema } from '@/lib/sessions/schema';
import { createSession, listSessions } from '@/lib/sessions/service.server';

export const GET = route(async (request) => {
  const actor = await requireActor('session:view');
  const query = parseQuery(request, sessionQuerySchema);
  return json({ sessions: await listSessions(actor, query) });
});

export const POST = route(async (request) => {
  const actor = await requireActor('session:create');
  const input = await parseJson(request, createSessionSchema);
  return json(await createSession(actor, input), 201);
});
