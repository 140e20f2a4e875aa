import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { db } from '@/lib/db/connection.server';
import { measuredFields } from '@/lib/takes/verdicts.server';
import { DEFAULT_SPEC } from '@/dsp/spec';
import type { AnalysisReport } from '@/dsp/types';
import { Take, User } from '@/models';
import { analyzeBuffer, sixteenBitTakeWav } from '../support/fleetData';
import { signedInAll, type Client, type DemoPerson } from '../support/http';

let as: Record<DemoPerson | 'anonymous', Client>;
const unique = () => Math.random().toString(36).slice(2, 8);

beforeAll(async () => {
  db(); // the models, on the test database
  as = await signedInAll();
});
afterAll(async () => {
  await db().close();
});

async function post(client: Client, path: string, json: unknown) {
  const response = await client.fetch(path, { method: 'POST', json });
  return { status: response.status, body: await response.json() };
}
async function patch(client: Client, path: string, json: unknown) {
  const response = await client.fetch(path, { method: 'PATCH', json });
  return { status: response.status, body: await response.json() };
}

describe('delivery specs API', () => {
  it('creates a spec from defaults plus the thresholds sent, and lists it', async () => {
    const name = `Audiobook master ${unique()}`;
    const { status, body } = await post(as.manager, '/api/specs', { name, description: 'Retail audiobook delivery', thresholds: { loudnessTargetLufs: -20, maxTruePeakDbtp: -3 } });
    expect(status).toBe(201);
    expect(body).toMatchObject({ name, description: 'Retail audiobook delivery', sessionCount: 0 });
    expect(body.thresholds).toMatchObject({ loudnessTargetLufs: -20, maxTruePeakDbtp: -3, minEffectiveBits: DEFAULT_SPEC.minEffectiveBits, requiredSampleRate: null });
    const list = (await (await as.manager.fetch('/api/specs')).json()).specs;
    expect(list.find((s: { id: number }) => s.id === body.id)?.name).toBe(name);
  });

  it('answers 400 with a plain message, with its unit, for each bad threshold, and stores nothing', async () => {
    const name = `Broken ${unique()}`;
    const { status, body } = await post(as.manager, '/api/specs', {
      name,
      thresholds: {
        loudnessTargetLufs: -60,
        loudnessToleranceLu: 0,
        maxTruePeakDbtp: 'loud',
        minEffectiveBits: 20.5,
        maxNoiseFloorDbfs: -10,
        requiredBitDepth: 20,
        requiredSampleRate: -48000,
        loudnessIsStrict: 'yes',
      },
    });
    expect(status).toBe(400);
    expect(body.error).toBe('invalid:input');
    expect(body.fields).toEqual({
      'thresholds.loudnessTargetLufs': ['Targets below -40 LUFS are not plausible'],
      'thresholds.loudnessToleranceLu': ['Use a value from 0.1 to 10 LU'],
      'thresholds.maxTruePeakDbtp': ['Enter a number in dBTP'],
      'thresholds.minEffectiveBits': ['Enter a whole number of bits'],
      'thresholds.maxNoiseFloorDbfs': ['Use a value from -160 to -20 dBFS'],
      'thresholds.requiredBitDepth': ['Choose 16, 24 or 32 bits, or leave it empty for any bit depth'],
      'thresholds.requiredSampleRate': ['Choose a standard sample rate (8000, 11025, 16000, 22050, 24000, 32000, 44100, 48000, 88200, 96000, 176400, 192000, 352800, 384000 Hz), or leave it empty for any rate'],
      'thresholds.loudnessIsStrict': ['Choose on or off'],
    });
    const list = (await (await as.manager.fetch('/api/specs')).json()).specs;
    expect(list.some((s: { name: string }) => s.name === name)).toBe(false);
  });

  it('needs a name, a unique one', async () => {
    expect((await post(as.manager, '/api/specs', { name: '  ' })).body.fields).toEqual({ name: ['Give the spec a name'] });
    expect((await post(as.manager, '/api/specs', {})).body.fields).toEqual({ name: ['Give the spec a name'] });
    const name = `Twin ${unique()}`;
    expect((await post(as.manager, '/api/specs', { name })).status).toBe(201);
    const again = await post(as.manager, '/api/specs', { name });
    expect(again.status).toBe(400);
    expect(again.body.fields).toEqual({ name: ['Another delivery spec of this studio already has this name'] });
  });

  it('edits only what is sent and keeps the other thresholds', async () => {
    const { body: spec } = await post(as.manager, '/api/specs', { name: `Drama ${unique()}`, thresholds: { requiredSampleRate: 48000 } });
    const { status, body } = await patch(as.manager, `/api/specs/${spec.id}`, { description: 'Scenes at 48 kHz', thresholds: { maxTruePeakDbtp: -2 } });
    expect(status).toBe(200);
    expect(body.description).toBe('Scenes at 48 kHz');
    expect(body.thresholds).toMatchObject({ maxTruePeakDbtp: -2, requiredSampleRate: 48000 });
    const bad = await patch(as.manager, `/api/specs/${spec.id}`, { thresholds: { maxClipEvents: -1 } });
    expect(bad.status).toBe(400);
    expect(bad.body.fields).toEqual({ 'thresholds.maxClipEvents': ['Use a value from 0 to 1000 events'] });
    const reread = await (await as.manager.fetch(`/api/specs/${spec.id}`)).json();
    expect(reread.thresholds.maxClipEvents).toBe(DEFAULT_SPEC.maxClipEvents);
  });

  it('duplicates a spec under a "Copy of" name, and under a chosen one', async () => {
    const { body: spec } = await post(as.manager, '/api/specs', { name: `Podcast ${unique()}`, description: 'Weekly show', thresholds: { loudnessTargetLufs: -16 } });
    const copy = await post(as.manager, `/api/specs/${spec.id}/duplicate`, {});
    expect(copy.status).toBe(201);
    expect(copy.body.id).not.toBe(spec.id);
    expect(copy.body).toMatchObject({ name: `Copy of ${spec.name}`, description: 'Weekly show', sessionCount: 0 });
    expect(copy.body.thresholds).toEqual(spec.thresholds);
    const second = await post(as.manager, `/api/specs/${spec.id}/duplicate`, {});
    expect(second.body.name).toBe(`Copy of ${spec.name} (2)`);
    const named = await post(as.manager, `/api/specs/${spec.id}/duplicate`, { name: `${spec.name} loud` });
    expect(named.body.name).toBe(`${spec.name} loud`);
    // Editing the copy leaves the original alone.
    await patch(as.manager, `/api/specs/${copy.body.id}`, { thresholds: { loudnessTargetLufs: -14 } });
    expect((await (await as.manager.fetch(`/api/specs/${spec.id}`)).json()).thresholds.loudnessTargetLufs).toBe(-16);
  });

  it('answers 401 signed out and 403 to engineers and producers', async () => {
    expect((await as.anonymous.fetch('/api/specs')).status).toBe(401);
    expect((await post(as.anonymous, '/api/specs', { name: 'x' })).status).toBe(401);
    for (const person of ['engineer', 'producer'] as const) {
      const list = await as[person].fetch('/api/specs');
      expect(list.status).toBe(403);
      expect((await list.json()).error).toBe('forbidden:spec:manage');
      expect((await post(as[person], '/api/specs', { name: `Sneaky ${unique()}` })).status).toBe(403);
      expect((await patch(as[person], '/api/specs/1', { name: 'x' })).status).toBe(403);
      expect((await post(as[person], '/api/specs/1/duplicate', {})).status).toBe(403);
    }
  });

  it('answers 404 to a manager of another studio and keeps the spec out of their list', async () => {
    const { body: spec } = await post(as.manager, '/api/specs', { name: `Private ${unique()}` });
    expect((await as.outsider.fetch(`/api/specs/${spec.id}`)).status).toBe(404);
    expect((await patch(as.outsider, `/api/specs/${spec.id}`, { name: 'Taken over' })).status).toBe(404);
    expect((await post(as.outsider, `/api/specs/${spec.id}/duplicate`, {})).status).toBe(404);
    const theirs = (await (await as.outsider.fetch('/api/specs')).json()).specs;
    expect(theirs.some((s: { id: number }) => s.id === spec.id)).toBe(false);
    expect((await (await as.manager.fetch(`/api/specs/${spec.id}`)).json()).name).toBe(spec.name);
    expect((await as.manager.fetch('/api/specs/999999')).status).toBe(404);
  });
});

describe('editing a spec re-judges its sessions', () => {
  it('turns a 16-bit take from warn to fail when the spec asks for 20 bits, from the stored report', async () => {
    // A spec that accepts 16-bit audio, a session that uses it, and a take measured by the real analyzer.
    const { body: spec } = await post(as.manager, '/api/specs', { name: `Sixteen is fine ${unique()}`, thresholds: { minEffectiveBits: 16 } });
    const { body: session } = await post(as.manager, '/api/sessions', { title: `Rejudge ${unique()}`, deliverySpecId: spec.id });
    const report: AnalysisReport = await analyzeBuffer(sixteenBitTakeWav());
    expect(report.resolution.effectiveBits).toBe(16);
    const manager = await User.findOne({ where: { email: 'manager@demo.test' } });
    const fields = measuredFields(report, { ...DEFAULT_SPEC, ...spec.thresholds, name: spec.name });
    const take = await Take.create({
      studioId: manager!.studioId,
      sessionId: session.id,
      recorderId: null,
      uploadedById: manager!.id,
      originalName: 'scene-4-take-2.wav',
      storageKey: `rejudge-test/${unique()}${unique()}`,
      bytes: 1_000_000,
      sha256: unique().padEnd(64, 'a'),
      status: 'measured',
      measuredAt: new Date(),
      peaksKey: null,
      error: null,
      decidedById: null,
      decidedAt: null,
      decisionNote: null,
      ...fields,
    });
    const before = await (await as.manager.fetch(`/api/takes/${take.id}`)).json();
    expect(before.verdict).toBe('warn');
    expect(before.report.findings.some((f: { check: string; severity: string }) => f.check === 'resolution' && f.severity === 'fail')).toBe(false);

    const { status, body } = await patch(as.manager, `/api/specs/${spec.id}`, { thresholds: { minEffectiveBits: 20 } });
    expect(status).toBe(200);
    expect(body).toMatchObject({ rejudged: true, sessionCount: 1 });
    const after = await (await as.manager.fetch(`/api/takes/${take.id}`)).json();
    expect(after.verdict).toBe('fail');
    expect(after.report.findings.find((f: { check: string; severity: string }) => f.check === 'resolution' && f.severity === 'fail')).toBeDefined();
    // The measurement itself is untouched: only the judgement changed.
    expect(after.effectiveBits).toBe(16);
    expect(after.report.loudness.integratedLufs).toBe(before.report.loudness.integratedLufs);

    await patch(as.manager, `/api/specs/${spec.id}`, { thresholds: { minEffectiveBits: 16 } });
    expect((await (await as.manager.fetch(`/api/takes/${take.id}`)).json()).verdict).toBe('warn');
  });
});
