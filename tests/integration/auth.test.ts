import { describe, expect, it } from 'vitest';
import { BASE_URL, Client, DEMO, signedIn } from '../support/http';

describe('sign-in', () => {
  it('gives each demo account a session carrying its role and studio', async () => {
    const roles = { engineer: 'engineer', producer: 'producer', manager: 'manager' } as const;
    const studios = new Set<number>();
    for (const person of Object.keys(roles) as (keyof typeof roles)[]) {
      const client = await signedIn(person);
      const session = await (await client.fetch('/api/auth/session')).json();
      expect(session.user).toMatchObject({ email: DEMO[person], role: roles[person] });
      studios.add(session.user.studioId);
    }
    expect(studios.size).toBe(1);
    const outsider = await (await (await signedIn('outsider')).fetch('/api/auth/session')).json();
    expect(studios.has(outsider.user.studioId)).toBe(false);
  });

  it('refuses a wrong password with no session cookie', async () => {
    // Failures come from an address of their own, so they count against nobody else's sign-ins.
    const client = new Client(BASE_URL, '127.0.0.10');
    const response = await client.signIn(DEMO.engineer, 'not-the-password');
    expect(response.status).toBe(401);
    expect(client.hasSession()).toBe(false);
    expect(await (await client.fetch('/api/auth/session')).json()).toEqual({});
  });

  it('refuses an unknown account the same way as a wrong password', async () => {
    const client = new Client(BASE_URL, '127.0.0.10');
    const response = await client.signIn('nobody@demo.test', 'whatever');
    expect(response.status).toBe(401);
    expect(client.hasSession()).toBe(false);
  });

  it('marks the session cookie HttpOnly and SameSite=Lax', async () => {
    const client = new Client();
    const { csrfToken } = await (await client.fetch('/api/auth/csrf')).json();
    const response = await client.fetch('/api/auth/callback/credentials', {
      method: 'POST',
      headers: { 'content-type': 'application/x-www-form-urlencoded' },
      body: new URLSearchParams({ csrfToken, email: DEMO.producer, password: process.env.DEMO_PASSWORD ?? 'demo-takes-2026', json: 'true' }).toString(),
    });
    const cookie = response.headers.getSetCookie().find((c) => c.includes('next-auth.session-token'));
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
  });

  it('sends signed-out visitors of app pages to the sign-in page', async () => {
    const response = await new Client().fetch('/sessions');
    expect([302, 303, 307]).toContain(response.status);
    expect(response.headers.get('location')).toMatch(/\/signin/);
  });
});

describe('failed sign-in limits', () => {
  it('answers 429 with Retry-After once an account has failed five times, even with the right password', async () => {
    const client = new Client(BASE_URL, '127.0.0.10');
    // An account of its own, so other tests' sign-ins are not affected.
    const email = 'locked-out-probe@demo.test';
    for (let i = 0; i < 5; i++) expect((await client.signIn(email, `wrong-${i}`)).status).toBe(401);
    const blocked = await client.signIn(email, 'wrong-again');
    expect(blocked.status).toBe(429);
    expect(Number(blocked.headers.get('retry-after'))).toBeGreaterThan(0);
    expect((await blocked.json()).message).toMatch(/Too many failed sign-ins/);
  });
});
