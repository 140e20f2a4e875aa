'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { useSWRConfig } from 'swr';
import { fetchJson } from '@/lib/http/fetcher';
import { FormMessage } from './FormMessage';
import { useApiForm } from './useApiForm';
import type { Option } from './SessionCreateForm';

/**
 * Changes a session's delivery spec (choose, then confirm: every verdict is judged again) or
 * closes/reopens it. Controls stay enabled while saving; a click meanwhile is ignored.
 */
export function SessionSettings({ sessionId, specId, status, specs, takesKey }: { sessionId: number; specId: number | null; status: 'open' | 'closed'; specs: Option[]; takesKey: string }) {
  const router = useRouter();
  const { mutate } = useSWRConfig();
  const { error, notice, busy, run } = useApiForm();
  const saved = specId === null ? '' : String(specId);
  const [draft, setDraft] = useState(saved);
  const draftName = specs.find((s) => String(s.id) === draft)?.name ?? 'Takeproof defaults';

  async function save(patch: Record<string, unknown>, done: string) {
    if (busy) return;
    await run(async () => {
      await fetchJson(`/api/sessions/${sessionId}`, { method: 'PATCH', json: patch });
      await mutate(takesKey);
      router.refresh();
      return done;
    });
  }

  return (
    <div className="flex flex-wrap items-end gap-3">
      <label className="text-sm">
        <span className="tp-label">Delivery spec</span>
        <select className="tp-input" value={draft} onChange={(e) => setDraft(e.target.value)}>
          <option value="">Takeproof defaults</option>
          {specs.map((s) => (
            <option key={s.id} value={s.id}>
              {s.name}
            </option>
          ))}
        </select>
      </label>
      {draft !== saved && (
        <span role="group" aria-label="Change the delivery spec" className="flex flex-wrap items-center gap-2 text-sm">
          <span>Judge every take of this session again against “{draftName}”?</span>
          <button type="button" className="tp-button" onClick={() => save({ deliverySpecId: draft ? Number(draft) : null }, `Delivery spec changed to “${draftName}”; every verdict was judged again.`)} aria-disabled={busy}>
            Apply and judge again
          </button>
          <button type="button" className="tp-button-quiet" onClick={() => setDraft(saved)}>
            Keep the current spec
          </button>
        </span>
      )}
      <button type="button" className="tp-button-quiet" aria-disabled={busy} onClick={() => save({ status: status === 'open' ? 'closed' : 'open' }, status === 'open' ? 'Session closed.' : 'Session reopened.')}>
        {status === 'open' ? 'Close session' : 'Reopen session'}
      </button>
      <FormMessage error={error} notice={notice} />
    </div>
  );
}
