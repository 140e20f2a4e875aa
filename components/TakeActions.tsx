'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { FormMessage } from './FormMessage';
import { useApiForm } from './useApiForm';
import { fetchJson } from '@/lib/http/fetcher';
import type { TakeSummary } from '@/lib/takes/views';

type ActionTake = Pick<TakeSummary, 'id' | 'sessionId' | 'originalName' | 'status'>;

/**
 * Measure again and Remove take for one take. Removing asks first; after it the page goes back
 * to the session (`leaveTo`) or the list refreshes itself (`onChanged`). Buttons are never
 * disabled while focused: a busy click is ignored instead.
 */
export function TakeActions({
  take,
  canRemeasure,
  canRemove,
  onChanged,
  leaveTo,
  compact = false,
}: {
  take: ActionTake;
  canRemeasure: boolean;
  canRemove: boolean;
  onChanged: () => void;
  leaveTo?: string;
  compact?: boolean;
}) {
  const router = useRouter();
  const [confirming, setConfirming] = useState(false);
  const { error, notice, busy, run } = useApiForm();
  const waiting = take.status === 'queued' || take.status === 'measuring';
  const button = compact ? 'tp-button-quiet px-2 py-0.5 text-xs' : 'tp-button-quiet';

  async function remeasure() {
    if (busy) return;
    await run(async () => {
      await fetchJson(`/api/takes/${take.id}/remeasure`, { method: 'POST' });
      onChanged();
      return `“${take.originalName}” is queued to be measured again.`;
    });
  }

  async function remove() {
    if (busy) return;
    const removed = await run(async () => {
      await fetchJson(`/api/takes/${take.id}`, { method: 'DELETE' });
    });
    if (!removed) return;
    setConfirming(false);
    if (leaveTo) router.push(leaveTo);
    else onChanged();
  }

  if (!canRemeasure && !canRemove) return null;
  return (
    <span className="inline-flex flex-wrap items-center gap-2" data-testid="take-actions">
      {canRemeasure && !waiting && !confirming && (
        <button type="button" className={button} onClick={remeasure} aria-disabled={busy}>
          Measure again
        </button>
      )}
      {canRemove && !confirming && (
        <button type="button" className={button} onClick={() => setConfirming(true)}>
          Remove take
        </button>
      )}
      {confirming && (
        <span role="group" aria-label={`Remove “${take.originalName}”?`} className="inline-flex flex-wrap items-center gap-2 text-sm">
          <span>Remove “{take.originalName}” with its comments and files?</span>
          <button type="button" className={`${button} text-fail`} onClick={remove} aria-disabled={busy} autoFocus>
            Yes, remove
          </button>
          <button type="button" className={button} onClick={() => setConfirming(false)}>
            Keep it
          </button>
        </span>
      )}
      <FormMessage error={error} notice={notice} inline className={compact ? 'text-xs' : ''} />
    </span>
  );
}
