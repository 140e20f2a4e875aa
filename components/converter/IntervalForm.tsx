'use client';

import { useRouter } from 'next/navigation';
import { fetchJson } from '@/lib/http/fetcher';
import { FormField } from '../FormField';
import { FormMessage } from '../FormMessage';
import { useApiForm } from '../useApiForm';

/** How many days may pass between a recorder's converter checks before the fleet raises "overdue". */
export function IntervalForm({ days }: { days: number }) {
  const router = useRouter();
  const { fields, error, notice, busy, run } = useApiForm();
  function onSubmit(event: React.FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const value = Number(new FormData(event.currentTarget).get('converterCheckIntervalDays'));
    void run(async () => {
      await fetchJson('/api/fleet/settings', { method: 'PATCH', json: { converterCheckIntervalDays: value } });
      router.refresh();
      return 'Saved.';
    });
  }
  return (
    <form onSubmit={onSubmit} noValidate aria-label="Converter-check interval" className="flex flex-wrap items-end gap-3">
      <FormField id="converterCheckIntervalDays" label="Converter check due every (days)" errors={fields.converterCheckIntervalDays}>
        <input id="converterCheckIntervalDays" name="converterCheckIntervalDays" type="number" min={7} max={730} step={1} className="tp-input w-28 font-mono" defaultValue={days} />
      </FormField>
      <button type="submit" className="tp-button-quiet" disabled={busy}>
        {busy ? 'Saving…' : 'Save'}
      </button>
      <FormMessage error={error} notice={notice} inline />
    </form>
  );
}
