import { readFileSync, readdirSync, statSync } from 'node:fs';
import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { BASE_URL, signedInAll, type Client } from '../support/http';
import { DEFAULT_CONVERTER_THRESHOLDS } from '@/dsp/converter/thresholds';
import { makeWav, newSession, uploadTakes, waitForTake } from '../support/takes';

/**
 * Every route handler, every person: the exact status each one gets. A route file or method
 * without a row here fails the suite, so a new route cannot ship without its access rules.
 * Rows run in the order anonymous, outsider (a manager of another studio), engineer, producer, manager.
 */
type Persona = 'anonymous' | 'outsider' | 'engineer' | 'producer' | 'manager';
const PERSONAS: Persona[] = ['anonymous', 'outsider', 'engineer', 'producer', 'manager'];

interface Fixtures {
  sessionId: number;
  converterCheckId: number;
  takeId: number;
  recorderId: number;
  specId: number;
  inviteeId: number;
  deliveryId: number;
  outboxId: string;
  /** A pending take the engineer uploaded, one per person, for the removal row. */
  removable: Record<Persona, number>;
  /** A take whose file each person tries to replace. */
  replaceableId: number;
}

interface Row {
  path: (f: Fixtures, who: Persona) => string;
  body?: (f: Fixtures, who: Persona) => unknown;
  form?: (who: Persona) => FormData;
  /** An `application/x-www-form-urlencoded` body (next-auth's own forms). */
  urlencoded?: () => string;
  /** A resumable (tus 1.0.0) request: the creation of an upload, or a part of one. */
  tus?: 'create' | 'part';
  /** Runs before each person's request (e.g. to wait until a take is measured again). */
  before?: (f: Fixtures) => Promise<void>;
  expect: Record<Persona, number>;
}

// Collections answer 200 to a manager of another studio: they list that studio's own things.
const anyone = { anonymous: 401, outsider: 200, engineer: 200, producer: 200, manager: 200 };
const studioObject = { anonymous: 401, outsider: 404, engineer: 200, producer: 200, manager: 200 };
const managersOnly = { anonymous: 401, outsider: 200, engineer: 403, producer: 403, manager: 200 };
const managersObject = { anonymous: 401, outsider: 404, engineer: 403, producer: 403, manager: 200 };
// Converter checks: engineers and managers of the studio (capability converter:check).
const checkersObject = { anonymous: 401, outsider: 404, engineer: 200, producer: 403, manager: 200 };
let uniq = 0;
const unique = (who: Persona) => `${who}-${Date.now().toString(36)}-${uniq++}`;

const MATRIX: Record<string, Row> = {
  'GET /api/auth/[...nextauth]': { path: () => '/api/auth/csrf', expect: { anonymous: 200, outsider: 200, engineer: 200, producer: 200, manager: 200 } },
  // Without its CSRF token next-auth signs nobody out: it redirects to its confirmation step, whoever asks.
  'POST /api/auth/[...nextauth]': { path: () => '/api/auth/signout', urlencoded: () => 'callbackUrl=%2Fsignin', expect: { anonymous: 302, outsider: 302, engineer: 302, producer: 302, manager: 302 } },

  'GET /api/sessions': { path: () => '/api/sessions', expect: anyone },
  'POST /api/sessions': { path: () => '/api/sessions', body: (_f, who) => ({ title: `Matrix ${unique(who)}` }), expect: { anonymous: 401, outsider: 201, engineer: 201, producer: 403, manager: 201 } },
  'GET /api/sessions/[id]': { path: (f) => `/api/sessions/${f.sessionId}`, expect: studioObject },
  'PATCH /api/sessions/[id]': { path: (f) => `/api/sessions/${f.sessionId}`, body: () => ({ notes: 'Checked by the access matrix.' }), expect: studioObject },
  'GET /api/sessions/[id]/takes': { path: (f) => `/api/sessions/${f.sessionId}/takes`, expect: studioObject },
  'POST /api/sessions/[id]/takes': {
    path: (f) => `/api/sessions/${f.sessionId}/takes`,
    form: (who) => {
      const form = new FormData();
      form.append('file', new Blob([new Uint8Array(makeWav({ seconds: 0.2, seed: 4000 + PERSONAS.indexOf(who) }))]), `${who}.wav`);
      return form;
    },
    expect: { anonymous: 401, outsider: 404, engineer: 201, producer: 403, manager: 201 },
  },
  'POST /api/sessions/[id]/uploads': { path: (f) => `/api/sessions/${f.sessionId}/uploads`, tus: 'create', expect: { anonymous: 401, outsider: 404, engineer: 201, producer: 403, manager: 201 } },
  // An upload nobody started: the capability and the studio are checked before the upload is looked up.
  'PATCH /api/sessions/[id]/uploads/[uploadId]': { path: (f) => `/api/sessions/${f.sessionId}/uploads/${'0'.repeat(32)}`, tus: 'part', expect: { anonymous: 401, outsider: 404, engineer: 404, producer: 403, manager: 404 } },
  'DELETE /api/sessions/[id]/uploads/[uploadId]': { path: (f) => `/api/sessions/${f.sessionId}/uploads/${'0'.repeat(32)}`, tus: 'part', expect: { anonymous: 401, outsider: 404, engineer: 404, producer: 403, manager: 404 } },
  'GET /api/sessions/[id]/report': { path: (f) => `/api/sessions/${f.sessionId}/report`, expect: { anonymous: 401, outsider: 404, engineer: 403, producer: 200, manager: 200 } },
  'POST /api/sessions/[id]/report': {
    path: (f) => `/api/sessions/${f.sessionId}/report`,
    body: () => ({ to: ['matrix-reader@demo.test'], message: 'Access check.' }),
    expect: { anonymous: 401, outsider: 404, engineer: 403, producer: 202, manager: 202 },
  },
  'GET /api/sessions/[id]/report.pdf': { path: (f) => `/api/sessions/${f.sessionId}/report.pdf`, expect: studioObject },
  'GET /api/sessions/[id]/report.csv': { path: (f) => `/api/sessions/${f.sessionId}/report.csv`, expect: studioObject },

  'GET /api/takes/[id]': { path: (f) => `/api/takes/${f.takeId}`, expect: studioObject },
  // The engineer uploaded each of these takes and nobody has decided on them: the uploader or a manager may remove one.
  'DELETE /api/takes/[id]': { path: (f, who) => `/api/takes/${f.removable[who]}`, expect: { anonymous: 401, outsider: 404, engineer: 204, producer: 403, manager: 204 } },
  'POST /api/takes/[id]/remeasure': {
    path: (f) => `/api/takes/${f.takeId}/remeasure`,
    before: async (f) => void (await waitForTake(as.manager, f.takeId)),
    expect: { anonymous: 401, outsider: 404, engineer: 202, producer: 403, manager: 202 },
  },
  'PUT /api/takes/[id]/file': {
    path: (f) => `/api/takes/${f.replaceableId}/file`,
    form: (who) => {
      const form = new FormData();
      form.append('file', new Blob([new Uint8Array(makeWav({ seconds: 0.2, seed: 4200 + PERSONAS.indexOf(who) }))]), `replaced-by-${who}.wav`);
      return form;
    },
    before: async (f) => void (await waitForTake(as.manager, f.replaceableId)),
    expect: { anonymous: 401, outsider: 404, engineer: 200, producer: 403, manager: 200 },
  },
  'GET /api/takes/[id]/audio': { path: (f) => `/api/takes/${f.takeId}/audio`, expect: studioObject },
  'GET /api/takes/[id]/peaks': { path: (f) => `/api/takes/${f.takeId}/peaks`, expect: studioObject },
  'GET /api/takes/[id]/comments': { path: (f) => `/api/takes/${f.takeId}/comments`, expect: studioObject },
  'POST /api/takes/[id]/comments': { path: (f) => `/api/takes/${f.takeId}/comments`, body: () => ({ atSec: 0.1, body: 'Access check.' }), expect: { anonymous: 401, outsider: 404, engineer: 201, producer: 201, manager: 201 } },
  'POST /api/takes/[id]/decision': { path: (f) => `/api/takes/${f.takeId}/decision`, body: () => ({ decision: 'rejected', note: 'Access check.' }), expect: { anonymous: 401, outsider: 404, engineer: 403, producer: 200, manager: 200 } },

  'GET /api/recorders': { path: () => '/api/recorders', expect: managersOnly },
  'POST /api/recorders': { path: () => '/api/recorders', body: (_f, who) => ({ label: `Matrix ${unique(who)}` }), expect: { ...managersOnly, outsider: 201, manager: 201 } },
  'GET /api/recorders/[id]': { path: (f) => `/api/recorders/${f.recorderId}`, expect: managersObject },
  'PATCH /api/recorders/[id]': { path: (f) => `/api/recorders/${f.recorderId}`, body: () => ({ notes: 'Checked by the access matrix.' }), expect: managersObject },

  // The smallest signal there is (32 kHz, 16-bit mono), so each download stays short.
  'GET /api/recorders/[id]/converter-signal': { path: (f) => `/api/recorders/${f.recorderId}/converter-signal?rate=32000&bits=16&channels=1`, expect: checkersObject },
  'GET /api/recorders/[id]/converter-checks': { path: (f) => `/api/recorders/${f.recorderId}/converter-checks`, expect: checkersObject },
  'POST /api/recorders/[id]/converter-checks': {
    path: (f) => `/api/recorders/${f.recorderId}/converter-checks`,
    form: (who) => {
      const form = new FormData();
      form.append('file', new Blob([new Uint8Array(makeWav({ seconds: 0.2, seed: 4100 + PERSONAS.indexOf(who) }))]), `${who}-check.wav`);
      return form;
    },
    expect: { ...checkersObject, engineer: 201, manager: 201 },
  },
  'PUT /api/recorders/[id]/converter-thresholds': { path: (f) => `/api/recorders/${f.recorderId}/converter-thresholds`, body: () => ({ thresholds: DEFAULT_CONVERTER_THRESHOLDS }), expect: managersObject },
  'GET /api/converter-checks/[id]': { path: (f) => `/api/converter-checks/${f.converterCheckId}`, expect: checkersObject },
  // The fixture's recording holds no check signal, so even a manager cannot make it the baseline.
  'POST /api/converter-checks/[id]/baseline': { path: (f) => `/api/converter-checks/${f.converterCheckId}/baseline`, expect: { ...managersObject, manager: 409 } },

  'GET /api/specs': { path: () => '/api/specs', expect: managersOnly },
  'POST /api/specs': { path: () => '/api/specs', body: (_f, who) => ({ name: `Matrix ${unique(who)}` }), expect: { ...managersOnly, outsider: 201, manager: 201 } },
  'GET /api/specs/[id]': { path: (f) => `/api/specs/${f.specId}`, expect: managersObject },
  'PATCH /api/specs/[id]': { path: (f) => `/api/specs/${f.specId}`, body: () => ({ description: 'Checked by the access matrix.' }), expect: managersObject },
  'POST /api/specs/[id]/duplicate': { path: (f) => `/api/specs/${f.specId}/duplicate`, body: (_f, who) => ({ name: `Matrix copy ${unique(who)}` }), expect: { ...managersObject, manager: 201 } },

  'GET /api/fleet': { path: () => '/api/fleet?days=30', expect: managersOnly },
  'GET /api/fleet/[id]': { path: (f) => `/api/fleet/${f.recorderId}`, expect: managersObject },
  'PATCH /api/fleet/settings': { path: () => '/api/fleet/settings', body: () => ({ converterCheckIntervalDays: 90 }), expect: managersOnly },

  'GET /api/users': { path: () => '/api/users', expect: managersOnly },
  'POST /api/users': { path: () => '/api/users', body: (_f, who) => ({ email: `matrix-${unique(who)}@demo.test`, name: 'Matrix invitee', role: 'engineer' }), expect: { ...managersOnly, outsider: 201, manager: 201 } },
  'PATCH /api/users/[id]': { path: (f) => `/api/users/${f.inviteeId}`, body: () => ({ role: 'producer' }), expect: managersObject },
  'POST /api/users/[id]/invitation': { path: (f) => `/api/users/${f.inviteeId}/invitation`, expect: { ...managersObject, manager: 202 } },
  // The invitee has no password yet: a manager passes every guard and is told to resend the invitation instead.
  'POST /api/users/[id]/password-reset': { path: (f) => `/api/users/${f.inviteeId}/password-reset`, expect: { ...managersObject, manager: 409 } },
  // Needs no sign-in, only a valid invitation token: an unknown one is refused alike for everyone.
  // A new password too short to keep: refused before the current one is checked, so no sign-in failure is counted and nobody is signed out.
  'POST /api/account/password': { path: () => '/api/account/password', body: () => ({ current: 'not-checked', password: 'short', confirm: 'short' }), expect: { anonymous: 401, outsider: 400, engineer: 400, producer: 400, manager: 400 } },
  'POST /api/invitations/accept': { path: () => '/api/invitations/accept', body: () => ({ token: 'A'.repeat(43), password: 'long-enough-password' }), expect: { anonymous: 400, outsider: 400, engineer: 400, producer: 400, manager: 400 } },

  'POST /api/deliveries/[id]/retry': { path: (f) => `/api/deliveries/${f.deliveryId}/retry`, expect: { anonymous: 401, outsider: 404, engineer: 403, producer: 409, manager: 409 } },
  'GET /api/audit': { path: () => '/api/audit', expect: managersOnly },
  'GET /api/outbox': { path: () => '/api/outbox', expect: managersOnly },
  'GET /api/outbox/[id]': { path: (f) => `/api/outbox/${f.outboxId}`, expect: managersObject },
};

/** Every `METHOD /api/...` the app really serves, read from the route files. */
function discoverRoutes(): string[] {
  const found: string[] = [];
  const walk = (dir: string) => {
    for (const name of readdirSync(dir)) {
      const full = path.join(dir, name);
      if (statSync(full).isDirectory()) walk(full);
      else if (name === 'route.ts') {
        const source = readFileSync(full, 'utf8');
        const template = '/' + path.relative('app', path.dirname(full)).split(path.sep).join('/');
        const methods = new Set<string>();
        for (const m of source.matchAll(/export const (GET|POST|PUT|PATCH|DELETE)\b/g)) methods.add(m[1]);
        for (const m of source.matchAll(/export \{([^}]*)\}/g)) for (const n of m[1].matchAll(/as (GET|POST|PUT|PATCH|DELETE)\b/g)) methods.add(n[1]);
        for (const method of methods) found.push(`${method} ${template}`);
      }
    }
  };
  walk('app/api');
  return found.sort();
}

/** The headers and body of a resumable (tus) request: a creation names the file; a part carries ten bytes at offset 0. */
function tusRequest(kind: 'create' | 'part', method: string): { headers: Record<string, string>; body?: BodyInit } {
  if (kind === 'create') return { headers: { 'tus-resumable': '1.0.0', 'upload-length': '1000', 'upload-metadata': `filename ${Buffer.from('matrix.wav').toString('base64')}` } };
  if (method !== 'PATCH') return { headers: { 'tus-resumable': '1.0.0' } };
  return { headers: { 'tus-resumable': '1.0.0', 'upload-offset': '0', 'content-type': 'application/offset+octet-stream' }, body: new Uint8Array(10) };
}

/** The request a row sends: its body in the kind its route reads. */
function requestOf(row: Row, method: string, who: Persona): RequestInit & { json?: unknown } {
  const init: RequestInit & { json?: unknown } = { method };
  if (row.tus) Object.assign(init, tusRequest(row.tus, method));
  else if (row.form) init.body = row.form(who);
  else if (row.urlencoded) init.body = new URLSearchParams(row.urlencoded());
  else if (row.body) init.json = row.body(f, who);
  else if (method !== 'GET') init.json = {};
  return init;
}

let as: Record<Persona, Client>;
let f: Fixtures;

beforeAll(async () => {
  as = await signedInAll();
  const sessionId = await newSession(as.manager, 'Access matrix session');
  const { body } = await uploadTakes(as.engineer, sessionId, [{ name: 'matrix.wav', bytes: makeWav({ seconds: 1, seed: 3999 }) }]);
  const takeId = body.takes[0].id;
  await waitForTake(as.engineer, takeId);
  const removableUpload = await uploadTakes(
    as.engineer,
    sessionId,
    PERSONAS.map((who) => ({ name: `matrix-remove-${who}.wav`, bytes: makeWav({ seconds: 0.2, seed: 4100 + PERSONAS.indexOf(who) }) })),
  );
  const removableIds: number[] = removableUpload.body.takes.map((t: { id: number }) => t.id);
  for (const id of removableIds) await waitForTake(as.engineer, id);
  const removable = Object.fromEntries(PERSONAS.map((who, i) => [who, removableIds[i]])) as Record<Persona, number>;
  const replaceable = await uploadTakes(as.engineer, sessionId, [{ name: 'matrix-replace.wav', bytes: makeWav({ seconds: 0.2, seed: 4199 }) }]);
  const replaceableId: number = replaceable.body.takes[0].id;
  const post = async (client: Client, url: string, json: unknown) => (await client.fetch(url, { method: 'POST', json })).json();
  const recorder = await post(as.manager, '/api/recorders', { label: `Matrix fixture ${unique('manager')}`, makeModel: `Matrix model ${unique('manager')}` });
  const checkForm = new FormData();
  checkForm.append('file', new Blob([new Uint8Array(makeWav({ seconds: 0.5, seed: 4099 }))]), 'matrix-check.wav');
  const converterCheck = await (await as.engineer.fetch(`/api/recorders/${recorder.id}/converter-checks`, { method: 'POST', body: checkForm })).json();
  const spec = await post(as.manager, '/api/specs', { name: `Matrix fixture ${unique('manager')}` });
  const invited = await post(as.manager, '/api/users', { email: `matrix-fixture-${unique('manager')}@demo.test`, name: 'Matrix fixture', role: 'engineer' });
  const sent = await post(as.producer, `/api/sessions/${sessionId}/report`, { to: ['matrix-fixture@demo.test'] });
  const outbox = await (await as.manager.fetch('/api/outbox')).json();
  f = {
    sessionId,
    converterCheckId: converterCheck.id,
    takeId,
    recorderId: recorder.id,
    specId: spec.id,
    inviteeId: invited.member.id,
    deliveryId: sent.delivery.id,
    outboxId: outbox.messages?.[0]?.id ?? outbox[0]?.id,
    removable,
    replaceableId,
  };
  for (const [k, v] of Object.entries(f)) if (v === undefined || v === null) throw new Error(`Fixture ${k} could not be made`);
});

describe('access matrix', () => {
  it('has a row for every route handler and method, and no row for a route that does not exist', () => {
    const served = discoverRoutes();
    expect(served.filter((r) => !(r in MATRIX)), 'routes without a row').toEqual([]);
    expect(Object.keys(MATRIX).filter((r) => !served.includes(r)), 'rows without a route').toEqual([]);
  });

  for (const [route, row] of Object.entries(MATRIX)) {
    it(`${route}: ${PERSONAS.map((p) => `${p} ${row.expect[p]}`).join(', ')}`, async () => {
      const method = route.split(' ')[0];
      const got: Record<string, number> = {};
      for (const who of PERSONAS) {
        await row.before?.(f);
        const response = await as[who].fetch(row.path(f, who), requestOf(row, method, who));
        got[who] = response.status;
        await response.arrayBuffer();
      }
      expect(got).toEqual(row.expect);
    });
  }
});

/**
 * Every state-changing route, for a signed-out visitor and for the person allowed the most: a
 * request another site's page could make (a foreign or missing Origin, `Sec-Fetch-Site` other than
 * same-origin) is refused with 403, a body of another kind than the route reads with 415, and a
 * body over the limit with 413 — before the route does anything.
 */
describe('access matrix: changes come only from Takeproof’s own pages', () => {
  const own = new URL(BASE_URL).origin;
  const otherPort = `http://127.0.0.1:${Number(new URL(BASE_URL).port) + 1}`;
  const bigJson = JSON.stringify({ notes: 'x'.repeat(400 * 1024) });

  for (const [route, row] of Object.entries(MATRIX)) {
    const method = route.split(' ')[0];
    if (method === 'GET') continue;
    it(`${route}: foreign or missing Origin 403, cross-site 403, wrong body type 415, oversized body 413`, async () => {
      const got: Record<string, number> = {};
      for (const who of ['anonymous', 'manager'] as const) {
        // The body the route reads, sent with plain fetch: the test client would add the page's Origin itself.
        const proper = (): { body?: BodyInit; type?: string } => {
          if (row.tus) {
            const { headers, body } = tusRequest(row.tus, method);
            return { body, type: headers['content-type'] };
          }
          if (row.form) return { body: row.form(who) };
          if (row.urlencoded) return { body: row.urlencoded(), type: 'application/x-www-form-urlencoded' };
          return { body: JSON.stringify(row.body ? row.body(f, who) : {}), type: 'application/json' };
        };
        const send = async (label: string, headers: Record<string, string>, body?: string) => {
          const { body: properBody, type } = proper();
          const response = await fetch(BASE_URL + row.path(f, who), {
            method,
            redirect: 'manual',
            headers: { ...(type ? { 'content-type': type } : {}), cookie: as[who].cookieHeader(), ...headers },
            body: body ?? properBody,
          });
          got[`${who} ${label}`] = response.status;
          await response.arrayBuffer();
        };
        await send('origin on another port', { origin: otherPort });
        await send('origin of another site', { origin: 'https://takeproof-lookalike.demo.test' });
        await send('origin null', { origin: 'null' });
        await send('no origin', {});
        await send('cross-site fetch', { origin: own, 'sec-fetch-site': 'cross-site' });
        await send('same-site fetch', { origin: own, 'sec-fetch-site': 'same-site' });
        await send('text/plain body', { origin: own, 'content-type': 'text/plain' }, '{}');
        if (!row.urlencoded) await send('form body', { origin: own, 'content-type': 'application/x-www-form-urlencoded' }, 'a=1');
        if (row.form || row.tus === 'part') await send('JSON body', { origin: own, 'content-type': 'application/json' }, '{}');
        else await send('oversized body', { origin: own, 'content-type': row.urlencoded ? 'application/x-www-form-urlencoded' : 'application/json' }, bigJson);
      }
      const expected = Object.fromEntries(
        Object.keys(got).map((k) => [k, /origin|cross-site|same-site/.test(k) ? 403 : /oversized/.test(k) ? 413 : 415]),
      );
      expect(got).toEqual(expected);
    });
  }
});
