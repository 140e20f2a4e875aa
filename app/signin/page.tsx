import type { Metadata } from 'next';
import { redirect } from 'next/navigation';
import { FormMessage } from '@/components/FormMessage';
import { SignInForm } from '@/components/SignInForm';
import { Wordmark } from '@/components/Wordmark';
import { currentActor } from '@/lib/auth/guard.server';

export const metadata: Metadata = { title: 'Sign in' };

/** Notices other pages send people here with (`?notice=…`). */
const NOTICES = new Map([['password-changed', 'Your password was changed and every session of yours has ended. Sign in with the new password.']]);

export default async function SignInPage({ searchParams }: { searchParams: Promise<{ notice?: string }> }) {
  if (await currentActor()) redirect('/');
  const notice = NOTICES.get((await searchParams).notice ?? '');
  return (
    <main className="flex min-h-screen items-center justify-center px-4">
      <div className="w-full max-w-sm">
        <div className="mb-6 text-center">
          <Wordmark className="text-ink" />
          <p className="mt-2 text-sm text-muted">Proof every take before it leaves the room.</p>
        </div>
        <div className="tp-card p-6 shadow-sm">
          <h1 className="mb-4 text-xl font-semibold">Sign in</h1>
          <FormMessage notice={notice} className="mb-4" testId="sign-in-notice" />
          <SignInForm />
          <p className="mt-4 text-sm text-muted">Forgot your password? Ask your studio manager to send you a link to choose a new one.</p>
        </div>
      </div>
    </main>
  );
}
