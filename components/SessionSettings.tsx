'use client';

import { useRouter } from 'next/navigation';
import { useSWRConfig } from 'swr';
import { fetchJson } from '@/lib/http/fetcher';
import { FormMessage } from './FormMessage';
import { useApiForm } from './useApiForm';
import type { Option } from './SessionCreateForm';

/** Changes a session's delivery spec (verdicts are re-judged at once) or closes/reopens it. */
export function SessionSettings({ sessionId, specId, status, specs, takesKey }: { sessionId: number; specId: number | null; status: 'open' | 'closed'; specs: Option[]; takesKey: string }) {
  const router = useRouter();
  const { mutate } = useSWRConfig();
  const { error, notice, busy, run } = useApiForm();

  async function save(patch: Record<string, unknown>, done: string) {
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
        <select
          className="tp-input"
          defaultValue={specId ?? ''}
          disabled={busy}
          onChange={(e) => save({ deliverySpecId: e.target.value ? Number(e.target.value) : null }, 'Delivery spec changed; every verdict was judged again.')}
        >
          <option value="">Takeproof defaults</option>
          {specs.map((s) => (
            <option key={s.id} value={s.id}>
              {s.name}
            </option>
          ))}
        </select>
      </label>
      <button type="button" className="tp-button-quiet" disabled={busy} onClick={() => save({ status: status === 'open' ? 'closed' : 'open' }, status === 'open' ? 'Session closed.' : 'Session reopened.')}>
        {status === 'open' ? 'Close session' : 'Reopen session'}
      </button>
      <FormMessage error={error} notice={notice} />
    </div>
  );
}
