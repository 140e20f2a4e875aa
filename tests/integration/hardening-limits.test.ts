import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client } from '../support/http';
import { mailTo, uniqueAddress } from '../support/mail';
import { newPerson, newStudio, testDb, type Person } from '../support/people';
import { newSession } from '../support/takes';

/**
 * Report sending limited per person and per studio (project defaults: 20 and 60 reports an hour),
 * and an invitation that tells a manager nothing about other studios' accounts. Each test works in
 * studios of its own, so using up an allowance touches nobody else.
 */
afterAll(async () => {
  await testDb.end();
});

async function signedInAs(person: Person): Promise<Client> {
  const client = new Client();
  await client.signIn(person.email, person.password);
  if (!client.hasSession()) throw new Error(`Could not sign in as ${person.email}`);
  return client;
}

describe('report sending limits', () => {
  let studioId: number;
  let sessionId: number;
  let manager: Client;
  beforeAll(async () => {
    studioId = await newStudio('Report limits');
    manager = await signedInAs(await newPerson(studioId, 'manager', 'report-manager'));
    sessionId = await newSession(manager, 'Report limits session');
  });

  const send = (client: Client) => client.fetch(`/api/sessions/${sessionId}/report`, { method: 'POST', json: { to: ['limit-reader@demo.test'], message: 'Limit check.' } });
  const sentByStudio = async () => Number((await testDb.query("SELECT COUNT(*) AS n FROM mail_deliveries WHERE studioId = ? AND kind = 'session_report'", [studioId]))[0].n);

  it('refuses a person’s 21st report within an hour with 429, a plain message and Retry-After, and sends nothing', async () => {
    for (let i = 0; i < 20; i++) {
      const response = await send(manager);
      expect(response.status).toBe(202);
      await response.arrayBuffer();
    }
    const refused = await send(manager);
    expect(refused.status).toBe(429);
    expect(Number(refused.headers.get('retry-after'))).toBeGreaterThan(0);
    const body = await refused.json();
    expect(body.error).toBe('rate_limited:report_send');
    expect(body.message).toMatch(/^You have sent 20 reports in the last hour, the most Takeproof sends\. Try again in \d+ minute\(s\)\.$/);
    expect(await sentByStudio()).toBe(20);
  });

  it('refuses further reports once the studio has sent 60 within an hour, whoever sends them', async () => {
    // 39 more reports sent earlier this hour by a colleague (written straight into the studio's history).
    const colleague = await newPerson(studioId, 'producer', 'report-colleague');
    for (let i = 0; i < 39; i++) {
      await testDb.query(
        "INSERT INTO mail_deliveries (studioId, sentById, kind, subjectType, subjectId, recipients, subject, status, attempts, createdAt, updatedAt) VALUES (?, ?, 'session_report', 'session', ?, '[]', 'Earlier report', 'sent', 1, NOW(), NOW())",
        [studioId, colleague.id, sessionId],
      );
    }
    const producer = await signedInAs(await newPerson(studioId, 'producer', 'report-producer'));
    const last = await send(producer);
    expect(last.status).toBe(202);
    await last.arrayBuffer();
    const refused = await send(producer);
    expect(refused.status).toBe(429);
    expect((await refused.json()).message).toMatch(/^Your studio has sent 60 reports in the last hour/);
    expect(await sentByStudio()).toBe(60);
  });
});

describe('invitations across studios', () => {
  it('answers an address another studio already has exactly like a new one; only its owner learns it is taken', async () => {
    const elsewhere = await newPerson(await newStudio('Other studio'), 'engineer', 'has-account');
    const manager = await signedInAs(await newPerson(await newStudio('Inviting studio'), 'manager', 'inviting-manager'));
    const invite = async (email: string) => {
      const response = await manager.fetch('/api/users', { method: 'POST', json: { email, name: 'Invited person', role: 'engineer' } });
      return { status: response.status, body: await response.json() };
    };
    const fresh = await invite(uniqueAddress('fresh-invitee'));
    const taken = await invite(elsewhere.email);
    expect(taken.status).toBe(fresh.status);
    expect(taken.status).toBe(201);
    const shape = (b: { member: Record<string, unknown>; delivery: Record<string, unknown> }) => ({
      member: { ...b.member, id: 0, email: '', invitationExpiresAt: '', lastInvitation: null },
      delivery: { status: b.delivery.status, kind: b.delivery.kind },
    });
    expect(shape(taken.body)).toEqual(shape(fresh.body));

    // The address's owner may not use the link to make a second active account.
    const { mail } = await mailTo(elsewhere.email);
    const token = /\/invite\/([A-Za-z0-9_-]{43})\b/.exec(mail.text ?? '')![1];
    const accepted = await new Client().fetch('/api/invitations/accept', { method: 'POST', json: { token, password: 'a-new-long-password', confirm: 'a-new-long-password' } });
    expect(accepted.status).toBe(409);
    expect((await accepted.json()).error).toBe('conflict:account_exists');
    const stillThere = new Client();
    await stillThere.signIn(elsewhere.email, elsewhere.password);
    expect(stillThere.hasSession()).toBe(true);
  });
});
