import type { LinkPurpose } from '@/models/Invitation';
import type { Role } from '@/models/User';
import type { DeliveryView } from '@/lib/mail/views';

/** Shapes of the team page and the invitation page; safe to import from client components. */
export type MemberStatus = 'active' | 'invited' | 'deactivated';

export interface TeamMember {
  id: number;
  name: string;
  email: string;
  role: Role;
  status: MemberStatus;
  invitationExpiresAt: string | null;
  /** The newest invitation link has expired (as of when the list was read). */
  invitationExpired: boolean;
  lastInvitation: DeliveryView | null;
}

export type InvitationCheck =
  | { state: 'valid'; purpose: LinkPurpose; name: string; email: string; studio: string; expiresAt: string }
  | { state: 'expired' | 'used'; purpose: LinkPurpose }
  | { state: 'unknown' };

type Refusal = 'expired' | 'used' | 'unknown';

export const INVITATION_REFUSED: Record<Refusal, string> = {
  expired: 'This invitation has expired. Ask your studio manager to send a new one.',
  used: 'This invitation has already been used. Sign in with the password you chose.',
  unknown: 'This invitation link is not valid (it may have been replaced by a newer one). Ask your studio manager to send a new one.',
};

const RESET_REFUSED: Record<Refusal, string> = {
  expired: 'This password reset link has expired. Ask your studio manager to send a new one.',
  used: 'This password reset link has already been used. Sign in with the password you chose.',
  unknown: INVITATION_REFUSED.unknown,
};

/** Why a link cannot be used, in the words of what it was for. */
export function linkRefusal(check: Exclude<InvitationCheck, { state: 'valid' }>): string {
  return check.state !== 'unknown' && check.purpose === 'reset' ? RESET_REFUSED[check.state] : INVITATION_REFUSED[check.state];
}
