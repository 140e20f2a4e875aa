import { json, parseJson, route } from '@/lib/http';
import { acceptInvitationSchema } from '@/lib/schemas/team';
import { acceptInvitation } from '@/lib/team';

/** `{ token, password, confirm? }` from the invitation page; needs no sign-in, only the token. */
export const POST = route(async (request) => {
  const { token, password } = await parseJson(request, acceptInvitationSchema);
  return json(await acceptInvitation(token, password));
});
