import { beforeAll, describe, expect, it } from 'vitest';
import { signedInAll, type Client, type DemoPerson } from '../support/http';

let as: Record<DemoPerson | 'anonymous', Client>;
const unique = () => Math.random().toString(36).slice(2, 8);

beforeAll(async () => {
  as = await signedInAll();
});

async function send(client: Client, method: 'POST' | 'PATCH', path: string, json: unknown) {
  const response = await client.fetch(path, { method, json });
  return { status: response.status, body: await response.json() };
}
const list = async (client: Client, query = '') => (await (await client.fetch(`/api/recorders${query}`)).json()).recorders as { id: number; label: string; active: boolean }[];

describe('recorders API', () => {
  it('adds a recorder with its details and lists it', async () => {
    const label = `Booth D interface ${unique()}`;
    const { status, body } = await send(as.manager, 'POST', '/api/recorders', {
      label,
      makeModel: 'Halden A4 USB interface',
      serial: 'HA4-0042',
      location: 'Booth D',
      bextMatch: 'HALDEN-A4',
      notes: '',
    });
    expect(status).toBe(201);
    expect(body).toMatchObject({ label, makeModel: 'Halden A4 USB interface', serial: 'HA4-0042', location: 'Booth D', bextMatch: 'HALDEN-A4', notes: null, active: true, takeCount: 0 });
    expect((await list(as.manager)).map((r) => r.id)).toContain(body.id);
  });

  it('answers 400 with exact field messages and stores nothing', async () => {
    const bad = await send(as.manager, 'POST', '/api/recorders', { label: ' ', bextMatch: 'A1', serial: 'x'.repeat(121) });
    expect(bad.status).toBe(400);
    expect(bad.body.fields).toEqual({
      label: ['Give the recorder a label'],
      serial: ['Keep the serial number under 120 characters'],
      bextMatch: ['Use at least 3 characters, so the text cannot match takes from other recorders by chance'],
    });
    expect((await send(as.manager, 'POST', '/api/recorders', {})).body.fields).toEqual({ label: ['Give the recorder a label'] });
    const label = `Twin recorder ${unique()}`;
    await send(as.manager, 'POST', '/api/recorders', { label });
    const twin = await send(as.manager, 'POST', '/api/recorders', { label });
    expect(twin.status).toBe(400);
    expect(twin.body.fields).toEqual({ label: ['Another recorder of this studio already has this label'] });
    // Only the first one was kept (other test files add recorders meanwhile, so count this label's only).
    const all = await list(as.manager, '?status=all');
    expect(all.filter((r) => r.label === label)).toHaveLength(1);
    expect(all.filter((r) => r.label.trim() === '')).toEqual([]);
    const query = await as.manager.fetch('/api/recorders?status=broken');
    expect(query.status).toBe(400);
    expect((await query.json()).fields).toEqual({ status: ['Use active, retired or all'] });
  });

  it('edits a recorder and retires it: hidden by default, shown when asked, and back again', async () => {
    const { body: r } = await send(as.manager, 'POST', '/api/recorders', { label: `Field kit ${unique()}`, bextMatch: 'CORVID FR-2' });
    const edited = await send(as.manager, 'PATCH', `/api/recorders/${r.id}`, { location: 'Van 2', bextMatch: '' });
    expect(edited.status).toBe(200);
    expect(edited.body).toMatchObject({ location: 'Van 2', bextMatch: null, label: r.label, active: true });

    const retired = await send(as.manager, 'PATCH', `/api/recorders/${r.id}`, { active: false });
    expect(retired.body.active).toBe(false);
    expect((await list(as.manager)).map((x) => x.id)).not.toContain(r.id);
    expect((await list(as.manager, '?status=all')).find((x) => x.id === r.id)?.active).toBe(false);
    expect((await list(as.manager, '?status=retired')).every((x) => !x.active)).toBe(true);
    expect((await list(as.manager, '?status=retired')).map((x) => x.id)).toContain(r.id);

    await send(as.manager, 'PATCH', `/api/recorders/${r.id}`, { active: true });
    expect((await list(as.manager)).map((x) => x.id)).toContain(r.id);

    const bad = await send(as.manager, 'PATCH', `/api/recorders/${r.id}`, { active: 'no', label: '' });
    expect(bad.status).toBe(400);
    expect(bad.body.fields).toEqual({ label: ['Give the recorder a label'], active: ['Choose active or retired'] });
  });

  it('answers 401 signed out and 403 to engineers and producers', async () => {
    expect((await as.anonymous.fetch('/api/recorders')).status).toBe(401);
    expect((await send(as.anonymous, 'POST', '/api/recorders', { label: 'x' })).status).toBe(401);
    for (const person of ['engineer', 'producer'] as const) {
      const response = await as[person].fetch('/api/recorders');
      expect(response.status).toBe(403);
      expect((await response.json()).error).toBe('forbidden:recorder:manage');
      expect((await send(as[person], 'POST', '/api/recorders', { label: `Sneaky ${unique()}` })).status).toBe(403);
      expect((await send(as[person], 'PATCH', '/api/recorders/1', { active: false })).status).toBe(403);
    }
  });

  it('answers 404 to a manager of another studio, who cannot see or retire it', async () => {
    const { body: r } = await send(as.manager, 'POST', '/api/recorders', { label: `Stage box ${unique()}` });
    expect((await as.outsider.fetch(`/api/recorders/${r.id}`)).status).toBe(404);
    expect((await send(as.outsider, 'PATCH', `/api/recorders/${r.id}`, { active: false })).status).toBe(404);
    expect((await list(as.outsider, '?status=all')).map((x) => x.id)).not.toContain(r.id);
    expect((await (await as.manager.fetch(`/api/recorders/${r.id}`)).json()).active).toBe(true);
    expect((await as.manager.fetch('/api/recorders/abc')).status).toBe(404);
  });
});
