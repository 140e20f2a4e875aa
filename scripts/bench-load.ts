// Load drill on loopback: 20 people browsing session and take pages while 4 uploads of 200 MB run.
// Bounded in count and time; prints errors, p95 latency and whether every uploaded byte arrived.
// Run with `npm run bench:load` (it starts its own Takeproof).
import autocannon from 'autocannon';
import { Client, DEMO } from '../tests/support/http';
import { streamGeneratedUpload } from '../tests/support/streamUpload';
import { makeWav } from '../tests/support/takes';

const base = process.env.TAKEPROOF_TEST_URL!;
const UPLOADS = 4;
const UPLOAD_BYTES = 200 * 1024 * 1024;
const CONNECTIONS = 20;
const MAX_SECONDS = 120;
const MAX_REQUESTS = 200_000;

const engineer = new Client(base);
await engineer.signIn(DEMO.engineer);
const producer = new Client(base);
await producer.signIn(DEMO.producer);
const session = await (await engineer.fetch('/api/sessions', { method: 'POST', json: { title: 'Load drill' } })).json();
const form = new FormData();
form.append('file', new Blob([new Uint8Array(makeWav({ seconds: 5, seed: 5150 }))]), 'browse-me.wav');
const seeded = await (await engineer.fetch(`/api/sessions/${session.id}/takes`, { method: 'POST', body: form })).json();
const takeId = seeded.takes[0].id;

const latencies: number[] = [];
const statuses = new Map<number, number>();
let finishBrowsing: (result: autocannon.Result) => void = () => undefined;
const browsingDone = new Promise<autocannon.Result>((resolve) => (finishBrowsing = resolve));
const browsing = autocannon(
  {
  url: base,
  connections: CONNECTIONS,
  duration: MAX_SECONDS,
  amount: MAX_REQUESTS,
  headers: { cookie: producer.cookieHeader() },
  requests: [
    { method: 'GET', path: '/api/sessions' },
    { method: 'GET', path: `/api/sessions/${session.id}/takes` },
    { method: 'GET', path: `/api/takes/${takeId}` },
    { method: 'GET', path: `/sessions/${session.id}` },
    { method: 'GET', path: `/takes/${takeId}` },
  ],
  },
  (error, result) => {
    if (error) throw error;
    finishBrowsing(result);
  },
);
browsing.on('response', (_client: unknown, statusCode: number, _bytes: number, responseTime: number) => {
  latencies.push(responseTime);
  statuses.set(statusCode, (statuses.get(statusCode) ?? 0) + 1);
});
const started = Date.now();
const uploads = await Promise.all(Array.from({ length: UPLOADS }, (_, i) => streamGeneratedUpload(engineer, base, session.id, UPLOAD_BYTES, `load-${i}.wav`, i + 1)));
const uploadSeconds = (Date.now() - started) / 1000;
// Keep browsing a little past the uploads, then stop: the drill is bounded in time either way.
await new Promise((r) => setTimeout(r, 2000));
browsing.stop();
const result = await browsingDone;

latencies.sort((a, b) => a - b);
const pct = (p: number) => latencies[Math.min(latencies.length - 1, Math.floor((p / 100) * latencies.length))];
const ok = [...statuses].filter(([s]) => s >= 200 && s < 300).reduce((n, [, c]) => n + c, 0);
const notOk = latencies.length - ok;
console.log(`browsing: ${latencies.length} requests from ${CONNECTIONS} connections, ${result.errors} connection errors, ${notOk} non-2xx (${JSON.stringify(Object.fromEntries(statuses))})`);
console.log(`latency: p50 ${pct(50).toFixed(0)} ms, p95 ${pct(95).toFixed(0)} ms, p99 ${pct(99).toFixed(0)} ms, max ${latencies.at(-1)!.toFixed(0)} ms`);
console.log(`uploads: ${UPLOADS} × ${UPLOAD_BYTES / 1024 ** 2} MiB in ${uploadSeconds.toFixed(1)} s; ${uploads.filter((u) => u.status === 201 && u.sent === u.stored).length}/${UPLOADS} stored byte-for-byte (SHA-256 of stored = sent)`);
process.exitCode = result.errors === 0 && notOk === 0 && uploads.every((u) => u.status === 201 && u.sent === u.stored) ? 0 : 1;
