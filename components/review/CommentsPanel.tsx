'use client';

import { useState } from 'react';
import { FormField } from '@/components/FormField';
import { useApiForm } from '@/components/useApiForm';
import { fetchJson } from '@/lib/http/fetcher';
import { fieldErrorsOf } from '@/lib/errors';
import { formatClock, formatDateTime, parseClock } from '@/lib/format';
import { commentSchema } from '@/lib/review/schema';
import type { TakeCommentView } from '@/lib/review/views';
import { FormMessage } from '@/components/FormMessage';

/** Time-stamped comments: listed in time order, added at the playhead (or a typed time). */
export function CommentsPanel({
  takeId,
  comments,
  playhead,
  canComment,
  onAdded,
  onSeek,
}: {
  takeId: number;
  comments: TakeCommentView[];
  playhead: number;
  canComment: boolean;
  onAdded: () => void;
  onSeek: (seconds: number) => void;
}) {
  const [at, setAt] = useState('');
  const [body, setBody] = useState('');
  const { fields, setFields, error, setError, busy, run } = useApiForm();

  async function onSubmit(event: React.FormEvent) {
    event.preventDefault();
    setError(null);
    const atSec = at.trim() === '' ? Math.round(playhead * 10) / 10 : parseClock(at);
    if (atSec === null) {
      setFields({ atSec: ['Write the time as m:ss, e.g. 2:14'] });
      return;
    }
    const parsed = commentSchema.safeParse({ atSec, body });
    if (!parsed.success) {
      setFields(fieldErrorsOf(parsed.error));
      return;
    }
    await run(async () => {
      await fetchJson(`/api/takes/${takeId}/comments`, { method: 'POST', json: parsed.data });
      setBody('');
      setAt('');
      onAdded();
    });
  }

  return (
    <section className="tp-card p-4" aria-labelledby="comments-heading">
      <h2 id="comments-heading" className="text-lg font-semibold">
        Comments
      </h2>
      {comments.length === 0 ? (
        <p className="mt-2 text-sm text-muted">No comments yet. Add one at the playhead, e.g. “door slam”.</p>
      ) : (
        <ol className="mt-2 space-y-2" data-testid="comments-list">
          {comments.map((c) => (
            <li key={c.id} className="text-sm">
              <button type="button" className="font-mono text-xs text-accent hover:underline" onClick={() => onSeek(c.atSec)} aria-label={`Go to ${formatClock(c.atSec)}`}>
                {formatClock(c.atSec)}
              </button>{' '}
              <span className="whitespace-pre-line">{c.body}</span>
              <span className="block text-xs text-muted">
                {c.author?.name ?? 'Former member'} · {formatDateTime(c.createdAt)}
              </span>
            </li>
          ))}
        </ol>
      )}
      {canComment && (
        <form onSubmit={onSubmit} className="mt-4 space-y-3" noValidate aria-label="Add a comment">
          <FormField id="comment-at" label="At" hint={`Empty means the playhead, now ${formatClock(playhead)}.`} errors={fields.atSec}>
            <input id="comment-at" className="tp-input font-mono" inputMode="decimal" placeholder={formatClock(playhead)} value={at} onChange={(e) => setAt(e.target.value)} aria-invalid={!!fields.atSec} />
          </FormField>
          <FormField id="comment-body" label="Comment" errors={fields.body}>
            <textarea id="comment-body" className="tp-input min-h-16" value={body} maxLength={2000} onChange={(e) => setBody(e.target.value)} aria-invalid={!!fields.body} />
          </FormField>
          <button type="submit" className="tp-button" disabled={busy}>
            Add comment
          </button>
          <FormMessage error={Object.keys(fields).length ? null : error} />
        </form>
      )}
    </section>
  );
}
