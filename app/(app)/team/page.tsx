import type { Metadata } from 'next';
import { TeamManager } from '@/components/TeamManager';
import { requireActor } from '@/lib/auth/guard.server';
import { loadPage } from '@/lib/http/pages.server';
import { INVITATION_HOURS, listTeam } from '@/lib/team/service.server';

export const metadata: Metadata = { title: 'Team' };

export default async function TeamPage() {
  const { actor, users } = await loadPage(async () => {
    const actor = await requireActor('user:manage');
    return { actor, users: await listTeam(actor) };
  });
  return (
    <div>
      <h1 className="text-2xl font-semibold">Team</h1>
      <p className="mb-6 mt-1 max-w-prose text-muted">
        Invite people by e-mail; the link lets them set a password within {INVITATION_HOURS} hours and works once. Someone who forgot their password gets a link of the same kind with “Send reset link”. Roles decide what each person may do.
      </p>
      <TeamManager initial={users} selfId={actor.id} />
    </div>
  );
}
