import { requireActor } from '@/lib/auth/guard.server';
import { changeOwnPassword } from '@/lib/auth/password.server';
import { clientAddress } from '@/lib/auth/signInGuard.server';
import { json, parseJson, route } from '@/lib/http/route.server';
import { changePasswordSchema } from '@/lib/team/schema';

/** `{ current, password, confirm }`: the signed-in person's new password; every session of theirs ends. */
export const POST = route(async (request) => {
  const actor = await requireActor();
  const input = await parseJson(request, changePasswordSchema);
  return json(await changeOwnPassword(actor, clientAddress(request.headers), input));
});
