'use client';

import { signIn } from 'next-auth/react';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { FormMessage } from '@/components/FormMessage';

export function SignInForm() {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  async function onSubmit(event: React.FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = new FormData(event.currentTarget);
    setBusy(true);
    setError(null);
    const result = await signIn('credentials', { email: form.get('email'), password: form.get('password'), redirect: false });
    setBusy(false);
    if (result?.ok && !result.error) {
      router.replace('/');
      router.refresh();
    } else if (result?.status === 429) {
      setError('Too many attempts. Wait a few minutes, then try again.');
    } else {
      setError('That e-mail and password do not match an active account.');
    }
  }

  return (
    <form onSubmit={onSubmit} className="space-y-4" noValidate>
      <div>
        <label htmlFor="email" className="tp-label">E-mail</label>
        <input id="email" name="email" type="email" autoComplete="username" required className="tp-input" />
      </div>
      <div>
        <label htmlFor="password" className="tp-label">Password</label>
        <input id="password" name="password" type="password" autoComplete="current-password" required className="tp-input" />
      </div>
      <FormMessage error={error} />
      <button type="submit" className="tp-button w-full justify-center" disabled={busy}>
        {busy ? 'Signing in…' : 'Sign in'}
      </button>
    </form>
  );
}
