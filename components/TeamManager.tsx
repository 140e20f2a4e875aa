'use client';

import { useState } from 'react';
import useSWR from 'swr';
import { ApiError, fetchJson, swrFetcher } from '@/lib/http/fetcher';
import { FormField } from './FormField';
import { FormMessage } from '@/components/FormMessage';
import { useApiForm } from './useApiForm';
import type { TeamMember } from '@/lib/team/views';
import type { DeliveryView } from '@/lib/mail/views';
import { ROLE_LABEL } from '@/lib/auth/policy';
import type { Role } from '@/models/User';
import { formatDateTime } from '@/lib/format';
import { TONE_CLASS } from './StatusMarks';
import { MEMBER_STATUS } from '@/lib/status';

const KEY = '/api/users';

function Notice({ notice }: { notice: { ok: boolean; text: string } | null }) {
  return <FormMessage error={notice && !notice.ok ? notice.text : null} notice={notice?.ok ? notice.text : null} testId="team-notice" className="mb-3 font-semibold" />;
}

function InviteForm({ onDone }: { onDone: (text: string, ok: boolean) => Promise<void> }) {
  const { fields, error, busy, run } = useApiForm();

  async function onSubmit(event: React.FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const formElement = event.currentTarget;
    const form = Object.fromEntries(new FormData(formElement)) as Record<string, string>;
    await run(async () => {
      const { member, delivery } = await fetchJson<{ member: TeamMember; delivery: DeliveryView }>(KEY, { method: 'POST', json: form });
      formElement.reset();
      await onDone(
        delivery.status === 'sent' ? `Invitation sent to ${member.email}.` : `${member.name} was added, but the invitation e-mail was not sent: ${delivery.error} Use “Resend invitation” to try again.`,
        delivery.status === 'sent',
      );
    });
  }

  return (
    <form onSubmit={onSubmit} noValidate aria-label="Invite a person" className="grid gap-4">
      <FormField id="invite-name" label="Name" errors={fields.name}>
        <input id="invite-name" name="name" className="tp-input" maxLength={160} autoComplete="off" aria-invalid={!!fields.name} />
      </FormField>
      <FormField id="invite-email" label="E-mail" errors={fields.email}>
        <input id="invite-email" name="email" type="email" className="tp-input" maxLength={254} autoComplete="off" aria-invalid={!!fields.email} />
      </FormField>
      <FormField id="invite-role" label="Role" errors={fields.role}>
        <select id="invite-role" name="role" className="tp-input" defaultValue="engineer">
          {Object.entries(ROLE_LABEL).map(([value, label]) => (
            <option key={value} value={value}>
              {label}
            </option>
          ))}
        </select>
      </FormField>
      <FormMessage error={error} />
      <div>
        <button type="submit" className="tp-button" disabled={busy}>
          {busy ? 'Sending…' : 'Send invitation'}
        </button>
      </div>
    </form>
  );
}

/** A member's role: choose, then apply (arrow keys through the list change nothing yet). */
function RoleChooser({ member, onApply }: { member: TeamMember; onApply: (role: Role) => Promise<boolean> }) {
  const [draft, setDraft] = useState<Role>(member.role);
  const [saved, setSaved] = useState<Role>(member.role);
  // A refused change (or one made elsewhere) shows the stored role again.
  if (saved !== member.role) {
    setSaved(member.role);
    setDraft(member.role);
  }
  return (
    <div className="flex flex-wrap items-center gap-2">
      <label className="sr-only" htmlFor={`role-${member.id}`}>
        Role of {member.name}
      </label>
      <select id={`role-${member.id}`} className="tp-input w-40" value={draft} onChange={(e) => setDraft(e.target.value as Role)}>
        {Object.entries(ROLE_LABEL).map(([value, label]) => (
          <option key={value} value={value}>
            {label}
          </option>
        ))}
      </select>
      {draft !== member.role && (
        <button
          type="button"
          className="tp-button-quiet"
          onClick={async () => {
            if (!(await onApply(draft))) setDraft(member.role);
          }}
        >
          Apply<span className="sr-only"> role for {member.name}</span>
        </button>
      )}
    </div>
  );
}

/** The studio's people: role changes, deactivation, invitations. */
export function TeamManager({ initial, selfId }: { initial: TeamMember[]; selfId: number }) {
  const { data, mutate } = useSWR<{ users: TeamMember[] }, ApiError>(KEY, swrFetcher, { fallbackData: { users: initial } });
  const [notice, setNotice] = useState<{ ok: boolean; text: string } | null>(null);
  const [busy, setBusy] = useState<number | null>(null);
  const [confirming, setConfirming] = useState<number | null>(null);
  const users = data?.users ?? initial;

  /** Runs one change of a row; resolves whether it was made. */
  async function act(id: number, run: () => Promise<string>): Promise<boolean> {
    // A busy row ignores clicks instead of disabling the control that has the focus.
    if (busy !== null) return false;
    setBusy(id);
    setNotice(null);
    try {
      setNotice({ ok: true, text: await run() });
      return true;
    } catch (e) {
      setNotice({ ok: false, text: (e as ApiError).message });
      return false;
    } finally {
      setBusy(null);
      await mutate();
    }
  }

  const patch = (u: TeamMember, body: Record<string, unknown>, done: string) =>
    act(u.id, async () => {
      await fetchJson(`/api/users/${u.id}`, { method: 'PATCH', json: body });
      return done;
    });

  /** E-mails a person a fresh link: the invitation again, or a password reset. */
  const sendLink = (u: TeamMember, path: 'invitation' | 'password-reset', what: string, done: string) =>
    act(u.id, async () => {
      const { delivery } = await fetchJson<{ delivery: DeliveryView }>(`/api/users/${u.id}/${path}`, { method: 'POST' });
      if (delivery.status !== 'sent') throw new ApiError(502, 'internal:mail', `The ${what} was not sent: ${delivery.error}`);
      return done;
    });
  const resend = (u: TeamMember) => sendLink(u, 'invitation', 'invitation', `A new invitation link was sent to ${u.email}.`);
  const sendReset = (u: TeamMember) =>
    sendLink(u, 'password-reset', 'password reset link', `A link to choose a new password was sent to ${u.email}. Their current password works until they use it.`);

  return (
    <div className="grid gap-6 lg:grid-cols-[1fr_20rem]">
      <section aria-labelledby="people" className="tp-card">
        <h2 id="people" className="border-b border-line p-4 text-lg font-semibold">
          People
        </h2>
        <div className="p-4 pb-0">
          <Notice notice={notice} />
        </div>
        <div className="overflow-x-auto">
          <table className="w-full text-left text-sm">
            <thead className="bg-sunken text-muted">
              <tr>
                <th scope="col" className="px-4 py-2 font-semibold">Name</th>
                <th scope="col" className="px-4 py-2 font-semibold">E-mail</th>
                <th scope="col" className="px-4 py-2 font-semibold">Role</th>
                <th scope="col" className="px-4 py-2 font-semibold">Status</th>
                <th scope="col" className="px-4 py-2 font-semibold">Actions</th>
              </tr>
            </thead>
            <tbody>
              {users.map((u) => {
                const s = MEMBER_STATUS[u.status];
                return (
                  <tr key={u.id} className="border-t border-line align-top">
                    <td className="px-4 py-2 font-semibold">
                      {u.name}
                      {u.id === selfId && <span className="ml-1 font-normal text-muted">(you)</span>}
                    </td>
                    <td className="break-all px-4 py-2">{u.email}</td>
                    <td className="px-4 py-2">
                      <RoleChooser member={u} onApply={(role) => patch(u, { role }, `${u.name} is now ${ROLE_LABEL[role].toLowerCase()}.`)} />
                    </td>
                    <td className={`px-4 py-2 font-semibold ${TONE_CLASS[s.tone]}`}>
                      <span aria-hidden="true">{s.mark} </span>
                      {s.word}
                      {u.status === 'invited' && u.invitationExpiresAt && (
                        <span className="block text-xs font-normal text-muted">
                          {!u.invitationExpired ? `link valid until ${formatDateTime(u.invitationExpiresAt)}` : 'link expired'}
                        </span>
                      )}
                      {u.status === 'invited' && u.lastInvitation?.status === 'failed' && (
                        <span className="block text-xs font-normal text-fail">✕ E-mail not sent: {u.lastInvitation.error}</span>
                      )}
                    </td>
                    <td className="px-4 py-2">
                      <div className="flex flex-wrap gap-2">
                        {u.status === 'invited' && (
                          <button type="button" className="tp-button-quiet" aria-disabled={busy === u.id} onClick={() => resend(u)}>
                            Resend invitation<span className="sr-only"> to {u.name}</span>
                          </button>
                        )}
                        {u.status === 'active' && u.id !== selfId && u.id !== confirming && (
                          <button type="button" className="tp-button-quiet" aria-disabled={busy === u.id} onClick={() => sendReset(u)}>
                            Send reset link<span className="sr-only"> to {u.name}</span>
                          </button>
                        )}
                        {u.status === 'active' && u.id !== confirming && (
                          <button type="button" className="tp-button-quiet" aria-disabled={busy === u.id} onClick={() => setConfirming(u.id)}>
                            Deactivate<span className="sr-only"> {u.name}</span>
                          </button>
                        )}
                        {u.status === 'active' && u.id === confirming && (
                          <span role="group" aria-label={`Deactivate ${u.name}?`} className="flex flex-wrap items-center gap-2">
                            <span>{u.name} will no longer be able to sign in.</span>
                            <button
                              type="button"
                              className="tp-button-quiet text-fail"
                              autoFocus
                              onClick={() => {
                                setConfirming(null);
                                void patch(u, { active: false }, `${u.name} can no longer sign in.`);
                              }}
                            >
                              Yes, deactivate
                            </button>
                            <button type="button" className="tp-button-quiet" onClick={() => setConfirming(null)}>
                              Keep active
                            </button>
                          </span>
                        )}
                        {u.status === 'deactivated' && (
                          <button type="button" className="tp-button-quiet" aria-disabled={busy === u.id} onClick={() => patch(u, { active: true }, `${u.name} can sign in again.`)}>
                            Reactivate<span className="sr-only"> {u.name}</span>
                          </button>
                        )}
                      </div>
                    </td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        </div>
      </section>
      <section aria-labelledby="invite" className="tp-card p-4">
        <h2 id="invite" className="mb-3 text-lg font-semibold">
          Invite a person
        </h2>
        <InviteForm
          onDone={async (text, ok) => {
            setNotice({ ok, text });
            await mutate();
          }}
        />
      </section>
    </div>
  );
}
