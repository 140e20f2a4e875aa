'use client';

import { useId, useState } from 'react';
import useSWR from 'swr';
import { type ApiError, fetchJson, swrFetcher } from '@/lib/http/fetcher';
import { FormField } from './FormField';
import { FormMessage } from '@/components/FormMessage';
import { useApiForm } from './useApiForm';
import type { DeliveryView } from '@/lib/mail/views';
import { MAIL_STATUS } from '@/lib/status';
import { StatusMark } from './StatusMarks';
import { formatDateTime } from '@/lib/format';

const waiting = (d: DeliveryView) => d.status === 'queued' || d.status === 'sending';

function splitAddresses(text: string): string[] {
  return text
    .split(/[\s,;]+/)
    .map((s) => s.trim())
    .filter(Boolean);
}

function DeliveryLine({ delivery, onRetry, busy }: { delivery: DeliveryView; onRetry: (id: number) => void; busy: boolean }) {
  return (
    <li className="border-t border-line py-2 first:border-t-0">
      <div className="flex flex-wrap items-baseline gap-x-3">
        <StatusMark status={MAIL_STATUS[delivery.status]} />
        <span className="break-all">{delivery.recipients.join(', ')}</span>
        <span className="font-mono text-xs text-muted">{formatDateTime(delivery.sentAt ?? delivery.createdAt)}</span>
        {delivery.sentBy && <span className="text-xs text-muted">by {delivery.sentBy}</span>}
      </div>
      {delivery.status === 'queued' && delivery.error && (
        <p className="mt-1 text-sm text-muted">Not sent yet: {delivery.error} Takeproof tries again by itself.</p>
      )}
      {delivery.status === 'failed' && (
        <div className="mt-1 flex flex-wrap items-center gap-3">
          <p className="text-sm text-fail">{delivery.error}</p>
          <button type="button" className="tp-button-quiet" disabled={busy} onClick={() => onRetry(delivery.id)}>
            {busy ? 'Sending…' : 'Try again'}
          </button>
        </div>
      )}
    </li>
  );
}

/** Downloads of the session report, and (for producers and managers) the form that e-mails it. */
export function SessionReportPanel({ sessionId, maySend }: { sessionId: number; maySend: boolean }) {
  const formId = useId();
  const key = maySend ? `/api/sessions/${sessionId}/report` : null;
  // While a report waits in the outbox, its line is refreshed until the mail server has taken it.
  const { data, mutate } = useSWR<{ deliveries: DeliveryView[] }, ApiError>(key, swrFetcher, { refreshInterval: (latest) => (latest?.deliveries.some(waiting) ? 2000 : 0) });
  const [open, setOpen] = useState(false);
  const { fields, error, setError, busy, run } = useApiForm();
  const [result, setResult] = useState<DeliveryView | null>(null);
  const [retrying, setRetrying] = useState<number | null>(null);
  // The line under the form follows the outbox: queued, then sent (or not sent).
  const shown = result ? (data?.deliveries.find((d) => d.id === result.id) ?? result) : null;

  async function onSubmit(event: React.FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const formElement = event.currentTarget;
    const form = new FormData(formElement);
    const payload = { to: splitAddresses(String(form.get('to') ?? '')), message: String(form.get('message') ?? '') };
    setResult(null);
    await run(async () => {
      const { delivery } = await fetchJson<{ delivery: DeliveryView }>(`/api/sessions/${sessionId}/report`, { method: 'POST', json: payload });
      setResult(delivery);
      if (delivery.status !== 'failed') formElement.reset();
      await mutate();
    });
  }

  async function retry(id: number) {
    setRetrying(id);
    try {
      const { delivery } = await fetchJson<{ delivery: DeliveryView }>(`/api/deliveries/${id}/retry`, { method: 'POST' });
      if (result?.id === id) setResult(delivery);
      await mutate();
    } catch (e) {
      setError((e as ApiError).message);
    } finally {
      setRetrying(null);
    }
  }

  // Recipient errors come as `to` and `to.N`; all of them belong to the one recipients field.
  const toErrors = Object.entries(fields)
    .filter(([k]) => k === 'to' || k.startsWith('to.'))
    .flatMap(([, v]) => v);
  const deliveries = data?.deliveries ?? [];

  return (
    <section aria-labelledby={`${formId}-heading`} className="tp-card mt-6 p-4">
      <div className="flex flex-wrap items-center gap-3">
        <h2 id={`${formId}-heading`} className="mr-auto text-lg font-semibold">
          Session report
        </h2>
        <a className="tp-button-quiet" href={`/api/sessions/${sessionId}/report.pdf`} download>
          Download PDF
        </a>
        <a className="tp-button-quiet" href={`/api/sessions/${sessionId}/report.csv`} download>
          Download CSV
        </a>
        {maySend && (
          <button type="button" className="tp-button" aria-expanded={open} aria-controls={`${formId}-form`} onClick={() => setOpen((o) => !o)}>
            Send report
          </button>
        )}
      </div>
      <p className="mt-2 max-w-prose text-sm text-muted">
        The report lists every take with its verdict, decision and key measures. The studio&rsquo;s and the broadcaster&rsquo;s own delivery specs take precedence over Takeproof&rsquo;s defaults.
      </p>
      {maySend && open && (
        <form id={`${formId}-form`} onSubmit={onSubmit} noValidate aria-label="Send report" className="mt-4 grid max-w-2xl gap-4">
          <FormField id={`${formId}-to`} label="Recipients" hint="Up to 20 e-mail addresses, separated by commas or new lines." errors={toErrors.length ? toErrors : undefined}>
            <textarea
              id={`${formId}-to`}
              name="to"
              rows={2}
              className="tp-input"
              autoComplete="email"
              aria-invalid={toErrors.length > 0}
              aria-describedby={toErrors.length ? `${formId}-to-error` : `${formId}-to-hint`}
            />
          </FormField>
          <FormField id={`${formId}-message`} label="Message (optional)" hint="Shown above the report, up to 2000 characters." errors={fields.message}>
            <textarea id={`${formId}-message`} name="message" rows={4} maxLength={2000} className="tp-input" aria-invalid={!!fields.message} />
          </FormField>
          <FormMessage error={error} />
          <div>
            <button type="submit" className="tp-button" disabled={busy}>
              {busy ? 'Sending…' : 'Send to recipients'}
            </button>
          </div>
        </form>
      )}
      {shown && (
        <p role="status" data-testid="report-result" className="mt-3 text-sm">
          <StatusMark status={MAIL_STATUS[shown.status]}>
            {shown.status === 'sent'
              ? `Report sent to ${shown.recipients.join(', ')}.`
              : waiting(shown)
                ? `The report to ${shown.recipients.join(', ')} is in the outbox and goes out in a moment.`
                : `The report was not sent: ${shown.error}`}
          </StatusMark>
        </p>
      )}
      {maySend && deliveries.length > 0 && (
        <div className="mt-4">
          <h3 className="text-sm font-semibold text-muted">Sent reports</h3>
          <ul className="text-sm">
            {deliveries.map((d) => (
              <DeliveryLine key={d.id} delivery={d} onRetry={retry} busy={retrying === d.id} />
            ))}
          </ul>
        </div>
      )}
    </section>
  );
}
