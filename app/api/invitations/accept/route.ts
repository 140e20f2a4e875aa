import { json, parseJson, route } from '@/lib/http/route.server';
import { acceptInvitationSchema } from '@/lib/team/schema';
import { acceptInvitation } from '@/lib/team/service.server';

/** `{ token, password, confirm? }` from the invitation page; needs no sign-in, only the token. */
export const POST = route(async (request) => {
  const { token, password } = await parseJson(request, acceptInvitationSchema);
  return json(await acceptInvitation(token, password));
});
