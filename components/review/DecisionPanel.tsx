'use client';

import { useState } from 'react';
import { DecisionMark } from '@/components/StatusMarks';
import { FormField } from '@/components/FormField';
import { useApiForm } from '@/components/useApiForm';
import { fetchJson } from '@/lib/http/fetcher';
import { fieldErrorsOf } from '@/lib/errors';
import { decisionSchema } from '@/lib/review/schema';
import type { TakeDetail } from '@/lib/takes/views';
import { formatDateTime } from '@/lib/format';
import { FormMessage } from '@/components/FormMessage';
import { DECISION_STATUS } from '@/lib/status';

/** The producer's decision on the take: shown to everyone, made by producers and managers. */
export function DecisionPanel({ take, canDecide, onDecided }: { take: TakeDetail; canDecide: boolean; onDecided: (take: TakeDetail) => void }) {
  const [note, setNote] = useState('');
  const { fields, setFields, error, setError, busy, run } = useApiForm();
  const measured = take.status === 'measured';

  async function send(decision: 'approved' | 'rejected' | 'pending') {
    setError(null);
    const parsed = decisionSchema.safeParse({ decision, note });
    if (!parsed.success) {
      setFields(fieldErrorsOf(parsed.error));
      return;
    }
    await run(async () => {
      const updated = await fetchJson<TakeDetail>(`/api/takes/${take.id}/decision`, { method: 'POST', json: { decision, note } });
      setNote('');
      onDecided(updated);
    });
  }

  return (
    <section className="tp-card p-4" aria-labelledby="decision-heading">
      <h2 id="decision-heading" className="text-lg font-semibold">
        Decision
      </h2>
      <div className="mt-2 text-sm" data-testid="decision-state">
        <DecisionMark decision={take.decision} />
        {take.decision !== 'pending' && (
          <span className="text-muted">
            {' '}
            by {take.decidedBy ?? 'someone no longer in the studio'}
            {take.decidedAt && <> on {formatDateTime(take.decidedAt)}</>}
          </span>
        )}
        {take.decision === 'pending' && <span className="text-muted"> — no one has decided on this take yet.</span>}
      </div>
      {take.decisionNote && (
        <blockquote className="mt-2 border-l-4 border-line pl-3 text-sm whitespace-pre-line" data-testid="decision-note">
          {take.decisionNote}
        </blockquote>
      )}
      {canDecide ? (
        <form className="mt-4 space-y-3" onSubmit={(e) => e.preventDefault()} noValidate aria-label="Decide on this take">
          <FormField id="decision-note" label={take.decision === 'pending' ? 'Note for the engineer' : 'New note'} hint="Optional when approving; needed to reject." errors={fields.note}>
            <textarea
              id="decision-note"
              className="tp-input min-h-20"
              value={note}
              maxLength={2000}
              onChange={(e) => setNote(e.target.value)}
              aria-invalid={!!fields.note}
              aria-describedby={fields.note ? 'decision-note-error' : 'decision-note-hint'}
              placeholder="e.g. Clipped on the laugh at 2:14; please send the backup recorder's file."
            />
          </FormField>
          <div className="flex flex-wrap gap-2">
            <button type="button" className="tp-button" disabled={busy || !measured} onClick={() => send('approved')}>
              <span aria-hidden="true">{DECISION_STATUS.approved.mark}</span> Approve for the edit
            </button>
            <button type="button" className="tp-button-quiet border-fail text-fail" disabled={busy} onClick={() => send('rejected')}>
              <span aria-hidden="true">{DECISION_STATUS.rejected.mark}</span> Reject
            </button>
            {take.decision !== 'pending' && (
              <button type="button" className="tp-button-quiet" disabled={busy} onClick={() => send('pending')}>
                <span aria-hidden="true">{DECISION_STATUS.pending.mark}</span> Reopen
              </button>
            )}
          </div>
          {!measured && <p className="text-xs text-muted">Approval opens once the take has been measured.</p>}
          <FormMessage error={Object.keys(fields).length ? null : error} />
        </form>
      ) : (
        <p className="mt-3 text-xs text-muted">Producers and studio managers decide on takes.</p>
      )}
    </section>
  );
}
