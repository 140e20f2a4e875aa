import type { Metadata } from 'next';
import Link from 'next/link';
import { InviteAcceptForm } from '@/components/InviteAcceptForm';
import { Wordmark } from '@/components/Wordmark';
import { PASSWORD_MIN } from '@/lib/team/schema';
import { checkInvitation } from '@/lib/team/service.server';
import { linkRefusal } from '@/lib/team/views';

export const metadata: Metadata = { title: 'Set your password', referrer: 'no-referrer' };

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
              <h1 className="mb-2 text-xl font-semibold">{check.purpose === 'reset' ? `Choose a new password, ${check.name}` : `Welcome, ${check.name}`}</h1>
              <p className="mb-4 text-sm text-muted">
                {check.purpose === 'reset' ? `Your studio manager at ${check.studio} sent you this link. ` : `You have been invited to ${check.studio} on Takeproof. `}
                Choose a password of at least {PASSWORD_MIN} characters for <span className="font-semibold text-ink">{check.email}</span>.
                {check.purpose === 'reset' && ' Saving it signs you out everywhere.'}
              </p>
              <InviteAcceptForm token={token} email={check.email} minLength={PASSWORD_MIN} purpose={check.purpose} />
            </>
          ) : (
            <div role="alert">
              <h1 className="mb-2 text-xl font-semibold">
                <span aria-hidden="true">✕ </span>
                {check.state !== 'unknown' && check.purpose === 'reset' ? 'This link cannot be used' : 'This invitation cannot be used'}
              </h1>
              <p className="text-muted">{linkRefusal(check)}</p>
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
