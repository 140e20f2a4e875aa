'use client';

import Link from 'next/link';
import { useState } from 'react';
import { type ApiError, fetchJson } from '@/lib/http/fetcher';
import type { FieldErrors } from '@/lib/errors';
import { NewPasswordFields } from './NewPasswordFields';
import { FormMessage } from '@/components/FormMessage';
import type { LinkPurpose } from '@/models/Invitation';

/** Sets the password a link was sent for: an invited person's first (the account is active at once), or a new one after a reset. */
export function InviteAcceptForm({ token, email, minLength, purpose }: { token: string; email: string; minLength: number; purpose: LinkPurpose }) {
  const [fields, setFields] = useState<FieldErrors>({});
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const [done, setDone] = useState(false);

  async function onSubmit(event: React.FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = new FormData(event.currentTarget);
    setBusy(true);
    setFields({});
    setError(null);
    try {
      await fetchJson('/api/invitations/accept', { method: 'POST', json: { token, password: form.get('password'), confirm: form.get('confirm') } });
      setDone(true);
    } catch (e) {
      const apiError = e as ApiError;
      setFields(apiError.fields ?? {});
      setError(apiError.fields ? null : apiError.message);
    } finally {
      setBusy(false);
    }
  }

  if (done) {
    return (
      <div role="status">
        <p className="font-semibold text-pass">
          <span aria-hidden="true">✓ </span>
          {purpose === 'reset' ? 'Your new password is set.' : 'Your account is ready.'}
        </p>
        <p className="mt-2 text-sm text-muted">Sign in with {email} and the password you just chose.</p>
        <Link href="/signin" className="tp-button mt-4">
          Sign in
        </Link>
      </div>
    );
  }

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4" aria-label="Set your password">
      <input type="email" name="username" value={email} autoComplete="username" readOnly hidden />
      <NewPasswordFields fields={fields} minLength={minLength} repeatLabel="Repeat the password" />
      <FormMessage error={error} />
      <button type="submit" className="tp-button w-full justify-center" disabled={busy}>
        {busy ? 'Saving…' : purpose === 'reset' ? 'Save the new password' : 'Set password and activate'}
      </button>
    </form>
  );
}
