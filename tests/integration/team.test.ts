import mariadb from 'mariadb';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { BASE_URL, Client, signedInAll, type DemoPerson } from '../support/http';
import { mailTo, uniqueAddress } from '../support/mail';

let as: Record<DemoPerson | 'anonymous', Client>;
const pool = mariadb.createPool({
  host: process.env.DB_HOST ?? '127.0.0.1',
  port: Number(process.env.DB_PORT ?? 3317),
  user: process.env.DB_USER,
  password: process.env.DB_PASSWORD,
  database: process.env.DB_NAME,
  connectionLimit: 2,
});

interface Member {
  id: number;
  name: string;
  email: string;
  role: string;
  status: 'active' | 'invited' | 'deactivated';
}

beforeAll(async () => {
  as = await signedInAll();
});
afterAll(async () => {
  await pool.end();
});

async function invite(client: Client, body: Record<string, unknown>) {
  const response = await client.fetch('/api/users', { method: 'POST', json: body });
  return { status: response.status, body: await response.json() };
}

async function linkFor(address: string): Promise<string> {
  const { mail } = await mailTo(address);
  const match = /\/invite\/([A-Za-z0-9_-]{43})\b/.exec(mail.text ?? '');
  expect(match, 'the invitation e-mail holds a link').not.toBeNull();
  return match![1];
}

async function accept(token: string, password: string, confirm = password) {
  const response = await new Client().fetch('/api/invitations/accept', { method: 'POST', json: { token, password, confirm } });
  return { status: response.status, body: await response.json() };
}

async function patch(client: Client, id: number, body: Record<string, unknown>) {
  const response = await client.fetch(`/api/users/${id}`, { method: 'PATCH', json: body });
  return { status: response.status, body: await response.json() };
}

async function team(client: Client): Promise<Member[]> {
  return (await (await client.fetch('/api/users')).json()).users;
}

/** Signs in from an address of its own, so the failed tries count against nobody else's sign-ins. */
async function canSignIn(email: string, password: string): Promise<Client | null> {
  const client = new Client(BASE_URL, '127.0.0.11');
  await client.signIn(email, password);
  return client.hasSession() ? client : null;
}

describe('inviting a person', () => {
  it('mails a link; setting a password activates the account and the person can sign in', async () => {
    const email = uniqueAddress('new-engineer');
    const { status, body } = await invite(as.manager, { email, name: 'Oskar Pellegrini', role: 'engineer' });
    expect(status).toBe(201);
    expect(body.member).toMatchObject({ email, name: 'Oskar Pellegrini', role: 'engineer', status: 'invited' });
    expect(body.delivery).toMatchObject({ status: 'sent', recipients: [email], kind: 'invitation' });
    expect(Date.parse(body.member.invitationExpiresAt) - Date.now()).toBeGreaterThan(71 * 3600_000);
    expect(Date.parse(body.member.invitationExpiresAt) - Date.now()).toBeLessThanOrEqual(72 * 3600_000);

    const { mail } = await mailTo(email);
    expect(mail.subject).toContain('Lanternfish Audio Works');
    expect(String(mail.html)).toContain('Set your password');
    const token = await linkFor(email);
    // The link is stored only as a hash.
    const [row] = await pool.query('SELECT tokenHash FROM invitations i JOIN users u ON u.id = i.userId WHERE u.email = ?', [email]);
    expect(row.tokenHash).toMatch(/^[0-9a-f]{64}$/);
    expect(row.tokenHash).not.toContain(token);

    // Before accepting, the account cannot be used.
    expect(await canSignIn(email, 'anything-at-all-1')).toBeNull();

    const page = await new Client().fetch(`/invite/${token}`);
    expect(page.status).toBe(200);
    const html = await page.text();
    expect(html).toContain('Welcome, Oskar Pellegrini');
    expect(html).toContain('Set password and activate');

    const short = await accept(token, 'short-pw');
    expect(short.status).toBe(400);
    expect(short.body.fields).toEqual({ password: ['Use at least 10 characters'] });
    const mismatch = await accept(token, 'long-enough-password', 'something-else-here');
    expect(mismatch.body.fields).toEqual({ confirm: ['The two passwords are not the same'] });

    const ok = await accept(token, 'reel-to-reel-2026');
    expect(ok.status).toBe(200);
    expect(ok.body.email).toBe(email);
    const client = await canSignIn(email, 'reel-to-reel-2026');
    expect(client).not.toBeNull();
    const me = await client!.fetch('/api/sessions');
    expect(me.status).toBe(200);
    expect((await team(as.manager)).find((m) => m.email === email)?.status).toBe('active');

    // Single use: the same link cannot set a password again.
    const again = await accept(token, 'another-password-99');
    expect(again.status).toBe(400);
    expect(again.body.error).toBe('invalid:invitation_used');
    expect(await canSignIn(email, 'another-password-99')).toBeNull();
    expect(await (await new Client().fetch(`/invite/${token}`)).text()).toContain('already been used');
  });

  it('refuses an expired link, and a resent link replaces the old one', async () => {
    const email = uniqueAddress('late-producer');
    const { body } = await invite(as.manager, { email, name: 'Wren Achterberg', role: 'producer' });
    const first = await linkFor(email);
    await pool.query('UPDATE invitations SET expiresAt = ? WHERE userId = ?', [new Date(Date.now() - 60_000), body.member.id]);
    const expired = await accept(first, 'cassette-deck-77');
    expect(expired.status).toBe(400);
    expect(expired.body.error).toBe('invalid:invitation_expired');
    expect(expired.body.message).toMatch(/expired/);
    expect(await (await new Client().fetch(`/invite/${first}`)).text()).toContain('This invitation has expired');

    const resent = await as.manager.fetch(`/api/users/${body.member.id}/invitation`, { method: 'POST' });
    expect(resent.status).toBe(202);
    // Wait for the second message, then take its link.
    let second = first;
    for (let i = 0; i < 50 && second === first; i++) {
      second = await linkFor(email);
      if (second === first) await new Promise((r) => setTimeout(r, 200));
    }
    expect(second).not.toBe(first);
    expect((await accept(first, 'cassette-deck-77')).status).toBe(400);
    expect((await accept(second, 'cassette-deck-77')).status).toBe(200);
    expect(await canSignIn(email, 'cassette-deck-77')).not.toBeNull();
  });

  it('validates the invitation and refuses an address that already has an account', async () => {
    const bad = await invite(as.manager, { email: 'not an address', name: '', role: 'boss' });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.fields).sort()).toEqual(['email', 'name', 'role']);
    expect(bad.body.fields.name).toEqual(['Enter the person’s name']);
    const taken = await invite(as.manager, { email: 'producer@demo.test', name: 'Someone', role: 'producer' });
    expect(taken.status).toBe(409);
    expect(taken.body.fields.email).toEqual(['Already in your team']);
  });
});

describe('roles and deactivation', () => {
  it('never removes or demotes the last active manager', async () => {
    const managers = (await team(as.manager)).filter((m) => m.role === 'manager' && m.status === 'active');
    expect(managers).toHaveLength(1);
    const self = managers[0];
    const demote = await patch(as.manager, self.id, { role: 'producer' });
    expect(demote.status).toBe(409);
    expect(demote.body.error).toBe('conflict:last_manager');
    expect(demote.body.message).toBe('The studio needs at least one active manager. Make someone else a manager first.');
    const deactivate = await patch(as.manager, self.id, { active: false });
    expect(deactivate.status).toBe(409);
    expect((await team(as.manager)).find((m) => m.id === self.id)).toMatchObject({ role: 'manager', status: 'active' });
    // The other studio's only manager is protected the same way.
    const outsiderSelf = (await team(as.outsider)).find((m) => m.email === 'outside-manager@demo.test')!;
    expect((await patch(as.outsider, outsiderSelf.id, { role: 'engineer' })).status).toBe(409);
  });

  it('changes a role, which ends earlier sessions and takes effect at the next sign-in, and deactivation stops sign-in', async () => {
    const email = uniqueAddress('promoted');
    const { body } = await invite(as.manager, { email, name: 'Ilse Marchetti', role: 'engineer' });
    await accept(await linkFor(email), 'quarter-inch-tape');
    const before = (await canSignIn(email, 'quarter-inch-tape'))!;
    expect((await before.fetch('/api/users')).status).toBe(403);

    const promoted = await patch(as.manager, body.member.id, { role: 'manager' });
    expect(promoted.status).toBe(200);
    expect(promoted.body).toMatchObject({ role: 'manager', status: 'active' });
    expect((await before.fetch('/api/users')).status).toBe(401);
    const person = (await canSignIn(email, 'quarter-inch-tape'))!;
    expect((await person.fetch('/api/users')).status).toBe(200);
    // With two managers, one of them may step down; then the last one may not.
    expect((await patch(person, body.member.id, { role: 'producer' })).status).toBe(200);
    expect((await person.fetch('/api/users')).status).toBe(401);
    const demoted = (await canSignIn(email, 'quarter-inch-tape'))!;
    expect((await demoted.fetch('/api/users')).status).toBe(403);

    const off = await patch(as.manager, body.member.id, { active: false });
    expect(off.status).toBe(200);
    expect(off.body.status).toBe('deactivated');
    expect((await demoted.fetch('/api/sessions')).status).toBe(401);
    expect(await canSignIn(email, 'quarter-inch-tape')).toBeNull();
    const on = await patch(as.manager, body.member.id, { active: true });
    expect(on.body.status).toBe('active');
    expect(await canSignIn(email, 'quarter-inch-tape')).not.toBeNull();

    const audit = await (await as.manager.fetch(`/api/audit?subjectType=user`)).json();
    const actions = audit.events.filter((e: { subjectId: number }) => e.subjectId === body.member.id).map((e: { action: string }) => e.action);
    expect(actions).toEqual(expect.arrayContaining(['user.invite', 'invitation.accept', 'user.role_change', 'user.deactivate', 'user.reactivate']));
  });
});

describe('who may manage the team', () => {
  it('answers 401 signed out, 403 to engineers and producers, 404 for another studio', async () => {
    const home = await team(as.manager);
    const target = home.find((m) => m.email === 'engineer@demo.test')!;
    expect((await as.anonymous.fetch('/api/users')).status).toBe(401);
    for (const person of ['engineer', 'producer'] as const) {
      const list = await as[person].fetch('/api/users');
      expect(list.status).toBe(403);
      expect((await list.json()).error).toBe('forbidden:user:manage');
      expect((await invite(as[person], { email: uniqueAddress('x'), name: 'X', role: 'manager' })).status).toBe(403);
      expect((await patch(as[person], target.id, { role: 'manager' })).status).toBe(403);
      expect((await as[person].fetch(`/api/users/${target.id}/invitation`, { method: 'POST' })).status).toBe(403);
    }
    expect((await patch(as.outsider, target.id, { active: false })).status).toBe(404);
    expect((await as.outsider.fetch(`/api/users/${target.id}/invitation`, { method: 'POST' })).status).toBe(404);
    expect((await team(as.outsider)).some((m) => m.email.endsWith('@demo.test') && home.some((h) => h.id === m.id))).toBe(false);
    expect((await team(as.manager)).find((m) => m.id === target.id)).toMatchObject({ role: 'engineer', status: 'active' });
  });

  it('shows the outbox only to managers, and only their studio’s mail', async () => {
    expect((await as.producer.fetch('/api/outbox')).status).toBe(403);
    const mine = (await (await as.manager.fetch('/api/outbox')).json()).messages;
    expect(mine.length).toBeGreaterThan(0);
    expect(mine.some((m: { subject: string }) => m.subject.includes('Lanternfish Audio Works'))).toBe(true);
    const theirs = (await (await as.outsider.fetch('/api/outbox')).json()).messages;
    expect(theirs.some((m: { id: string }) => mine.some((x: { id: string }) => x.id === m.id))).toBe(false);
    const one = await as.manager.fetch(`/api/outbox/${mine[0].id}`);
    expect(one.status).toBe(200);
    expect((await one.json()).text.length).toBeGreaterThan(0);
    expect((await as.outsider.fetch(`/api/outbox/${mine[0].id}`)).status).toBe(404);
    expect((await as.manager.fetch('/api/outbox/..%2F..%2Fpackage')).status).toBe(404);

    // The pages show the same: a list with subjects, and one message's text.
    const listPage = await (await as.manager.fetch('/outbox')).text();
    expect(listPage).toContain(`/outbox/${mine[0].id}`);
    const messagePage = await as.manager.fetch(`/outbox/${mine[0].id}`);
    expect(messagePage.status).toBe(200);
    expect(await messagePage.text()).toContain(mine[0].to[0]);
    // A streamed page keeps its 200 status; what the person sees is the not-found page.
    expect(await (await as.manager.fetch('/outbox/not-an-id')).text()).toContain('This page does not exist');
    expect(await (await as.outsider.fetch(`/outbox/${mine[0].id}`)).text()).not.toContain(mine[0].to[0]);
    expect(await (await as.producer.fetch('/outbox')).text()).not.toContain(`/outbox/${mine[0].id}`);
  });

  it('shows the team page to managers only', async () => {
    const page = await (await as.manager.fetch('/team')).text();
    expect(page).toContain('engineer@demo.test');
    expect(page).toContain('Invite a person');
    for (const person of ['engineer', 'producer'] as const) {
      const html = await (await as[person].fetch('/team')).text();
      expect(html).not.toContain('engineer@demo.test');
      expect(html).not.toContain('Invite a person');
    }
  });
});
