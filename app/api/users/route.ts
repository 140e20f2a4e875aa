import { requireActor } from '@/lib/auth/guard.server';
import { json, parseJson, route } from '@/lib/http/route.server';
import { inviteSchema } from '@/lib/team/schema';
import { inviteMember, listTeam } from '@/lib/team/service.server';

export const GET = route(async () => {
  const actor = await requireActor('user:manage');
  return json({ users: await listTeam(actor) });
});

/** Invites a person: `{ email, name, role }` → 201 with the new (inactive) member and the invitation e-mail's delivery. */
export const POST = route(async (request) => {
  const actor = await requireActor('user:manage');
  const input = await parseJson(request, inviteSchema);
  return json(await inviteMember(actor, input), 201);
});
