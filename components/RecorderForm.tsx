'use client';

import { useRouter } from 'next/navigation';
import { fetchJson } from '@/lib/http/fetcher';
import { BEXT_MATCH_HELP } from '@/lib/recorders/schema';
import { FormField } from './FormField';
import { useApiForm } from './useApiForm';
import { FormMessage } from '@/components/FormMessage';
import type { RecorderView } from '@/lib/recorders/views';

/** A recorder's editable fields; `id` and `active` only once it exists. */
type RecorderValues = Pick<RecorderView, 'label' | 'makeModel' | 'serial' | 'location' | 'notes' | 'bextMatch'> & Partial<Pick<RecorderView, 'id' | 'active'>>;

const EMPTY: RecorderValues = { label: '', makeModel: null, serial: null, location: null, notes: null, bextMatch: null };

/** Adds a recorder to the fleet or edits one; retiring and reinstating are on the edit form. */
export function RecorderForm({ recorder = EMPTY, mode }: { recorder?: RecorderValues; mode: 'create' | 'edit' }) {
  const router = useRouter();
  const { fields, error, notice, busy, run } = useApiForm();

  function send(payload: Record<string, unknown>, done: string) {
    return run(async () => {
      if (mode === 'create') {
        const created = await fetchJson<{ id: number }>('/api/recorders', { method: 'POST', json: payload });
        router.push(`/recorders/${created.id}?created=1`);
        return;
      }
      await fetchJson(`/api/recorders/${recorder.id}`, { method: 'PATCH', json: payload });
      router.refresh();
      return done;
    });
  }

  function onSubmit(event: React.FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = Object.fromEntries(new FormData(event.currentTarget)) as Record<string, string>;
    void send(
      { label: form.label ?? '', makeModel: form.makeModel, serial: form.serial, location: form.location, notes: form.notes, bextMatch: form.bextMatch },
      'Saved.',
    );
  }

  const err = (name: string) => fields[name];
  const p = mode === 'create' ? 'new-' : '';
  return (
    <form onSubmit={onSubmit} noValidate aria-label={mode === 'create' ? 'New recorder' : 'Edit recorder'} className="grid gap-4 sm:grid-cols-2">
      <FormField id={`${p}label`} label="Label" errors={err('label')}>
        <input id={`${p}label`} name="label" className="tp-input" defaultValue={recorder.label} maxLength={120} placeholder="e.g. Booth A interface" aria-invalid={!!err('label')} />
      </FormField>
      <FormField id={`${p}makeModel`} label="Make and model" errors={err('makeModel')}>
        <input id={`${p}makeModel`} name="makeModel" className="tp-input" defaultValue={recorder.makeModel ?? ''} maxLength={160} />
      </FormField>
      <FormField id={`${p}serial`} label="Serial number" errors={err('serial')}>
        <input id={`${p}serial`} name="serial" className="tp-input" defaultValue={recorder.serial ?? ''} maxLength={120} />
      </FormField>
      <FormField id={`${p}location`} label="Location" errors={err('location')}>
        <input id={`${p}location`} name="location" className="tp-input" defaultValue={recorder.location ?? ''} maxLength={160} />
      </FormField>
      <div className="sm:col-span-2">
        <FormField id={`${p}bextMatch`} label="Originator match text" hint={BEXT_MATCH_HELP} errors={err('bextMatch')}>
          <input
            id={`${p}bextMatch`}
            name="bextMatch"
            className="tp-input font-mono"
            defaultValue={recorder.bextMatch ?? ''}
            maxLength={160}
            placeholder="e.g. HALDEN-A2"
            aria-invalid={!!err('bextMatch')}
            aria-describedby={err('bextMatch') ? `${p}bextMatch-error` : `${p}bextMatch-hint`}
          />
        </FormField>
        {err('bextMatch') && <p className="mt-1 text-xs text-muted">{BEXT_MATCH_HELP}</p>}
      </div>
      <div className="sm:col-span-2">
        <FormField id={`${p}notes`} label="Notes" errors={err('notes')}>
          <textarea id={`${p}notes`} name="notes" className="tp-input" rows={2} defaultValue={recorder.notes ?? ''} />
        </FormField>
      </div>
      <FormMessage error={error} className="sm:col-span-2" />
      <FormMessage notice={notice} className="sm:col-span-2" />
      <div className="flex flex-wrap gap-3 sm:col-span-2">
        <button type="submit" className="tp-button" disabled={busy}>
          {busy ? 'Saving…' : mode === 'create' ? 'Add recorder' : 'Save changes'}
        </button>
        {mode === 'edit' && (
          <button
            type="button"
            className="tp-button-quiet"
            disabled={busy}
            onClick={() =>
              send(
                { active: !recorder.active },
                recorder.active ? 'Retired. Its takes and statistics stay; new takes are no longer assigned to it.' : 'Back in service.',
              )
            }
          >
            {recorder.active ? 'Retire recorder' : 'Put back in service'}
          </button>
        )}
      </div>
    </form>
  );
}
