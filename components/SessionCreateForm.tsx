'use client';

import { useRouter } from 'next/navigation';
import { useSWRConfig } from 'swr';
import { fetchJson } from '@/lib/http/fetcher';
import { FormField } from './FormField';
import { useApiForm } from './useApiForm';
import { FormMessage } from '@/components/FormMessage';

export interface Option {
  id: number;
  name: string;
}

/** Starts a new recording session; the server validates and answers with field errors when needed. */
export function SessionCreateForm({ specs, producers }: { specs: Option[]; producers: Option[] }) {
  const router = useRouter();
  const { mutate } = useSWRConfig();
  const { fields, error, busy, run } = useApiForm();

  async function onSubmit(event: React.FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = Object.fromEntries(new FormData(event.currentTarget)) as Record<string, string>;
    const payload = {
      title: form.title,
      client: form.client,
      recordedOn: form.recordedOn,
      room: form.room,
      producerId: form.producerId ? Number(form.producerId) : null,
      deliverySpecId: form.deliverySpecId ? Number(form.deliverySpecId) : null,
    };
    await run(async () => {
      const session = await fetchJson<{ id: number }>('/api/sessions', { method: 'POST', json: payload });
      await mutate((key) => typeof key === 'string' && key.startsWith('/api/sessions'));
      router.push(`/sessions/${session.id}`);
    });
  }

  const err = (name: string) => fields[name];
  return (
    <form onSubmit={onSubmit} className="grid gap-4 sm:grid-cols-2" noValidate aria-label="New session">
      <div className="sm:col-span-2">
        <FormField id="title" label="Title" errors={err('title')}>
          <input id="title" name="title" className="tp-input" required maxLength={200} placeholder="e.g. Harbour Lights, episode 12" aria-invalid={!!err('title')} />
        </FormField>
      </div>
      <FormField id="client" label="Show or client" errors={err('client')}>
        <input id="client" name="client" className="tp-input" maxLength={200} />
      </FormField>
      <FormField id="recordedOn" label="Recorded on" errors={err('recordedOn')}>
        <input id="recordedOn" name="recordedOn" type="date" className="tp-input" />
      </FormField>
      <FormField id="room" label="Room" errors={err('room')}>
        <input id="room" name="room" className="tp-input" maxLength={120} />
      </FormField>
      <FormField id="producerId" label="Producer" errors={err('producerId')}>
        <select id="producerId" name="producerId" className="tp-input" defaultValue="">
          <option value="">Not assigned</option>
          {producers.map((p) => (
            <option key={p.id} value={p.id}>
              {p.name}
            </option>
          ))}
        </select>
      </FormField>
      <div className="sm:col-span-2">
        <FormField id="deliverySpecId" label="Delivery spec" hint="Takes are judged against this spec. Your broadcaster's own delivery rules come first." errors={err('deliverySpecId')}>
          <select id="deliverySpecId" name="deliverySpecId" className="tp-input" defaultValue={specs[0]?.id ?? ''}>
            <option value="">Takeproof defaults</option>
            {specs.map((s) => (
              <option key={s.id} value={s.id}>
                {s.name}
              </option>
            ))}
          </select>
        </FormField>
      </div>
      <FormMessage error={error} className="sm:col-span-2" />
      <div className="sm:col-span-2">
        <button type="submit" className="tp-button" disabled={busy}>
          {busy ? 'Creating…' : 'Create session'}
        </button>
      </div>
    </form>
  );
}
