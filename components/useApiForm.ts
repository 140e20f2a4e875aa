'use client';

import { useState } from 'react';
import type { FieldErrors } from '@/lib/errors';
import type { ApiError } from '@/lib/http/fetcher';

/**
 * The state every form that posts to Takeproof's API keeps: field errors, the outcome line and
 * whether it is busy. `run(action)` clears them, runs the action, shows a returned string as the
 * confirmation, and turns an ApiError into field errors and a message. Resolves true on success.
 */
export function useApiForm() {
  const [fields, setFields] = useState<FieldErrors>({});
  const [error, setError] = useState<string | null>(null);
  const [notice, setNotice] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  async function run(action: () => Promise<string | void>): Promise<boolean> {
    setBusy(true);
    setError(null);
    setNotice(null);
    setFields({});
    try {
      const done = await action();
      if (done) setNotice(done);
      return true;
    } catch (e) {
      const apiError = e as ApiError;
      setFields(apiError.fields ?? {});
      setError(apiError.message);
      return false;
    } finally {
      setBusy(false);
    }
  }

  return { fields, setFields, error, setError, notice, busy, run };
}
