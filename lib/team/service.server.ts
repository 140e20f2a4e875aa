import 'server-only';
import { createHash, randomBytes } from 'node:crypto';
import { Op, UniqueConstraintError, type Transaction } from 'sequelize';
import { Invitation, MailDelivery, Studio, User } from '@/models';
import type { LinkPurpose } from '@/models/Invitation';
import type { MailKind } from '@/models/MailDelivery';
import type { Role } from '@/models/User';
import { audit } from '@/lib/audit/record.server';
import { hashPassword } from '@/lib/auth/passwords.server';
import { db } from '@/lib/db/connection.server';
import { env } from '@/lib/env.server';
import { AppError } from '@/lib/errors';
import { attemptDelivery, createDelivery, toDeliveryView } from '@/lib/mail/deliveries.server';
import type { OutgoingMail } from '@/lib/mail/transport.server';
import { escapeHtml } from '@/lib/reports/html';
import type { InviteInput, UpdateUserInput } from './schema';
import type { Actor } from '@/lib/auth/views';
import type { DeliveryView } from '@/lib/mail/views';
import type { InvitationCheck, MemberStatus, TeamMember } from './views';
import { linkRefusal } from './views';
import { ROLE_LABEL, can, rolesWith } from '@/lib/auth/policy';

/** How long an invitation link works. */
export const INVITATION_HOURS = 72;

const hashToken = (token: string) => createHash('sha256').update(token).digest('hex');

function statusOf(user: User): MemberStatus {
  if (user.active) return 'active';
  return user.passwordHash ? 'deactivated' : 'invited';
}

/** The studio's people with their state and, for invited people, their newest invitation. */
export async function listTeam(actor: Actor): Promise<TeamMember[]> {
  db();
  const users = await User.findAll({ where: { studioId: actor.studioId }, order: [['name', 'ASC'], ['id', 'ASC']] });
  const invitedIds = users.filter((u) => statusOf(u) === 'invited').map((u) => u.id);
  const invitations = invitedIds.length
    ? await Invitation.findAll({ where: { userId: invitedIds, usedAt: null, revokedAt: null }, order: [['id', 'DESC']] })
    : [];
  const deliveries = invitedIds.length
    ? await MailDelivery.findAll({ where: { studioId: actor.studioId, kind: 'invitation', subjectType: 'user', subjectId: invitedIds }, order: [['id', 'DESC']] })
    : [];
  return users.map((u) => {
    const inv = invitations.find((i) => i.userId === u.id);
    const delivery = deliveries.find((d) => d.subjectId === u.id);
    return {
      id: u.id,
      name: u.name,
      email: u.email,
      role: u.role,
      status: statusOf(u),
      invitationExpiresAt: inv ? inv.expiresAt.toISOString() : null,
      invitationExpired: inv ? inv.expiresAt.getTime() <= Date.now() : false,
      lastInvitation: delivery ? toDeliveryView(delivery) : null,
    };
  });
}

async function memberView(actor: Actor, id: number): Promise<TeamMember> {
  const member = (await listTeam(actor)).find((m) => m.id === id);
  if (!member) throw new AppError('not_found:user');
  return member;
}

/** Loads a person of the actor's studio; 404 for one that is missing or another studio's. */
async function findMember(actor: Actor, id: number, transaction?: Transaction): Promise<User> {
  db();
  const user = await User.findOne({ where: { id, studioId: actor.studioId }, transaction, lock: transaction ? transaction.LOCK.UPDATE : undefined });
  if (!user) throw new AppError('not_found:user', 'This person does not exist, or belongs to another studio.');
  return user;
}

/** Replaces any open link of `user` with a new one; returns the token, which is never stored. */
async function issueInvitation(actor: Actor, user: User, transaction: Transaction, purpose: LinkPurpose = 'invite'): Promise<string> {
  await Invitation.update({ revokedAt: new Date() }, { where: { userId: user.id, usedAt: null, revokedAt: null }, transaction });
  const token = randomBytes(32).toString('base64url');
  await Invitation.create(
    {
      studioId: user.studioId,
      userId: user.id,
      invitedById: actor.id,
      tokenHash: hashToken(token),
      purpose,
      expiresAt: new Date(Date.now() + INVITATION_HOURS * 3600_000),
      usedAt: null,
      revokedAt: null,
    },
    { transaction },
  );
  return token;
}

/** What each kind of link e-mail says; the link itself opens the same page. */
const LINK_MAIL: Record<LinkPurpose, { kind: MailKind; title: string; subject: (studio: string) => string; intro: (actor: Actor, user: User, studio: string) => string; prompt: string; action: string; ignore: string }> = {
  invite: {
    kind: 'invitation',
    title: 'Invitation',
    subject: (studio) => `Your invitation to ${studio} on Takeproof`,
    intro: (actor, user, studio) => `${actor.name} has invited you to ${studio} on Takeproof as ${ROLE_LABEL[user.role].toLowerCase()}.`,
    prompt: 'Set your password here to activate your account:',
    action: 'Set your password',
    ignore: 'If you did not expect this invitation, ignore this e-mail; nothing happens without the link.',
  },
  reset: {
    kind: 'password_reset',
    title: 'Password reset',
    subject: (studio) => `Choose a new password for ${studio} on Takeproof`,
    intro: (actor, _user, studio) => `${actor.name} has sent you a link to choose a new password for your account at ${studio} on Takeproof.`,
    prompt: 'Choose your new password here:',
    action: 'Choose a new password',
    ignore: 'If you did not ask for this, tell your studio manager; your current password keeps working until the link is used.',
  },
};

async function linkMail(actor: Actor, user: User, token: string, purpose: LinkPurpose): Promise<OutgoingMail> {
  const words = LINK_MAIL[purpose];
  const studio = (await Studio.findByPk(user.studioId))?.name ?? 'your studio';
  const link = `${env().NEXTAUTH_URL.replace(/\/+$/, '')}/invite/${token}`;
  const intro = words.intro(actor, user, studio);
  const expiry = `The link works once and expires ${INVITATION_HOURS} hours after this e-mail was sent.`;
  const e = escapeHtml;
  return {
    to: [user.email],
    subject: words.subject(studio).replace(/[\r\n]+/g, ' '),
    text: [`Hello ${user.name},`, '', intro, '', words.prompt, link, '', expiry, words.ignore].join('\n'),
    html: `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>${e(words.title)}</title></head>
<body style="margin:0;padding:16px;font-family:Arial,Helvetica,sans-serif;font-size:15px;line-height:1.5;color:#1b2430;background:#ffffff;">
<p>Hello ${e(user.name)},</p>
<p>${e(intro)}</p>
<p><a href="${e(link)}" style="display:inline-block;padding:10px 16px;background:#1a5480;color:#ffffff;text-decoration:none;border-radius:6px;font-weight:bold;">${e(words.action)}</a></p>
<p style="font-size:13px;color:#505a68;">Or open this address: <br><span style="word-break:break-all;">${e(link)}</span></p>
<p style="font-size:13px;color:#505a68;">${e(expiry)} ${e(words.ignore)}</p>
</body></html>`,
  };
}

function alreadyInTeam(invited: boolean): AppError {
  return new AppError('conflict:user_email', invited ? 'This person is already invited. Use “Resend invitation” to send a new link.' : 'This address already belongs to someone in your team.', {
    fields: { email: [invited ? 'Already invited' : 'Already in your team'] },
  });
}

/** Another active account already uses this address (the database keeps one active account per address). */
const isActiveAddressTaken = (error: unknown) => error instanceof UniqueConstraintError && 'users_active_email' in (error.fields ?? {});

/** Creates an inactive account for `input.email` and e-mails them a single-use link to set a password. */
export async function inviteMember(actor: Actor, input: InviteInput): Promise<{ member: TeamMember; delivery: DeliveryView }> {
  db();
  // Only this studio's people are looked at: whether another studio knows the address is never told
  // (an address may be invited by several studios; it activates one account, see acceptInvitation).
  const existing = await User.findOne({ where: { email: input.email, studioId: actor.studioId } });
  if (existing) throw alreadyInTeam(statusOf(existing) === 'invited');
  let created: { user: User; token: string; delivery: MailDelivery };
  try {
    created = await db().transaction(async (transaction) => {
      const user = await User.create({ studioId: actor.studioId, email: input.email, name: input.name, role: input.role, passwordHash: null, active: false }, { transaction });
      const token = await issueInvitation(actor, user, transaction);
      const delivery = await createDelivery(
        actor,
        { kind: 'invitation', subject: { type: 'user', id: user.id }, recipients: [user.email], title: 'Invitation', payload: { userId: user.id } },
        transaction,
      );
      await audit(actor, 'user.invite', { type: 'user', id: user.id }, { email: user.email, role: user.role, deliveryId: delivery.id }, transaction);
      return { user, token, delivery };
    });
  } catch (error) {
    if (error instanceof UniqueConstraintError) throw alreadyInTeam(false);
    throw error;
  }
  const delivery = await attemptDelivery(created.delivery, await linkMail(actor, created.user, created.token, 'invite'));
  return { member: await memberView(actor, created.user.id), delivery };
}

/** Why a link of each purpose cannot be sent to a person who is not in the state it is for. */
const LINK_NEEDS: Record<LinkPurpose, { status: MemberStatus; code: `conflict:${string}`; message: string }> = {
  invite: { status: 'invited', code: 'conflict:not_invited', message: 'This person has already set a password; there is nothing to resend.' },
  reset: { status: 'active', code: 'conflict:not_active', message: 'Only an active person can be sent a password reset link. Reactivate the person first, or resend the invitation.' },
};

/**
 * Sends a fresh link (the older one stops working): an invited person's invitation again, or an
 * active person a link to choose a new password. Reuses `retry` when sending a failed e-mail again.
 */
async function sendLink(actor: Actor, userId: number, purpose: LinkPurpose, retry?: MailDelivery): Promise<{ member: TeamMember; delivery: DeliveryView }> {
  const { kind, title } = LINK_MAIL[purpose];
  const { user, token, delivery } = await db().transaction(async (transaction) => {
    const user = await findMember(actor, userId, transaction);
    if (statusOf(user) !== LINK_NEEDS[purpose].status) throw new AppError(LINK_NEEDS[purpose].code, LINK_NEEDS[purpose].message);
    const token = await issueInvitation(actor, user, transaction, purpose);
    const delivery = retry ?? (await createDelivery(actor, { kind, subject: { type: 'user', id: user.id }, recipients: [user.email], title, payload: { userId: user.id } }, transaction));
    await audit(actor, retry ? 'mail.retry' : purpose === 'reset' ? 'user.password_reset_send' : 'user.invite_resend', { type: 'user', id: user.id }, { deliveryId: delivery.id }, transaction);
    return { user, token, delivery };
  });
  const sent = await attemptDelivery(delivery, await linkMail(actor, user, token, purpose));
  return { member: await memberView(actor, user.id), delivery: sent };
}

/** Sends an invited person a fresh invitation (the old link stops working). */
export function resendInvitation(actor: Actor, userId: number, retry?: MailDelivery) {
  return sendLink(actor, userId, 'invite', retry);
}

/** Sends an active person a link to choose a new password; the current one keeps working until the link is used. */
export function sendPasswordReset(actor: Actor, userId: number, retry?: MailDelivery) {
  return sendLink(actor, userId, 'reset', retry);
}

/** Changes a person's role or active state; the studio always keeps at least one active manager. */
export async function updateMember(actor: Actor, id: number, patch: UpdateUserInput): Promise<TeamMember> {
  await db().transaction(async (transaction) => {
    // Lock the studio's active managers first, so two managers demoting each other cannot both succeed.
    const managers = await User.findAll({ where: { studioId: actor.studioId, role: rolesWith('user:manage'), active: true }, transaction, lock: transaction.LOCK.UPDATE });
    const user = await findMember(actor, id, transaction);
    const changes: Partial<{ role: Role; active: boolean }> = {};
    if (patch.role !== undefined && patch.role !== user.role) changes.role = patch.role;
    if (patch.active !== undefined && patch.active !== user.active) changes.active = patch.active;
    if (Object.keys(changes).length === 0) return;
    if (changes.active === true && !user.passwordHash) {
      throw new AppError('conflict:not_accepted', 'This person has not accepted the invitation yet. Resend the invitation instead.');
    }
    const losesManager = can(user.role, 'user:manage') && user.active && (changes.active === false || (changes.role !== undefined && !can(changes.role, 'user:manage')));
    if (losesManager && !managers.some((m) => m.id !== user.id)) {
      throw new AppError('conflict:last_manager', 'The studio needs at least one active manager. Make someone else a manager first.');
    }
    const before = { role: user.role, active: user.active };
    // A new role or a deactivation ends the person's earlier sessions.
    await user.update({ ...changes, sessionVersion: user.sessionVersion + 1 }, { transaction }).catch((error: unknown) => {
      if (isActiveAddressTaken(error)) throw new AppError('conflict:user_email', 'This address is now used by another active Takeproof account, so this one cannot be reactivated.');
      throw error;
    });
    if (changes.active === false) {
      await Invitation.update({ revokedAt: new Date() }, { where: { userId: user.id, usedAt: null, revokedAt: null }, transaction });
    }
    const detail = Object.fromEntries(Object.keys(changes).map((k) => [k, { from: before[k as keyof typeof before], to: changes[k as keyof typeof changes] }]));
    await audit(actor, changes.active === false ? 'user.deactivate' : changes.active === true ? 'user.reactivate' : 'user.role_change', { type: 'user', id }, detail, transaction);
  });
  return memberView(actor, id);
}


async function lookUp(token: string, transaction?: Transaction) {
  if (!/^[A-Za-z0-9_-]{43}$/.test(token)) return { state: 'unknown' as const };
  db();
  const invitation = await Invitation.findOne({ where: { tokenHash: hashToken(token) }, transaction, lock: transaction ? transaction.LOCK.UPDATE : undefined });
  if (!invitation) return { state: 'unknown' as const };
  const user = await User.findOne({ where: { id: invitation.userId, studioId: invitation.studioId }, transaction });
  if (!user) return { state: 'unknown' as const };
  const purpose = invitation.purpose;
  // An invitation is spent once the person has a password; a reset link once it was used.
  if (invitation.usedAt || (purpose === 'invite' && user.passwordHash)) return { state: 'used' as const, purpose };
  // A reset link stops working when it was replaced, or when the person was deactivated meanwhile.
  if (invitation.revokedAt || (purpose === 'reset' && !user.active)) return { state: 'unknown' as const };
  if (invitation.expiresAt.getTime() <= Date.now()) return { state: 'expired' as const, purpose };
  return { state: 'valid' as const, purpose, invitation, user };
}

/** What the invitation page shows for a token, without using it up. */
export async function checkInvitation(token: string): Promise<InvitationCheck> {
  const found = await lookUp(token);
  if (found.state !== 'valid') return found;
  const studio = (await Studio.findByPk(found.user.studioId))?.name ?? '';
  return { state: 'valid', purpose: found.purpose, name: found.user.name, email: found.user.email, studio, expiresAt: found.invitation.expiresAt.toISOString() };
}

/**
 * Sets the password a link was sent for: an invited person's first one (the account becomes
 * active), or an active person's new one (every earlier session ends). The link cannot be used again.
 */
export async function acceptInvitation(token: string, password: string): Promise<{ email: string; purpose: LinkPurpose }> {
  const passwordHash = await hashPassword(password);
  return db().transaction(async (transaction) => {
    const found = await lookUp(token, transaction);
    if (found.state !== 'valid') throw new AppError(`invalid:invitation_${found.state}`, linkRefusal(found));
    const { invitation, user, purpose } = found;
    await user.update({ passwordHash, active: true, sessionVersion: user.sessionVersion + 1 }, { transaction }).catch((error: unknown) => {
      if (isActiveAddressTaken(error)) {
        throw new AppError('conflict:account_exists', 'This address already has an active Takeproof account. Sign in with it, or ask for an invitation at another address.');
      }
      throw error;
    });
    await invitation.update({ usedAt: new Date() }, { transaction });
    await Invitation.update({ revokedAt: new Date() }, { where: { userId: user.id, usedAt: null, revokedAt: null, id: { [Op.ne]: invitation.id } }, transaction });
    const self: Actor = { id: user.id, studioId: user.studioId, role: user.role, name: user.name, email: user.email };
    await audit(self, purpose === 'reset' ? 'account.password_reset' : 'invitation.accept', { type: 'user', id: user.id }, null, transaction);
    return { email: user.email, purpose };
  });
}
