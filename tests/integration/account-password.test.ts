import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { BASE_URL, Client } from '../support/http';
import { newPerson, newStudio, testDb, type Person } from '../support/people';

/**
 * A person changes their own password: the current one is checked like a sign-in and counted
 * against the same limits (OWASP Authentication Cheat Sheet, "require the current password" and
 * throttling [common practice]); every session of theirs ends; only the new password signs in.
 */
let studioId: number;
beforeAll(async () => {
  studioId = await newStudio('Password change');
});
afterAll(async () => {
  await testDb.end();
});

const change = (client: Client, body: unknown) => client.fetch('/api/account/password', { method: 'POST', json: body });

async function signedInAs(person: Person, address?: string): Promise<Client> {
  const client = new Client(BASE_URL, address);
  await client.signIn(person.email, person.password);
  expect(client.hasSession()).toBe(true);
  return client;
}

describe('changing one’s own password', () => {
  it('ends every session of the person, refuses the old password and signs in with the new one', async () => {
    const person = await newPerson(studioId, 'producer', 'changer');
    const laptop = await signedInAs(person);
    const phone = await signedInAs(person);
    const next = 'a-brand-new-passphrase';

    const response = await change(laptop, { current: person.password, password: next, confirm: next });
    expect(response.status).toBe(200);
    expect(await response.json()).toEqual({ signedOut: true });
    expect((await laptop.fetch('/api/sessions')).status).toBe(401);
    expect((await phone.fetch('/api/sessions')).status).toBe(401);

    const withOld = new Client(BASE_URL, '127.0.0.8');
    await withOld.signIn(person.email, person.password);
    expect(withOld.hasSession()).toBe(false);
    const withNew = await signedInAs({ ...person, password: next });
    expect((await withNew.fetch('/api/sessions')).status).toBe(200);

    const [event] = await testDb.query("SELECT actorId, subjectId FROM audit_events WHERE action = 'account.password_change' AND actorId = ?", [person.id]);
    expect(event).toEqual({ actorId: person.id, subjectId: person.id });
  });

  it('refuses a wrong current password by name, keeps the session, and counts it as a failed sign-in', async () => {
    const person = await newPerson(studioId, 'engineer', 'guesser');
    // An address no other test file uses: the failures below count against it.
    const session = await signedInAs(person, '127.0.0.8');
    const wrong = await change(session, { current: 'not-my-password', password: 'another-long-password', confirm: 'another-long-password' });
    expect(wrong.status).toBe(400);
    expect((await wrong.json()).fields).toEqual({ current: ['That is not your current password.'] });
    expect((await session.fetch('/api/sessions')).status).toBe(200);
    const failures = await testDb.query('SELECT address FROM sign_in_failures WHERE email = ?', [person.email]);
    expect(failures.map((r: { address: string }) => r.address)).toEqual(['127.0.0.8']);

    // Four more wrong guesses use up the account's allowance at this address: even the right password now waits.
    for (let i = 0; i < 4; i++) expect((await change(session, { current: `guess-${i}`, password: 'another-long-password', confirm: 'another-long-password' })).status).toBe(400);
    const limited = await change(session, { current: person.password, password: 'another-long-password', confirm: 'another-long-password' });
    expect(limited.status).toBe(429);
    expect(Number(limited.headers.get('retry-after'))).toBeGreaterThan(0);
  });

  it('names each field that needs attention and changes nothing', async () => {
    const person = await newPerson(studioId, 'manager', 'careless');
    const session = await signedInAs(person);
    const cases: [unknown, string, RegExp][] = [
      [{ current: person.password, password: 'short', confirm: 'short' }, 'password', /at least 10 characters/],
      [{ current: person.password, password: 'long-enough-one', confirm: 'long-enough-two' }, 'confirm', /not the same/],
      [{ current: person.password, password: person.password, confirm: person.password }, 'password', /other than the current one/],
      [{ password: 'long-enough-one', confirm: 'long-enough-one' }, 'current', /current password/],
    ];
    for (const [body, field, message] of cases) {
      const response = await change(session, body);
      expect(response.status).toBe(400);
      expect((await response.json()).fields[field].join(' ')).toMatch(message);
    }
    expect((await session.fetch('/api/sessions')).status).toBe(200);
    const again = new Client();
    await again.signIn(person.email, person.password);
    expect(again.hasSession()).toBe(true);
  });
});
