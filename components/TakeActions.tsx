'use client';

import { useRouter } from 'next/navigation';
import { useRef, useState } from 'react';
import { FormMessage } from './FormMessage';
import { useApiForm } from './useApiForm';
import { fetchJson } from '@/lib/http/fetcher';
import { cleanFileName } from '@/lib/format';
import { fileRefusal } from '@/lib/takes/fileCheck';
import type { TakeSummary } from '@/lib/takes/views';

type ActionTake = Pick<TakeSummary, 'id' | 'sessionId' | 'originalName' | 'status'>;

/**
 * Measure again, Replace file and Remove take for one take. Replacing keeps the take's comments
 * and history; the new file is checked in the browser before it is sent. Removing asks first; after it the page goes back
 * to the session (`leaveTo`) or the list refreshes itself (`onChanged`). Buttons are never
 * disabled while focused: a busy click is ignored instead.
 */
export function TakeActions({
  take,
  canRemeasure,
  canRemove,
  replace,
  onChanged,
  leaveTo,
  compact = false,
}: {
  take: ActionTake;
  canRemeasure: boolean;
  canRemove: boolean;
  /** Offered when set: the studio's largest accepted file, bytes. */
  replace?: { maxBytes: number };
  onChanged: () => void;
  leaveTo?: string;
  compact?: boolean;
}) {
  const router = useRouter();
  const [confirming, setConfirming] = useState(false);
  const { error, setError, notice, busy, run } = useApiForm();
  const fileInput = useRef<HTMLInputElement>(null);
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

  async function replaceWith(file: File) {
    if (busy || !replace) return;
    const refusal = await fileRefusal(file, replace.maxBytes);
    if (refusal) {
      setError(refusal);
      return;
    }
    await run(async () => {
      const form = new FormData();
      form.append('file', file, cleanFileName(file.name));
      await fetchJson(`/api/takes/${take.id}/file`, { method: 'PUT', body: form });
      onChanged();
      return `“${file.name}” replaces the take’s file and is queued to be measured; comments and history stay.`;
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

  if (!canRemeasure && !canRemove && !replace) return null;
  return (
    <span className="inline-flex flex-wrap items-center gap-2" data-testid="take-actions">
      {canRemeasure && !waiting && !confirming && (
        <button type="button" className={button} onClick={remeasure} aria-disabled={busy}>
          Measure again
        </button>
      )}
      {replace && !waiting && !confirming && (
        <>
          <button type="button" className={button} onClick={() => fileInput.current?.click()} aria-disabled={busy}>
            Replace file
          </button>
          <input
            ref={fileInput}
            type="file"
            accept=".wav,.bwf,audio/wav,audio/x-wav"
            className="sr-only"
            tabIndex={-1}
            aria-hidden="true"
            data-testid="replace-file-input"
            onChange={(e) => {
              const file = e.target.files?.[0];
              e.target.value = '';
              if (file) void replaceWith(file);
            }}
          />
        </>
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
