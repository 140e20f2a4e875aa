import { beforeAll, describe, expect, it } from 'vitest';
import { signedInAll, type Client, type DemoPerson } from '../support/http';

let as: Record<DemoPerson | 'anonymous', Client>;

beforeAll(async () => {
  as = await signedInAll();
});

async function createSession(client: Client, body: Record<string, unknown>) {
  const response = await client.fetch('/api/sessions', { method: 'POST', json: body });
  return { status: response.status, body: await response.json() };
}

describe('POST /api/sessions', () => {
  it('lets an engineer start a session and answers 201 with its id at the top level', async () => {
    const { status, body } = await createSession(as.engineer, { title: 'Lighthouse keepers, pickup lines' });
    expect(status).toBe(201);
    expect(Number.isInteger(body.id)).toBe(true);
    expect(body.title).toBe('Lighthouse keepers, pickup lines');
    // The engineer who starts it is its engineer.
    expect(body.engineer?.name).toBeTruthy();
  });

  it('answers 400 with a field error for a missing title, and stores nothing', async () => {
    const before = (await (await as.manager.fetch('/api/sessions')).json()).sessions.length;
    const { status, body } = await createSession(as.manager, { title: '   ' });
    expect(status).toBe(400);
    expect(body.fields.title).toEqual(['Give the session a title']);
    const after = (await (await as.manager.fetch('/api/sessions')).json()).sessions.length;
    expect(after).toBe(before);
  });

  it('answers 400 for a body that is not JSON', async () => {
    const response = await as.manager.fetch('/api/sessions', { method: 'POST', headers: { 'content-type': 'application/json' }, body: '{"title":' });
    expect(response.status).toBe(400);
    expect((await response.json()).error).toBe('invalid:json');
  });

  it('refuses a delivery spec of another studio as a field error', async () => {
    const outsiderSpecs = await createSession(as.outsider, { title: 'Probe', deliverySpecId: 1 });
    expect(outsiderSpecs.status).toBe(400);
    expect(outsiderSpecs.body.fields.deliverySpecId).toBeDefined();
  });

  it('answers 401 signed out and 403 for a producer', async () => {
    expect((await createSession(as.anonymous, { title: 'x' })).status).toBe(401);
    const producer = await createSession(as.producer, { title: 'x' });
    expect(producer.status).toBe(403);
    expect(producer.body.error).toBe('forbidden:session:create');
  });
});

describe('GET and PATCH /api/sessions/:id', () => {
  it('shows a session to everyone in its studio and 404 to another studio', async () => {
    const { body: created } = await createSession(as.manager, { title: 'Dawn chorus field day', room: 'Marsh hide' });
    for (const person of ['engineer', 'producer', 'manager'] as const) {
      const response = await as[person].fetch(`/api/sessions/${created.id}`);
      expect(response.status).toBe(200);
      expect((await response.json()).room).toBe('Marsh hide');
    }
    expect((await as.outsider.fetch(`/api/sessions/${created.id}`)).status).toBe(404);
    expect((await as.anonymous.fetch(`/api/sessions/${created.id}`)).status).toBe(401);
    expect((await as.manager.fetch('/api/sessions/999999')).status).toBe(404);
    expect((await as.manager.fetch('/api/sessions/not-a-number')).status).toBe(404);
  });

  it('keeps sessions of other studios out of the list', async () => {
    const { body: created } = await createSession(as.outsider, { title: 'Quarry Hill private session' });
    const mine = (await (await as.manager.fetch('/api/sessions')).json()).sessions.map((s: { id: number }) => s.id);
    expect(mine).not.toContain(created.id);
    const theirs = (await (await as.outsider.fetch('/api/sessions')).json()).sessions.map((s: { id: number }) => s.id);
    expect(theirs).toContain(created.id);
  });

  it('updates fields and status, and refuses another studio with 404', async () => {
    const { body: created } = await createSession(as.engineer, { title: 'Choir warm-up' });
    const patched = await as.producer.fetch(`/api/sessions/${created.id}`, { method: 'PATCH', json: { status: 'closed', notes: 'All good.' } });
    expect(patched.status).toBe(200);
    expect(await patched.json()).toMatchObject({ status: 'closed', notes: 'All good.' });
    expect((await as.outsider.fetch(`/api/sessions/${created.id}`, { method: 'PATCH', json: { title: 'hijacked' } })).status).toBe(404);
    const unchanged = await (await as.manager.fetch(`/api/sessions/${created.id}`)).json();
    expect(unchanged.title).toBe('Choir warm-up');
  });

  it('filters the list by search text and status', async () => {
    await createSession(as.engineer, { title: 'Zebra crossing foley', client: 'Stripe Street Stories' });
    const found = (await (await as.engineer.fetch('/api/sessions?q=zebra')).json()).sessions;
    expect(found.map((s: { title: string }) => s.title)).toContain('Zebra crossing foley');
    expect(found.every((s: { title: string; client: string | null }) => /zebra/i.test(s.title + (s.client ?? '')))).toBe(true);
    const closed = (await (await as.engineer.fetch('/api/sessions?status=closed')).json()).sessions;
    expect(closed.every((s: { status: string }) => s.status === 'closed')).toBe(true);
  });
});
