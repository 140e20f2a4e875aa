import { requireActor } from '@/lib/auth/guard';
import { json, parseJson, route } from '@/lib/http';
import { inviteSchema } from '@/lib/schemas/team';
import { inviteMember, listTeam } from '@/lib/team';

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
