import 'server-only';
import { audit } from '@/lib/audit/record.server';
import { db } from '@/lib/db/connection.server';
import { AppError } from '@/lib/errors';
import type { ChangePasswordInput } from '@/lib/team/schema';
import { Invitation, User } from '@/models';
import { hashPassword, verifyPassword } from './passwords.server';
import { accountOf, assertMayTrySignIn, recordSignIn } from './signInGuard.server';
import type { Actor } from './views';

const NOT_CURRENT = 'That is not your current password.';

/**
 * Changes the signed-in person's own password. The current password is checked like a sign-in
 * (same limits, a wrong one counts as a failed sign-in), so a session left open on a shared
 * machine cannot be used to guess it. Every session of the person ends, this one included, and an
 * open reset link stops working.
 */
export async function changeOwnPassword(actor: Actor, address: string, input: ChangePasswordInput): Promise<{ signedOut: true }> {
  const account = accountOf(actor.email);
  await assertMayTrySignIn(account, address);
  db();
  const user = await User.findByPk(actor.id);
  if (!user) throw new AppError('unauthorized:session');
  const matches = await verifyPassword(input.current, user.passwordHash);
  await recordSignIn(account, address, matches);
  if (!matches) throw new AppError('invalid:current_password', NOT_CURRENT, { fields: { current: [NOT_CURRENT] } });
  const passwordHash = await hashPassword(input.password);
  await db().transaction(async (transaction) => {
    await user.update({ passwordHash, sessionVersion: user.sessionVersion + 1 }, { transaction });
    // A reset link sent for a forgotten password is not needed any more.
    await Invitation.update({ revokedAt: new Date() }, { where: { userId: user.id, usedAt: null, revokedAt: null }, transaction });
    await audit(actor, 'account.password_change', { type: 'user', id: user.id }, null, transaction);
  });
  return { signedOut: true };
}
