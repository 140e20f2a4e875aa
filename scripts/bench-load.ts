// Load drill on loopback: 20 people browsing session and take pages while 4 uploads of 200 MB run.
// Bounded in count and time; prints errors, p95 latency and whether every uploaded byte arrived.
// Run with `npm run bench:load` (it starts its own Takeproof).
import autocannon from 'autocannon';
import { createHash } from 'node:crypto';
import http from 'node:http';
import { Client, DEMO } from '../tests/support/http';
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

/** Streams one generated WAV of `bytes` to the upload route; resolves with the sent and stored SHA-256. */
function upload(index: number): Promise<{ sent: string; stored: string | undefined; status: number }> {
  const boundary = `takeproofload${index}`;
  const head = Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="load-${index}.wav"\r\nContent-Type: audio/wav\r\n\r\n`);
  const tail = Buffer.from(`\r\n--${boundary}--\r\n`);
  const wavHead = makeWav({ seconds: 0 }).subarray(0, 44);
  const dataBytes = UPLOAD_BYTES - 44 - ((UPLOAD_BYTES - 44) % 6);
  wavHead.writeUInt32LE(36 + dataBytes, 4);
  wavHead.writeUInt32LE(dataBytes, 40);
  const chunk = Buffer.alloc(1024 * 1024);
  for (let i = 0; i < chunk.length; i++) chunk[i] = ((i + index * 7919) * 2654435761) >>> 24;
  const hash = createHash('sha256').update(wavHead);
  return new Promise((resolve, reject) => {
    const request = http.request(new URL(`/api/sessions/${session.id}/takes`, base), {
      method: 'POST',
      headers: { cookie: engineer.cookieHeader(), 'content-type': `multipart/form-data; boundary=${boundary}`, 'content-length': head.length + 44 + dataBytes + tail.length },
    });
    request.on('response', (res) => {
      let body = '';
      res.on('data', (d) => (body += d));
      res.on('end', () => resolve({ sent: hash.digest('hex'), stored: JSON.parse(body).takes?.[0]?.sha256, status: res.statusCode ?? 0 }));
    });
    request.on('error', reject);
    request.write(head);
    request.write(wavHead);
    let sent = 0;
    const pump = () => {
      while (sent < dataBytes) {
        const piece = dataBytes - sent >= chunk.length ? chunk : chunk.subarray(0, dataBytes - sent);
        hash.update(piece);
        sent += piece.length;
        if (!request.write(piece)) return void request.once('drain', pump);
      }
      request.end(tail);
    };
    pump();
  });
}

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
const uploads = await Promise.all(Array.from({ length: UPLOADS }, (_, i) => upload(i)));
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
