import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { BASE_URL, Client } from '../support/http';
import { caughtMail } from '../support/mail';
import { newPerson, newStudio, testDb, type Person } from '../support/people';

/**
 * A studio manager sends a person who forgot their password a single-use link to choose a new one
 * (OWASP Forgot Password Cheat Sheet: single use, expiring, only its hash stored, sessions ended
 * on use [common practice]). The current password keeps working until the link is used.
 */
let manager: Person;
let boss: Client;
beforeAll(async () => {
  const studioId = await newStudio('Password resets');
  manager = await newPerson(studioId, 'manager', 'reset-manager');
  boss = await signedInAs(manager);
});
afterAll(async () => {
  await testDb.end();
});

async function signedInAs(person: Person): Promise<Client> {
  const client = new Client();
  await client.signIn(person.email, person.password);
  expect(client.hasSession()).toBe(true);
  return client;
}

/** Tries a sign-in from an address of its own: the failed ones must not count against the address the other tests sign in from. */
async function canSignIn(email: string, password: string): Promise<boolean> {
  const client = new Client(BASE_URL, '127.0.0.9');
  await client.signIn(email, password);
  return client.hasSession();
}

const sendReset = (id: number) => boss.fetch(`/api/users/${id}/password-reset`, { method: 'POST' });
const accept = (token: string, password: string) => new Client().fetch('/api/invitations/accept', { method: 'POST', json: { token, password, confirm: password } });

/** The links of every reset e-mail to `email` so far, oldest first, once there are `count` of them. */
async function resetLinks(email: string, count: number): Promise<string[]> {
  for (let i = 0; i < 75; i++) {
    const links = (await caughtMail())
      .filter((m) => m.to.includes(email) && /new password/.test(m.mail.subject ?? ''))
      .map((m) => /\/invite\/([A-Za-z0-9_-]{43})\b/.exec(m.mail.text ?? '')?.[1] ?? '');
    if (links.length >= count) return links;
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error(`Fewer than ${count} reset e-mails reached ${email}`);
}

describe('a password reset link from the studio manager', () => {
  it('keeps the old password until the link is used, then ends every session and signs in only with the new one', async () => {
    const person = await newPerson(manager.studioId, 'engineer', 'forgetful');
    const laptop = await signedInAs(person);

    const response = await sendReset(person.id);
    expect(response.status).toBe(202);
    expect((await response.json()).delivery).toMatchObject({ status: 'sent', kind: 'password_reset', recipients: [person.email] });
    const [token] = await resetLinks(person.email, 1);
    const [row] = await testDb.query("SELECT tokenHash, purpose FROM invitations WHERE userId = ? AND usedAt IS NULL", [person.id]);
    expect(row).toEqual({ tokenHash: expect.stringMatching(/^[0-9a-f]{64}$/), purpose: 'reset' });
    expect(row.tokenHash).not.toContain(token);

    // Nothing changes until the link is used.
    expect(await canSignIn(person.email, person.password)).toBe(true);
    expect((await laptop.fetch('/api/sessions')).status).toBe(200);
    const page = await (await new Client().fetch(`/invite/${token}`)).text();
    expect(page).toContain('Choose a new password');
    expect(page).toContain('Save the new password');

    const used = await accept(token, 'tape-op-new-password');
    expect(used.status).toBe(200);
    expect(await used.json()).toEqual({ email: person.email, purpose: 'reset' });
    expect((await laptop.fetch('/api/sessions')).status).toBe(401);
    expect(await canSignIn(person.email, person.password)).toBe(false);
    expect(await canSignIn(person.email, 'tape-op-new-password')).toBe(true);

    // Single use.
    const again = await accept(token, 'yet-another-password');
    expect(again.status).toBe(400);
    expect((await again.json()).message).toBe('This password reset link has already been used. Sign in with the password you chose.');
    expect(await canSignIn(person.email, 'yet-another-password')).toBe(false);

    const actions = await testDb.query('SELECT action, actorId FROM audit_events WHERE subjectType = ? AND subjectId = ? ORDER BY id', ['user', person.id]);
    expect(actions).toEqual([
      { action: 'user.password_reset_send', actorId: manager.id },
      { action: 'account.password_reset', actorId: person.id },
    ]);
  });

  it('replaces an earlier link with a newer one, and a deactivation ends both the link and the sending', async () => {
    const person = await newPerson(manager.studioId, 'producer', 'twice-reset');
    expect((await sendReset(person.id)).status).toBe(202);
    expect((await sendReset(person.id)).status).toBe(202);
    const [first, second] = await resetLinks(person.email, 2);
    expect(first).not.toBe(second);
    expect((await accept(first, 'older-link-password')).status).toBe(400);

    const off = await boss.fetch(`/api/users/${person.id}`, { method: 'PATCH', json: { active: false } });
    expect(off.status).toBe(200);
    const afterDeactivation = await accept(second, 'newer-link-password');
    expect(afterDeactivation.status).toBe(400);
    expect(await canSignIn(person.email, 'newer-link-password')).toBe(false);
    const refused = await sendReset(person.id);
    expect(refused.status).toBe(409);
    expect((await refused.json()).error).toBe('conflict:not_active');
  });

  it('stops working once the person changes the password themselves', async () => {
    const person = await newPerson(manager.studioId, 'engineer', 'remembered');
    expect((await sendReset(person.id)).status).toBe(202);
    const [token] = await resetLinks(person.email, 1);
    const session = await signedInAs(person);
    const changed = await session.fetch('/api/account/password', { method: 'POST', json: { current: person.password, password: 'remembered-after-all', confirm: 'remembered-after-all' } });
    expect(changed.status).toBe(200);
    expect((await accept(token, 'link-from-before-change')).status).toBe(400);
    expect(await canSignIn(person.email, 'remembered-after-all')).toBe(true);
  });
});
