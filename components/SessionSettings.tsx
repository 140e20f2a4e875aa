'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { useSWRConfig } from 'swr';
import { type ApiError, fetchJson } from '@/lib/http/fetcher';
import type { Option } from './SessionCreateForm';

/** Changes a session's delivery spec (verdicts are re-judged at once) or closes/reopens it. */
export function SessionSettings({ sessionId, specId, status, specs, takesKey }: { sessionId: number; specId: number | null; status: 'open' | 'closed'; specs: Option[]; takesKey: string }) {
  const router = useRouter();
  const { mutate } = useSWRConfig();
  const [message, setMessage] = useState<{ ok: boolean; text: string } | null>(null);
  const [busy, setBusy] = useState(false);

  async function save(patch: Record<string, unknown>, done: string) {
    setBusy(true);
    setMessage(null);
    try {
      await fetchJson(`/api/sessions/${sessionId}`, { method: 'PATCH', json: patch });
      setMessage({ ok: true, text: done });
      await mutate(takesKey);
      router.refresh();
    } catch (e) {
      setMessage({ ok: false, text: (e as ApiError).message });
    } finally {
      setBusy(false);
    }
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
      {message && (
        <p role="status" className={`text-sm ${message.ok ? 'text-pass' : 'text-fail'}`}>
          {message.ok ? '✓' : '✕'} {message.text}
        </p>
      )}
    </div>
  );
}
