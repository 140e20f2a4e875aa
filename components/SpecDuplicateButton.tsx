'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { type ApiError, fetchJson } from '@/lib/http/fetcher';

/** Copies a spec under a new name ("Copy of …") and opens the copy for editing. */
export function SpecDuplicateButton({ specId, specName }: { specId: number; specName: string }) {
  const router = useRouter();
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  async function duplicate() {
    setBusy(true);
    setError(null);
    try {
      const copy = await fetchJson<{ id: number }>(`/api/specs/${specId}/duplicate`, { method: 'POST', json: {} });
      router.push(`/specs/${copy.id}?created=1`);
    } catch (e) {
      setError((e as ApiError).message);
      setBusy(false);
    }
  }
  return (
    <span className="inline-flex flex-col">
      <button type="button" className="tp-button-quiet" onClick={duplicate} disabled={busy} aria-label={`Duplicate ${specName}`}>
        {busy ? 'Copying…' : 'Duplicate'}
      </button>
      {error && (
        <span role="alert" className="tp-field-error">
          ✕ {error}
        </span>
      )}
    </span>
  );
}
