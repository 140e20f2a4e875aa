'use client';

import { useRouter } from 'next/navigation';
import { fetchJson } from '@/lib/http/fetcher';
import { FormMessage } from './FormMessage';
import { useApiForm } from './useApiForm';

/** Archives a spec (no longer offered for new sessions; sessions that use it keep it) or restores it. */
export function SpecArchiveButton({ specId, archived }: { specId: number; archived: boolean }) {
  const router = useRouter();
  const { error, notice, busy, run } = useApiForm();
  async function toggle() {
    if (busy) return;
    await run(async () => {
      await fetchJson(`/api/specs/${specId}`, { method: 'PATCH', json: { archived: !archived } });
      router.refresh();
      return archived ? 'Restored: offered for new sessions again.' : 'Archived: no longer offered for new sessions; sessions that use it keep it.';
    });
  }
  return (
    <span className="inline-flex flex-col">
      <button type="button" className="tp-button-quiet" onClick={toggle} aria-disabled={busy}>
        {archived ? 'Restore' : 'Archive'}
      </button>
      <FormMessage error={error} notice={notice} inline />
    </span>
  );
}
