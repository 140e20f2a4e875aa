import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { REASON_MAX_LENGTH } from '@/dsp';
import { db } from '@/lib/db/connection.server';
import { checkStorage } from '@/lib/storage/check.server';
import { storage } from '@/lib/storage/storage.server';
import { Take } from '@/models';
import { BASE_URL, signedInAll, type Client, type DemoPerson } from '../support/http';
import { createSession, hotInterviewTake, uploadTake, waitMeasured } from '../support/reviewTakes';
import { makeWav } from '../support/takes';

// State-changing requests name the app's own origin, as its pages do.
const ORIGIN = { origin: BASE_URL };

let as: Record<DemoPerson | 'anonymous', Client>;
let sessionId: number;
let clippedId: number;
let quietId: number;

/** RFC 4180 rows (quoted fields may hold commas, quotes and line breaks). */
function parseCsv(text: string): string[][] {
  const rows: string[][] = [];
  let row: string[] = [];
  let field = '';
  let quoted = false;
  for (let i = 0; i < text.length; i++) {
    const c = text[i];
    if (quoted && c === '"' && text[i + 1] === '"') {
      field += '"';
      i++;
    } else if (c === '"') {
      quoted = !quoted;
    } else if (!quoted && c === ',') {
      row.push(field);
      field = '';
    } else if (!quoted && c === '\n') {
      row.push(field.replace(/\r$/, ''));
      rows.push(row);
      row = [];
      field = '';
    } else {
      field += c;
    }
  }
  return rows;
}

beforeAll(async () => {
  db(); // the models, on the test database
  as = await signedInAll();
  sessionId = await createSession(as.engineer, 'Reasons and removals — harbour pickups');
  clippedId = await uploadTake(as.engineer, sessionId, 'harbour-pickup-hot.wav', hotInterviewTake(301));
  quietId = await uploadTake(as.engineer, sessionId, 'harbour-room-tone.wav', makeWav({ seconds: 2, seed: 302, amplitude: 0.05 }));
  await waitMeasured(as.engineer, clippedId);
  await waitMeasured(as.engineer, quietId);
}, 150_000);

afterAll(async () => {
  await db().close();
});

describe('the reason beside every verdict', () => {
  it('names clipping as the reason a take that clips at full scale fails, in the take API', async () => {
    const take = await (await as.producer.fetch(`/api/takes/${clippedId}`)).json();
    expect(take.verdict).toBe('fail');
    expect(take.reason).toMatch(/clip/i);
    expect(take.reason.length).toBeLessThanOrEqual(REASON_MAX_LENGTH);
  });

  it('lists each take with its reason, worst verdict first, in the session takes API', async () => {
    const { takes } = await (await as.producer.fetch(`/api/sessions/${sessionId}/takes`)).json();
    const rank = { fail: 0, warn: 1, pass: 2 } as Record<string, number>;
    const ranks = takes.map((t: { verdict: string }) => rank[t.verdict]);
    expect(ranks).toEqual([...ranks].sort((a, b) => a - b));
    for (const t of takes as { verdict: string; reason: string | null }[]) {
      // A pass carries no reason; a warning or failure always says why.
      if (t.verdict === 'pass') expect(t.reason).toBeNull();
      else expect(t.reason).toMatch(/\w/);
    }
    expect(takes.find((t: { id: number }) => t.id === clippedId).reason).toMatch(/clip/i);
  });

  it('writes the reason into the CSV’s Reason column', async () => {
    const rows = parseCsv((await (await as.producer.fetch(`/api/sessions/${sessionId}/report.csv`)).text()).replace(/^\ufeff/, ''));
    const reason = rows[0].indexOf('Reason');
    expect(reason).toBe(rows[0].indexOf('Verdict') + 1);
    const clipped = rows.find((r) => r[0] === 'harbour-pickup-hot.wav')!;
    expect(clipped[reason]).toMatch(/clip/i);
  });

  it('keeps the reason in step when the session is judged against another delivery spec', async () => {
    const before = await (await as.producer.fetch(`/api/takes/${quietId}`)).json();
    expect(before.reason ?? '').not.toMatch(/44\.1 kHz/);
    const create = await as.manager.fetch('/api/specs', { method: 'POST', headers: ORIGIN, json: { name: `Reasons at 44.1 kHz ${Date.now()}`, thresholds: { requiredSampleRate: 44100 } } });
    expect(create.status).toBe(201);
    const spec = await create.json();
    const patch = await as.manager.fetch(`/api/sessions/${sessionId}`, { method: 'PATCH', headers: ORIGIN, json: { deliverySpecId: spec.id } });
    expect(patch.status).toBe(200);
    // The 48 kHz take against a spec that asks for 44.1 kHz: a wrong rate outranks the loudness and noise findings.
    const after = await (await as.producer.fetch(`/api/takes/${quietId}`)).json();
    expect(after.verdict).toBe('fail');
    expect(after.reason).toMatch(/44\.1 kHz/);
    const stored = await Take.findByPk(quietId, { attributes: ['reason'], rejectOnEmpty: true });
    expect(stored.reason).toBe(after.reason);
    // Clipping still outranks the rate.
    expect((await (await as.producer.fetch(`/api/takes/${clippedId}`)).json()).reason).toMatch(/clip/i);
  });
});

describe('DELETE /api/takes/:id', () => {
  it('is refused to a producer (403) and to another studio (404), and the take stays', async () => {
    expect((await as.producer.fetch(`/api/takes/${quietId}`, { method: 'DELETE', headers: ORIGIN })).status).toBe(403);
    expect((await as.outsider.fetch(`/api/takes/${quietId}`, { method: 'DELETE', headers: ORIGIN })).status).toBe(404);
    expect((await as.anonymous.fetch(`/api/takes/${quietId}`, { method: 'DELETE', headers: ORIGIN })).status).toBe(401);
    expect((await as.engineer.fetch(`/api/takes/${quietId}`)).status).toBe(200);
  });

  it('removes the take, its stored file and its waveform file, audits it, and lets the same file in again', async () => {
    const bytes = hotInterviewTake(303, 3);
    const id = await uploadTake(as.engineer, sessionId, 'harbour-mistake.wav', bytes);
    await waitMeasured(as.engineer, id);
    const row = await Take.findByPk(id, { attributes: ['storageKey', 'peaksKey'], rejectOnEmpty: true });
    expect(row.peaksKey).toBeTruthy();

    const removed = await as.engineer.fetch(`/api/takes/${id}`, { method: 'DELETE', headers: ORIGIN });
    expect(removed.status).toBe(204);
    expect((await as.engineer.fetch(`/api/takes/${id}`)).status).toBe(404);
    expect(await storage().stat(row.storageKey)).toBeNull();
    expect(await storage().stat(row.peaksKey!)).toBeNull();
    const check = await checkStorage();
    expect(check.filesWithoutRows).not.toContain(row.storageKey);
    expect(check.filesWithoutRows).not.toContain(row.peaksKey);

    const audit = await (await as.manager.fetch('/api/audit?action=take.remove')).json();
    expect(JSON.stringify(audit)).toContain('harbour-mistake.wav');

    const again = await uploadTake(as.engineer, sessionId, 'harbour-mistake.wav', bytes);
    expect(again).not.toBe(id);
  });

  it('lets the uploader remove a take only before anyone decides on it; a manager still can', async () => {
    const id = await uploadTake(as.engineer, sessionId, 'harbour-decided.wav', makeWav({ seconds: 1, seed: 304 }));
    await waitMeasured(as.engineer, id);
    const decided = await as.producer.fetch(`/api/takes/${id}/decision`, { method: 'POST', headers: ORIGIN, json: { decision: 'rejected', note: 'Wrong microphone.' } });
    expect(decided.status).toBe(200);
    const refused = await as.engineer.fetch(`/api/takes/${id}`, { method: 'DELETE', headers: ORIGIN });
    expect(refused.status).toBe(403);
    expect((await refused.json()).message).not.toMatch(/\d{3,}/);
    expect((await as.manager.fetch(`/api/takes/${id}`, { method: 'DELETE', headers: ORIGIN })).status).toBe(204);
  });

  it('replaces a take’s file: same take, comments and history kept, the new file measured, the old files deleted', async () => {
    const id = await uploadTake(as.engineer, sessionId, 'harbour-wrong-file.wav', hotInterviewTake(305, 3));
    await waitMeasured(as.engineer, id);
    const old = await Take.findByPk(id, { attributes: ['storageKey', 'peaksKey'], rejectOnEmpty: true });
    const comment = await as.producer.fetch(`/api/takes/${id}/comments`, { method: 'POST', headers: ORIGIN, json: { atSec: 1, body: 'Is this the right file?' } });
    expect(comment.status).toBe(201);

    const form = new FormData();
    form.append('file', new Blob([new Uint8Array(makeWav({ seconds: 1, seed: 306, amplitude: 0.05 }))], { type: 'audio/wav' }), 'harbour-right-file.wav');
    const replaced = await as.engineer.fetch(`/api/takes/${id}/file`, { method: 'PUT', headers: ORIGIN, body: form });
    expect(replaced.status).toBe(200);
    const body = await replaced.json();
    expect(body.id).toBe(id);
    expect(body.originalName).toBe('harbour-right-file.wav');

    const measured = await waitMeasured(as.engineer, id);
    expect(measured.durationSec).toBeCloseTo(1, 2);
    expect(measured.reason ?? '').not.toMatch(/clip/i);
    const { comments } = await (await as.producer.fetch(`/api/takes/${id}/comments`)).json();
    expect(comments.map((c: { body: string }) => c.body)).toContain('Is this the right file?');
    expect(await storage().stat(old.storageKey)).toBeNull();
    expect(await storage().stat(old.peaksKey!)).toBeNull();
  });

  it('measures a take again on request, and it comes back with its verdict and reason', async () => {
    const response = await as.engineer.fetch(`/api/takes/${clippedId}/remeasure`, { method: 'POST', headers: ORIGIN });
    expect(response.status).toBe(202);
    const take = await waitMeasured(as.engineer, clippedId);
    expect(take.verdict).toBe('fail');
    expect(take.reason).toMatch(/clip/i);
  });
});
