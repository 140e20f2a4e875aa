import type { Metadata } from 'next';
import { PasswordChangeForm } from '@/components/PasswordChangeForm';
import { ROLE_LABEL } from '@/lib/auth/policy';
import { requireActor } from '@/lib/auth/guard.server';
import { loadPage } from '@/lib/http/pages.server';
import { studioName } from '@/lib/studio/studio.server';
import { PASSWORD_MIN } from '@/lib/team/schema';

export const metadata: Metadata = { title: 'Your account' };

export default async function AccountPage() {
  const { actor, studio } = await loadPage(async () => {
    const actor = await requireActor();
    return { actor, studio: await studioName(actor) };
  });
  return (
    <div className="max-w-xl">
      <h1 className="text-2xl font-semibold">Your account</h1>
      <dl className="mt-4 grid grid-cols-[max-content_1fr] gap-x-6 gap-y-1 text-sm">
        <dt className="text-muted">Name</dt>
        <dd>{actor.name}</dd>
        <dt className="text-muted">E-mail</dt>
        <dd>{actor.email}</dd>
        <dt className="text-muted">Role</dt>
        <dd>{ROLE_LABEL[actor.role]}</dd>
        <dt className="text-muted">Studio</dt>
        <dd>{studio}</dd>
      </dl>
      <p className="mt-2 text-sm text-muted">A studio manager sets your role on the Team page.</p>
      <section aria-labelledby="password-heading" className="tp-card mt-8 p-6">
        <h2 id="password-heading" className="text-lg font-semibold">Change your password</h2>
        <p className="mb-4 mt-1 text-sm text-muted">
          Saving signs you out everywhere, on this computer too; sign in again with the new password.
        </p>
        <PasswordChangeForm email={actor.email} minLength={PASSWORD_MIN} />
      </section>
    </div>
  );
}
