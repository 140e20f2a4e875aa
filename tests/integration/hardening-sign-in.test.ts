import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { BASE_URL, Client } from '../support/http';
import { newPerson, newStudio, testDb, type Person } from '../support/people';

/**
 * Sign-in limits that cannot be turned against users or bypassed, and sessions that end.
 * Each client below connects from a loopback address of its own (127.0.0.x), as people on other
 * machines would. Limits checked: five wrong passwords per account per address, thirty per
 * address, per quarter hour (project defaults; OWASP Authentication Cheat Sheet [common practice]).
 */
let studioId: number;
beforeAll(async () => {
  studioId = await newStudio('Sign-in limits');
});
afterAll(async () => {
  await testDb.end();
});

const from = (address: string) => new Client(BASE_URL, address);
let probe = 0;
const spoofed = () => ({ 'x-forwarded-for': `198.51.100.${(probe++ % 250) + 1}` });

/** Signs in through the form, optionally with extra headers (a forged X-Forwarded-For). */
async function signIn(client: Client, email: string, password: string, headers: Record<string, string> = {}): Promise<number> {
  const { csrfToken } = await (await client.fetch('/api/auth/csrf')).json();
  const response = await client.fetch('/api/auth/callback/credentials', {
    method: 'POST',
    headers: { 'content-type': 'application/x-www-form-urlencoded', ...headers },
    body: new URLSearchParams({ csrfToken, email, password, json: 'true' }).toString(),
  });
  await response.arrayBuffer();
  return response.status;
}

describe('failed sign-in limits keyed on the client’s own address', () => {
  let victim: Person;
  beforeAll(async () => {
    victim = await newPerson(studioId, 'producer', 'victim');
  });

  it('locks one address out after thirty wrong passwords whatever X-Forwarded-For says, while the owner signs in from another address', async () => {
    const attacker = from('127.0.0.2');
    // Five wrong passwords on the account: that account is refused at this address only.
    for (let i = 0; i < 5; i++) expect(await signIn(attacker, victim.email, `wrong-${i}`, spoofed())).toBe(401);
    expect(await signIn(attacker, victim.email, victim.password, spoofed())).toBe(429);
    const owner = from('127.0.0.3');
    expect(await signIn(owner, victim.email, victim.password)).toBe(200);
    expect(owner.hasSession()).toBe(true);

    // Twenty-five more, on other accounts, each with a made-up forwarding header: the address is used up.
    for (let i = 0; i < 25; i++) expect(await signIn(attacker, `nobody-${i}-${Date.now()}@demo.test`, 'guess', spoofed())).toBe(401);
    const refused = await signIn(attacker, `someone-else-${Date.now()}@demo.test`, 'guess', spoofed());
    expect(refused).toBe(429);
    // Every other address still signs in, the owner too.
    expect(await signIn(from('127.0.0.3'), victim.email, victim.password)).toBe(200);
  });

  it('never clears an account’s failures on a sign-in without its CSRF token, nor on another address’s success', async () => {
    const person = await newPerson(studioId, 'engineer', 'csrfless');
    const guesser = from('127.0.0.4');
    for (let i = 0; i < 4; i++) expect(await signIn(guesser, person.email, `wrong-${i}`, spoofed())).toBe(401);
    // A POST without the CSRF token checks no password: next-auth redirects it, and nothing is reset.
    const csrfless = await guesser.fetch('/api/auth/callback/credentials', {
      method: 'POST',
      headers: { 'content-type': 'application/x-www-form-urlencoded' },
      body: new URLSearchParams({ email: person.email, password: person.password }).toString(),
    });
    expect(csrfless.status).toBe(302);
    expect(csrfless.headers.get('location')).toMatch(/csrf=true/);
    // The owner signs in elsewhere: that clears nothing at the guesser's address.
    expect(await signIn(from('127.0.0.5'), person.email, person.password)).toBe(200);
    expect(await signIn(guesser, person.email, 'wrong-4', spoofed())).toBe(401);
    expect(await signIn(guesser, person.email, person.password, spoofed())).toBe(429);
  });

  it('keeps the counts in the database, where every web instance reads them', async () => {
    const person = await newPerson(studioId, 'engineer', 'stored');
    expect(await signIn(from('127.0.0.6'), person.email, 'wrong', spoofed())).toBe(401);
    const rows = await testDb.query('SELECT address FROM sign_in_failures WHERE email = ?', [person.email]);
    expect(rows.map((r: { address: string }) => r.address)).toEqual(['127.0.0.6']);
  });
});

describe('sessions that end', () => {
  it('refuses the cookie of a signed-out session, and of every other session of that person, with 401', async () => {
    const person = await newPerson(studioId, 'engineer', 'signout');
    const laptop = new Client();
    const phone = new Client();
    expect(await signIn(laptop, person.email, person.password)).toBe(200);
    expect(await signIn(phone, person.email, person.password)).toBe(200);
    const oldCookie = laptop.cookieHeader();
    expect((await laptop.fetch('/api/sessions')).status).toBe(200);

    const { csrfToken } = await (await laptop.fetch('/api/auth/csrf')).json();
    const out = await laptop.fetch('/api/auth/signout', {
      method: 'POST',
      headers: { 'content-type': 'application/x-www-form-urlencoded' },
      body: new URLSearchParams({ csrfToken, json: 'true' }).toString(),
    });
    expect(out.status).toBe(200);
    const replayed = await fetch(`${BASE_URL}/api/sessions`, { headers: { cookie: oldCookie } });
    expect(replayed.status).toBe(401);
    const write = await fetch(`${BASE_URL}/api/sessions`, {
      method: 'POST',
      headers: { cookie: oldCookie, origin: new URL(BASE_URL).origin, 'content-type': 'application/json' },
      body: JSON.stringify({ title: 'Written after sign-out' }),
    });
    expect(write.status).toBe(401);
    expect((await phone.fetch('/api/sessions')).status).toBe(401);
    // Signing in again works.
    expect(await signIn(laptop, person.email, person.password)).toBe(200);
    expect((await laptop.fetch('/api/sessions')).status).toBe(200);
  });

  it('does not bring back a cookie issued before a deactivation when the person is reactivated', async () => {
    const manager = await newPerson(studioId, 'manager', 'reactivating-manager');
    const person = await newPerson(studioId, 'producer', 'reactivated');
    const boss = new Client();
    expect(await signIn(boss, manager.email, manager.password)).toBe(200);
    const before = new Client();
    expect(await signIn(before, person.email, person.password)).toBe(200);
    const patch = (active: boolean) => boss.fetch(`/api/users/${person.id}`, { method: 'PATCH', json: { active } });
    expect((await patch(false)).status).toBe(200);
    expect((await patch(true)).status).toBe(200);
    expect((await before.fetch('/api/sessions')).status).toBe(401);
    const after = new Client();
    expect(await signIn(after, person.email, person.password)).toBe(200);
    expect((await after.fetch('/api/sessions')).status).toBe(200);
  });
});

describe('sign-in answers', () => {
  it('answers a GET of the password sign-in with 405 and Allow: POST, not a server error', async () => {
    const response = await new Client().fetch('/api/auth/callback/credentials');
    expect(response.status).toBe(405);
    expect(response.headers.get('allow')).toBe('POST');
    expect((await response.json()).error).toBe('not_allowed:method');
  });

  it('refuses a sign-in form from another site’s page with 403 and counts nothing', async () => {
    const person = await newPerson(studioId, 'engineer', 'crosssite');
    const client = from('127.0.0.7');
    const status = await signIn(client, person.email, 'wrong', { origin: 'http://127.0.0.1:1' });
    expect(status).toBe(403);
    expect(await testDb.query('SELECT id FROM sign_in_failures WHERE email = ?', [person.email])).toHaveLength(0);
  });
});
