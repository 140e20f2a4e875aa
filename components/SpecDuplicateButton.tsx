'use client';

import { useRouter } from 'next/navigation';
import { fetchJson } from '@/lib/http/fetcher';
import { FormMessage } from './FormMessage';
import { useApiForm } from './useApiForm';

/** Copies a spec under a new name ("Copy of …") and opens the copy for editing. */
export function SpecDuplicateButton({ specId, specName }: { specId: number; specName: string }) {
  const router = useRouter();
  const { error, busy, run } = useApiForm();
  async function duplicate() {
    await run(async () => {
      const copy = await fetchJson<{ id: number }>(`/api/specs/${specId}/duplicate`, { method: 'POST', json: {} });
      router.push(`/specs/${copy.id}?created=1`);
    });
  }
  return (
    <span className="inline-flex flex-col">
      <button type="button" className="tp-button-quiet" onClick={duplicate} disabled={busy} aria-label={`Duplicate ${specName}`}>
        {busy ? 'Copying…' : 'Duplicate'}
      </button>
      <FormMessage error={error} inline />
    </span>
  );
}
