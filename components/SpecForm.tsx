'use client';

import { useRouter } from 'next/navigation';
import { fetchJson } from '@/lib/http/fetcher';
import { SPEC_PRECEDENCE_NOTE, THRESHOLD_FIELDS, type ThresholdField } from '@/lib/specs/fields';
import type { Thresholds } from '@/models/DeliverySpec';
import { FormMessage } from '@/components/FormMessage';
import { useApiForm } from './useApiForm';

interface SpecValues {
  id?: number;
  name: string;
  description: string | null;
  thresholds: Thresholds;
  sessionCount?: number;
}

function valueOf(field: ThresholdField, form: FormData): unknown {
  const raw = form.get(field.key);
  if (field.kind === 'boolean') return raw === 'on';
  const text = typeof raw === 'string' ? raw.trim() : '';
  if (text === '') return null;
  const n = Number(text);
  return Number.isFinite(n) ? n : text;
}

/** Creates or edits a delivery spec; every threshold is explained, and the server's field errors show next to it. */
export function SpecForm({ spec, mode }: { spec: SpecValues; mode: 'create' | 'edit' }) {
  const router = useRouter();
  const { fields, error, notice, busy, run } = useApiForm();

  async function onSubmit(event: React.FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = new FormData(event.currentTarget);
    const thresholds = Object.fromEntries(THRESHOLD_FIELDS.map((f) => [f.key, valueOf(f, form)]));
    const payload = { name: String(form.get('name') ?? ''), description: String(form.get('description') ?? ''), thresholds };
    await run(async () => {
      if (mode === 'create') {
        const created = await fetchJson<{ id: number }>('/api/specs', { method: 'POST', json: payload });
        router.push(`/specs/${created.id}?created=1`);
        return;
      }
      const saved = await fetchJson<{ rejudged: boolean; sessionCount: number }>(`/api/specs/${spec.id}`, { method: 'PATCH', json: payload });
      router.refresh();
      return (
        saved.rejudged && saved.sessionCount > 0
          ? `Saved. The takes of ${saved.sessionCount} session${saved.sessionCount === 1 ? '' : 's'} using this spec were judged again from their stored measurements.`
          : 'Saved.'
      );
    });
  }

  const errs = (key: string) => fields[key];
  const describedBy = (key: string) => [`${key}-explain`, errs(key) ? `${key}-error` : null].filter(Boolean).join(' ');
  return (
    <form onSubmit={onSubmit} noValidate aria-label={mode === 'create' ? 'New delivery spec' : 'Edit delivery spec'} className="grid gap-6">
      <p className="rounded-md border border-line bg-sunken p-3 text-sm">
        <strong>Note: </strong>
        {SPEC_PRECEDENCE_NOTE}
      </p>
      <div className="grid gap-4 sm:grid-cols-2">
        <div>
          <label htmlFor="name" className="tp-label">Name</label>
          <input id="name" name="name" className="tp-input" defaultValue={spec.name} maxLength={120} aria-invalid={!!errs('name')} aria-describedby={errs('name') ? 'name-error' : undefined} />
          <ErrorLines id="name-error" messages={errs('name')} />
        </div>
        <div>
          <label htmlFor="description" className="tp-label">Description</label>
          <textarea id="description" name="description" className="tp-input" rows={2} defaultValue={spec.description ?? ''} aria-invalid={!!errs('description')} />
          <ErrorLines id="description-error" messages={errs('description')} />
        </div>
      </div>
      <fieldset className="grid gap-4 md:grid-cols-2">
        <legend className="mb-2 text-lg font-semibold">Thresholds</legend>
        {THRESHOLD_FIELDS.map((f) => {
          const key = `thresholds.${f.key}`;
          const value = spec.thresholds[f.key];
          return (
            <div key={f.key} className="rounded-md border border-line p-3">
              {f.kind === 'boolean' ? (
                <label className="flex items-center gap-2 text-sm font-semibold">
                  <input type="checkbox" id={f.key} name={f.key} defaultChecked={value === true} aria-describedby={describedBy(key)} />
                  {f.label}
                </label>
              ) : (
                <>
                  <label htmlFor={f.key} className="tp-label">
                    {f.label} <span className="font-normal text-muted">({f.unit})</span>
                  </label>
                  {f.kind === 'bitDepth' ? (
                    <select id={f.key} name={f.key} className="tp-input" defaultValue={value == null ? '' : String(value)} aria-invalid={!!errs(key)} aria-describedby={describedBy(key)}>
                      <option value="">Any bit depth</option>
                      <option value="16">16 bits</option>
                      <option value="24">24 bits</option>
                      <option value="32">32 bits</option>
                    </select>
                  ) : (
                    <div className="flex items-center gap-2">
                      <input
                        id={f.key}
                        name={f.key}
                        type="number"
                        inputMode="decimal"
                        step={f.kind === 'number' ? f.step : 1}
                        className="tp-input"
                        defaultValue={value == null ? '' : String(value)}
                        placeholder={f.kind === 'rate' ? 'Any rate' : undefined}
                        aria-invalid={!!errs(key)}
                        aria-describedby={describedBy(key)}
                      />
                      <span className="shrink-0 text-sm text-muted" aria-hidden="true">{f.unit}</span>
                    </div>
                  )}
                </>
              )}
              <p id={`${key}-explain`} className="mt-1 text-xs text-muted">
                {f.explain} <span className="text-ink">Default: {f.source}</span>
              </p>
              <ErrorLines id={`${key}-error`} messages={errs(key)} />
            </div>
          );
        })}
      </fieldset>
      <FormMessage error={error} />
      <FormMessage notice={notice} />
      <div>
        <button type="submit" className="tp-button" disabled={busy}>
          {busy ? 'Saving…' : mode === 'create' ? 'Create spec' : 'Save changes'}
        </button>
      </div>
    </form>
  );
}

function ErrorLines({ id, messages }: { id: string; messages?: string[] }) {
  if (!messages?.length) return null;
  return (
    <div id={id}>
      {messages.map((m) => (
        <p key={m} className="tp-field-error">
          <span aria-hidden="true">✕ </span>
          {m}
        </p>
      ))}
    </div>
  );
}
