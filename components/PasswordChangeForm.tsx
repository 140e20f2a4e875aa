'use client';

import { signOut } from 'next-auth/react';
import { fetchJson } from '@/lib/http/fetcher';
import { FormField } from './FormField';
import { NewPasswordFields } from './NewPasswordFields';
import { FormMessage } from './FormMessage';
import { useApiForm } from './useApiForm';

/** The signed-in person's new password; on success every session ends and the sign-in page says why. */
export function PasswordChangeForm({ email, minLength }: { email: string; minLength: number }) {
  const { fields, error, busy, run } = useApiForm();

  async function onSubmit(event: React.FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = new FormData(event.currentTarget);
    const changed = await run(async () => {
      await fetchJson('/api/account/password', { method: 'POST', json: { current: form.get('current'), password: form.get('password'), confirm: form.get('confirm') } });
    });
    if (changed) await signOut({ callbackUrl: '/signin?notice=password-changed' });
  }

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4" aria-label="Change your password">
      <input type="email" name="username" value={email} autoComplete="username" readOnly hidden />
      <FormField id="current" label="Current password" errors={fields.current}>
        <input id="current" name="current" type="password" autoComplete="current-password" required className="tp-input" aria-invalid={!!fields.current} />
      </FormField>
      <NewPasswordFields fields={fields} minLength={minLength} repeatLabel="Repeat the new password" />
      <FormMessage error={Object.keys(fields).length ? null : error} />
      <button type="submit" className="tp-button" disabled={busy}>
        {busy ? 'Saving…' : 'Save the new password'}
      </button>
    </form>
  );
}
