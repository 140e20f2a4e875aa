'use client';

import { useSWRConfig } from 'swr';
import type { ConverterThresholds } from '@/dsp/converter/thresholds';
import { THRESHOLD_FIELDS } from '@/lib/converterChecks/fields';
import { fetchJson } from '@/lib/http/fetcher';
import { recorderChecksKey } from '@/lib/http/swrKeys';
import { FormField } from '../FormField';
import { FormMessage } from '../FormMessage';
import { useApiForm } from '../useApiForm';

/** The converter-check thresholds of a recorder's model, for a studio manager; saving judges the model's checks again. */
export function ThresholdsForm({ recorderId, makeModel, thresholds, isDefault }: { recorderId: number; makeModel: string | null; thresholds: ConverterThresholds; isDefault: boolean }) {
  const { mutate } = useSWRConfig();
  const { fields, error, notice, busy, run } = useApiForm();

  function onSubmit(event: React.FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = new FormData(event.currentTarget);
    const next = Object.fromEntries(THRESHOLD_FIELDS.map((f) => [f.key, Number(form.get(f.key))]));
    void run(async () => {
      await fetchJson(`/api/recorders/${recorderId}/converter-thresholds`, { method: 'PUT', json: { thresholds: next } });
      await mutate(recorderChecksKey(recorderId));
      return 'Saved. The checks of every recorder of this model were judged again.';
    });
  }

  if (!makeModel) return <p className="text-sm text-muted">Thresholds are kept per recorder model: give this recorder its make and model to set its own.</p>;
  const group = (g: 'limit' | 'drift') =>
    THRESHOLD_FIELDS.filter((f) => f.group === g).map((f) => (
      <FormField key={f.key} id={`t-${f.key}`} label={`${f.label} (${f.unit})`} errors={fields[`thresholds.${f.key}`]}>
        <input id={`t-${f.key}`} name={f.key} type="number" step="any" className="tp-input font-mono" defaultValue={thresholds[f.key]} aria-invalid={!!fields[`thresholds.${f.key}`]} />
      </FormField>
    ));
  return (
    <form onSubmit={onSubmit} noValidate aria-label="Converter-check thresholds" className="grid gap-4">
      <p className="text-sm text-muted">
        For every <strong>{makeModel}</strong> of the studio. {isDefault ? 'Now Takeproof’s starting values (common practice, not a standard).' : 'Set by the studio.'} The studio’s own
        specifications take precedence over these defaults.
      </p>
      <fieldset className="grid gap-3 sm:grid-cols-2">
        <legend className="mb-2 font-semibold">Limits</legend>
        {group('limit')}
      </fieldset>
      <fieldset className="grid gap-3 sm:grid-cols-2">
        <legend className="mb-2 font-semibold">Drift from the baseline</legend>
        {group('drift')}
      </fieldset>
      <FormMessage error={error} />
      <FormMessage notice={notice} />
      <div>
        <button type="submit" className="tp-button" disabled={busy}>
          {busy ? 'Saving…' : 'Save thresholds'}
        </button>
      </div>
    </form>
  );
}
