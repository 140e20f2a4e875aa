import { beforeAll, describe, expect, it } from 'vitest';
import { BASE_URL, signedInAll, type Client, type DemoPerson } from '../support/http';

// State-changing requests name the app's own origin, as its pages do.
const ORIGIN = { origin: BASE_URL };

let as: Record<DemoPerson | 'anonymous', Client>;
const unique = () => `${Date.now().toString(36)}-${Math.random().toString(36).slice(2, 6)}`;

beforeAll(async () => {
  as = await signedInAll();
});

async function createSpec(json: unknown) {
  const response = await as.manager.fetch('/api/specs', { method: 'POST', headers: ORIGIN, json });
  return { status: response.status, body: await response.json() };
}

describe('delivery spec values', () => {
  it('refuses a required sample rate no recorder uses (4800 Hz), naming the field, and accepts 44 100 Hz (AES5 lists 44.1 and 48 kHz)', async () => {
    const typo = await createSpec({ name: `Rate typo ${unique()}`, thresholds: { requiredSampleRate: 4800 } });
    expect(typo.status).toBe(400);
    expect(typo.body.fields['thresholds.requiredSampleRate'].join(' ')).toMatch(/standard sample rate/);
    const cd = await createSpec({ name: `CD rate ${unique()}`, thresholds: { requiredSampleRate: 44100 } });
    expect(cd.status).toBe(201);
    expect(cd.body.thresholds.requiredSampleRate).toBe(44100);
  });
});

describe('archiving a delivery spec', () => {
  it('hides it from new sessions but keeps it for the sessions that use it, until it is restored', async () => {
    const spec = (await createSpec({ name: `Autumn season ${unique()}` })).body;
    const session = await as.manager.fetch('/api/sessions', { method: 'POST', headers: ORIGIN, json: { title: `Autumn pickups ${unique()}`, deliverySpecId: spec.id } });
    expect(session.status).toBe(201);
    const sessionId = (await session.json()).id;

    const archived = await as.manager.fetch(`/api/specs/${spec.id}`, { method: 'PATCH', headers: ORIGIN, json: { archived: true } });
    expect(archived.status).toBe(200);
    expect((await archived.json()).archived).toBe(true);

    const refused = await as.manager.fetch('/api/sessions', { method: 'POST', headers: ORIGIN, json: { title: `Too late ${unique()}`, deliverySpecId: spec.id } });
    expect(refused.status).toBe(400);
    expect((await refused.json()).fields.deliverySpecId.join(' ')).toMatch(/archived/);

    // The old session keeps its spec and can still be edited.
    const kept = await as.manager.fetch(`/api/sessions/${sessionId}`, { method: 'PATCH', headers: ORIGIN, json: { notes: 'Still judged against the autumn spec.', deliverySpecId: spec.id } });
    expect(kept.status).toBe(200);
    expect((await kept.json()).deliverySpec.id).toBe(spec.id);
    // The new-session form no longer offers it; the old session's page still does.
    const specChoices = async (path: string) => /<select[^>]*>(?:(?!<\/select>)[\s\S])*Takeproof defaults[\s\S]*?<\/select>/.exec(await (await as.manager.fetch(path)).text())?.[0] ?? '';
    expect(await specChoices('/sessions')).not.toContain(spec.name);
    expect(await specChoices(`/sessions/${sessionId}`)).toContain(spec.name);

    await as.manager.fetch(`/api/specs/${spec.id}`, { method: 'PATCH', headers: ORIGIN, json: { archived: false } });
    const again = await as.manager.fetch('/api/sessions', { method: 'POST', headers: ORIGIN, json: { title: `Back again ${unique()}`, deliverySpecId: spec.id } });
    expect(again.status).toBe(201);
  });
});
