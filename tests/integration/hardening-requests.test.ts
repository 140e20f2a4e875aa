import http from 'node:http';
import { readFileSync, readdirSync, readlinkSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { BASE_URL, signedIn, type Client } from '../support/http';
import { testDb } from '../support/people';
import { makeWav, newSession, uploadTakes } from '../support/takes';

/**
 * Requests another site's page could make, bodies without end, file handles left open, odd
 * addresses, cookies and text: each refused quickly with a plain answer, and nothing changed.
 */
const OWN_ORIGIN = new URL(BASE_URL).origin;
const SERVER_PID = Number(process.env.TAKEPROOF_SERVER_PID);
const SERVER_LOG = path.join(process.env.TAKEPROOF_TEST_DIR ?? 'var/test', 'server.log');

let engineer: Client;
let manager: Client;
let sessionId: number;
let takeId: number;
let storageKey: string;

beforeAll(async () => {
  [engineer, manager] = await Promise.all([signedIn('engineer'), signedIn('manager')]);
  sessionId = await newSession(engineer, `Hardening ${Date.now()}`);
  const { status, body } = await uploadTakes(engineer, sessionId, [{ name: 'hardening.wav', bytes: makeWav({ seconds: 3, seed: 7001 }) }]);
  expect(status).toBe(201);
  takeId = body.takes[0].id;
  [{ storageKey }] = await testDb.query('SELECT storageKey FROM takes WHERE id = ?', [takeId]);
});
afterAll(async () => {
  await testDb.end();
});

const sessionTitles = async () => ((await (await manager.fetch('/api/sessions')).json()).sessions as { title: string }[]).map((s) => s.title);

describe('writes only from Takeproof’s own pages', () => {
  it('changes nothing for a foreign Origin, a text/plain body or a form body', async () => {
    const title = `Cross-site ${Date.now()}`;
    const foreign = await manager.fetch('/api/sessions', { method: 'POST', json: { title }, headers: { origin: 'http://127.0.0.1:1' } });
    expect(foreign.status).toBe(403);
    expect((await foreign.json()).error).toBe('forbidden:origin');
    const plain = await manager.fetch('/api/sessions', { method: 'POST', headers: { 'content-type': 'text/plain' }, body: JSON.stringify({ title }) });
    expect(plain.status).toBe(415);
    const form = await manager.fetch('/api/users', { method: 'POST', headers: { 'content-type': 'application/x-www-form-urlencoded' }, body: `email=cross-site-${Date.now()}%40demo.test&name=X&role=manager` });
    expect(form.status).toBe(415);
    expect(await sessionTitles()).not.toContain(title);
    const report = await manager.fetch(`/api/sessions/${sessionId}/report`, { method: 'POST', json: { to: ['cross-site-reader@demo.test'] }, headers: { 'sec-fetch-site': 'same-site' } });
    expect(report.status).toBe(403);
    expect((await (await manager.fetch(`/api/sessions/${sessionId}/report`)).json()).deliveries).toEqual([]);
  });
});

/**
 * Declares a body of `declared` bytes (or none, chunked), sends only the first `sent` bytes and then
 * waits, never finishing the body: an answer can only come from a server that refuses without
 * reading the rest. Resolves with the status.
 */
function postUnfinishedBody(pathname: string, contentType: string, declared: number | null, sent: number, cookie = ''): Promise<number> {
  return new Promise((resolve, reject) => {
    const headers: Record<string, string | number> = { origin: OWN_ORIGIN, 'content-type': contentType, cookie };
    if (declared !== null) headers['content-length'] = declared;
    const request = http.request(new URL(pathname, BASE_URL), { method: 'POST', headers, agent: false });
    let answered = false;
    request.on('response', (response) => {
      answered = true;
      resolve(response.statusCode ?? 0);
      response.resume();
      request.destroy();
    });
    request.on('error', (error) => (answered ? undefined : reject(error)));
    const chunk = Buffer.alloc(16 * 1024, 0x61);
    chunk[0] = 0x7b; // `{`, so the body starts like JSON
    for (let written = 0; written < sent; written += chunk.length) request.write(chunk);
  });
}

const rssKb = () => Number(/VmRSS:\s+(\d+)/.exec(readFileSync(`/proc/${SERVER_PID}/status`, 'utf8'))?.[1] ?? 0);

describe('bounded bodies', () => {
  it('answers 413 to a 50 MB JSON body before the body is sent, signed in or signing in', async () => {
    const rssBefore = rssKb();
    const fiftyMb = 50 * 1024 * 1024;
    // Only 64 KiB of the declared 50 MB is ever sent.
    expect(await postUnfinishedBody(`/api/sessions/${sessionId}/report`, 'application/json', fiftyMb, 64 * 1024, manager.cookieHeader())).toBe(413);
    expect(await postUnfinishedBody('/api/auth/callback/credentials', 'application/x-www-form-urlencoded', fiftyMb, 64 * 1024)).toBe(413);
    // A chunked body names no length: it is refused once it passes the limit (256 KiB), unfinished.
    expect(await postUnfinishedBody('/api/sessions', 'application/json', null, 320 * 1024, manager.cookieHeader())).toBe(413);
    console.log(`Web server RSS around the oversized bodies: ${Math.round(rssBefore / 1024)} MB before, ${Math.round(rssKb() / 1024)} MB after`);
  });
});

/** How many of the web server's file descriptors are open on this take's stored file (/proc/<pid>/fd). */
function handlesOnTake(): number {
  const dir = `/proc/${SERVER_PID}/fd`;
  let count = 0;
  for (const fd of readdirSync(dir)) {
    try {
      if (readlinkSync(path.join(dir, fd)).endsWith(storageKey)) count++;
    } catch {
      // closed while we looked
    }
  }
  return count;
}

async function settlesAt(expected: number, timeoutMs = 15_000): Promise<number> {
  const until = Date.now() + timeoutMs;
  let now = handlesOnTake();
  while (now !== expected && Date.now() < until) {
    await new Promise((r) => setTimeout(r, 100));
    now = handlesOnTake();
  }
  return now;
}

describe('take audio leaves no file open', () => {
  it('keeps the open-file count of the web server where it was after 300 HEADs and 50 GETs dropped before their body', async () => {
    const audio = `${BASE_URL}/api/takes/${takeId}/audio`;
    const totalBefore = readdirSync(`/proc/${SERVER_PID}/fd`).length;
    expect(await settlesAt(0)).toBe(0);
    for (let round = 0; round < 30; round++) {
      const heads = await Promise.all(Array.from({ length: 10 }, () => fetch(audio, { method: 'HEAD', headers: { cookie: engineer.cookieHeader() } })));
      expect(heads.map((h) => h.status)).toEqual(Array(10).fill(200));
    }
    expect(await settlesAt(0)).toBe(0);
    for (let i = 0; i < 50; i++) {
      await new Promise<void>((resolve, reject) => {
        const request = http.get(audio, { headers: { cookie: engineer.cookieHeader() }, agent: false }, (response) => {
          expect(response.statusCode).toBe(200);
          response.destroy();
          resolve();
        });
        request.on('error', (error) => (request.destroyed ? resolve() : reject(error)));
      });
    }
    expect(await settlesAt(0)).toBe(0);
    console.log(`Web server open files: ${totalBefore} before, ${readdirSync(`/proc/${SERVER_PID}/fd`).length} after 300 HEADs and 50 dropped GETs`);
  });

  it('never lets an answer be kept by a cache: authenticated JSON, audio and errors carry no-store', async () => {
    for (const url of ['/api/sessions', `/api/takes/${takeId}`, `/api/takes/${takeId}/audio`, '/api/takes/999999999']) {
      const response = await engineer.fetch(url);
      await response.arrayBuffer();
      expect(response.headers.get('cache-control'), url).toBe('no-store');
    }
  });
});

describe('odd addresses, cookies and text', () => {
  it('answers a signed-in request with an over-long address 414, and one just under the limit normally', async () => {
    const long = await engineer.fetch(`/api/sessions?pad=${'a'.repeat(9000)}`);
    expect(long.status).toBe(414);
    expect(await long.text()).toMatch(/longer than Takeproof reads/);
    expect((await engineer.fetch(`/sessions?pad=${'a'.repeat(9000)}`)).status).toBe(414);
    // Just under the limit, an API answer and a page are served as usual.
    expect((await engineer.fetch(`/api/sessions?pad=${'a'.repeat(7900)}`)).status).toBe(200);
    expect((await engineer.fetch(`/sessions?pad=${'a'.repeat(7900)}`)).status).toBe(200);
  });

  it('logs a forged session cookie in one line, without a stack trace', async () => {
    const marker = `forged-${Date.now()}`;
    const response = await fetch(`${BASE_URL}/api/sessions`, { headers: { cookie: `next-auth.session-token=${marker}` } });
    expect(response.status).toBe(401);
    const until = Date.now() + 10_000;
    let lines: string[] = [];
    let at = -1;
    while (at < 0 && Date.now() < until) {
      lines = readFileSync(SERVER_LOG, 'utf8').split('\n');
      at = lines.findLastIndex((l) => l.startsWith('Sign-in: JWT_SESSION_ERROR'));
      if (at < 0) await new Promise((r) => setTimeout(r, 100));
    }
    expect(at, 'a one-line entry for the forged cookie').toBeGreaterThanOrEqual(0);
    expect(lines[at + 1] ?? '').not.toMatch(/^\s+at /);
    expect(readFileSync(SERVER_LOG, 'utf8')).not.toContain(marker);
  });

  it('answers half an emoji in a text field with 400 and a plain message', async () => {
    for (const [url, method, json] of [
      ['/api/sessions', 'POST', { title: 'Scene \ud83c' }],
      [`/api/sessions/${sessionId}`, 'PATCH', { notes: '\udfb6 tail half only' }],
      [`/api/takes/${takeId}/comments`, 'POST', { atSec: 0.5, body: 'cut \ud83c' }],
    ] as const) {
      const response = await manager.fetch(url, { method, json });
      expect(response.status, url).toBe(400);
      expect(await response.json()).toEqual({ error: 'invalid:text', message: 'Some text holds a broken character (half of an emoji or other symbol). Remove it and try again.' });
    }
  });

  it('keeps a file name cut inside an emoji at the length limit as whole characters', async () => {
    const name = `${'a'.repeat(511)}🎙.wav`;
    const { status, body } = await uploadTakes(engineer, sessionId, [{ name, bytes: makeWav({ seconds: 0.5, seed: 7002 }) }]);
    expect(status).toBe(201);
    expect(body.takes[0].originalName).toBe(`${'a'.repeat(511)}🎙`);
  });
});

describe('downloads of a take', () => {
  it('are always named .wav, without bidirectional or control characters', async () => {
    const { status, body } = await uploadTakes(engineer, sessionId, [
      { name: 'mixdown.html', bytes: makeWav({ seconds: 0.5, seed: 7003 }) },
      { name: 'interview\u202Evaw.bat', bytes: makeWav({ seconds: 0.5, seed: 7004 }) },
    ]);
    expect(status).toBe(201);
    const names: string[] = [];
    for (const take of body.takes as { id: number; originalName: string }[]) {
      expect(take.originalName).not.toMatch(/[\u202a-\u202e\u2066-\u2069]/);
      const response = await engineer.fetch(`/api/takes/${take.id}/audio?download=1`);
      await response.arrayBuffer();
      names.push(response.headers.get('content-disposition') ?? '');
    }
    expect(names).toEqual([
      `attachment; filename="mixdown.wav"; filename*=UTF-8''mixdown.wav`,
      `attachment; filename="interviewvaw.wav"; filename*=UTF-8''interviewvaw.wav`,
    ]);
  });
});
