import type { Metadata } from 'next';
import { redirect } from 'next/navigation';
import { SignInForm } from '@/components/SignInForm';
import { Wordmark } from '@/components/Wordmark';
import { currentActor } from '@/lib/auth/guard.server';

export const metadata: Metadata = { title: 'Sign in' };

export default async function SignInPage() {
  if (await currentActor()) redirect('/');
  return (
    <main className="flex min-h-screen items-center justify-center px-4">
      <div className="w-full max-w-sm">
        <div className="mb-6 text-center">
          <Wordmark className="text-ink" />
          <p className="mt-2 text-sm text-muted">Proof every take before it leaves the room.</p>
        </div>
        <div className="tp-card p-6 shadow-sm">
          <h1 className="mb-4 text-xl font-semibold">Sign in</h1>
          <SignInForm />
        </div>
      </div>
    </main>
  );
}
