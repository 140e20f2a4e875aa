import type { Metadata } from 'next';
import Link from 'next/link';
import { InviteAcceptForm } from '@/components/InviteAcceptForm';
import { Wordmark } from '@/components/Wordmark';
import { PASSWORD_MIN } from '@/lib/team/schema';
import { checkInvitation } from '@/lib/team/service.server';
import { INVITATION_REFUSED } from '@/lib/team/views';

export const metadata: Metadata = { title: 'Accept invitation', referrer: 'no-referrer' };

/** Outside the signed-in layout: the invitation link itself is the only credential. */
export default async function InvitePage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const check = await checkInvitation(token);
  return (
    <main className="flex min-h-screen items-center justify-center px-4">
      <div className="w-full max-w-md">
        <div className="mb-6 text-center">
          <Wordmark className="text-ink" />
        </div>
        <div className="tp-card p-6 shadow-sm">
          {check.state === 'valid' ? (
            <>
              <h1 className="mb-2 text-xl font-semibold">{`Welcome, ${check.name}`}</h1>
              <p className="mb-4 text-sm text-muted">
                You have been invited to {check.studio} on Takeproof. Choose a password of at least {PASSWORD_MIN} characters for <span className="font-semibold text-ink">{check.email}</span>.
              </p>
              <InviteAcceptForm token={token} email={check.email} minLength={PASSWORD_MIN} />
            </>
          ) : (
            <div role="alert">
              <h1 className="mb-2 text-xl font-semibold">
                <span aria-hidden="true">✕ </span>This invitation cannot be used
              </h1>
              <p className="text-muted">{INVITATION_REFUSED[check.state]}</p>
              <p className="mt-4">
                <Link href="/signin" className="text-accent underline">
                  Go to sign-in
                </Link>
              </p>
            </div>
          )}
        </div>
      </div>
    </main>
  );
}
