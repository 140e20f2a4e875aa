// Uploads one generated 2 GB take through the real upload route and samples the web server's
// memory while it streams. Run with `npm run bench:upload` (it starts its own Takeproof).
//   BENCH_UPLOAD_BYTES=…  size of the take (default 2 GiB)
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import http from 'node:http';
import { Client, DEMO } from '../tests/support/http';

const total = Number(process.env.BENCH_UPLOAD_BYTES ?? 2 * 1024 ** 3);
const serverPid = Number(process.env.TAKEPROOF_SERVER_PID);
const base = process.env.TAKEPROOF_TEST_URL!;

function rssMb(pid: number): number {
  const status = readFileSync(`/proc/${pid}/status`, 'utf8');
  return Number(/VmRSS:\s+(\d+)/.exec(status)![1]) / 1024;
}

/** A 48 kHz stereo 24-bit WAV header for `dataBytes` of audio. */
function wavHeader(dataBytes: number): Buffer {
  const h = Buffer.alloc(44);
  h.write('RIFF', 0, 'latin1');
  h.writeUInt32LE(Math.min(0xffffffff, 36 + dataBytes), 4);
  h.write('WAVEfmt ', 8, 'latin1');
  h.writeUInt32LE(16, 16);
  h.writeUInt16LE(1, 20);
  h.writeUInt16LE(2, 22);
  h.writeUInt32LE(48000, 24);
  h.writeUInt32LE(48000 * 6, 28);
  h.writeUInt16LE(6, 32);
  h.writeUInt16LE(24, 34);
  h.write('data', 36, 'latin1');
  h.writeUInt32LE(dataBytes, 40);
  return h;
}

const client = new Client(base);
await client.signIn(DEMO.engineer);
const session = await (await client.fetch('/api/sessions', { method: 'POST', json: { title: 'Upload benchmark' } })).json();

const dataBytes = total - 44 - ((total - 44) % 6);
const boundary = 'takeproofbench';
const head = Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="two-gigabyte-take.wav"\r\nContent-Type: audio/wav\r\n\r\n`);
const tail = Buffer.from(`\r\n--${boundary}--\r\n`);
const hash = createHash('sha256');
const chunk = Buffer.alloc(1024 * 1024);
for (let i = 0; i < chunk.length; i++) chunk[i] = (i * 2654435761) >>> 24;

let peakRss = rssMb(serverPid);
const baselineRss = peakRss;
const sampler = setInterval(() => (peakRss = Math.max(peakRss, rssMb(serverPid))), 100);
const started = Date.now();
const response = await new Promise<{ status: number; body: string }>((resolve, reject) => {
  const request = http.request(new URL(`/api/sessions/${session.id}/takes`, base), {
    method: 'POST',
    headers: { cookie: client.cookieHeader(), 'content-type': `multipart/form-data; boundary=${boundary}`, 'content-length': head.length + 44 + dataBytes + tail.length },
  });
  request.on('response', (res) => {
    let body = '';
    res.on('data', (d) => (body += d));
    res.on('end', () => resolve({ status: res.statusCode ?? 0, body }));
  });
  request.on('error', reject);
  request.write(head);
  const header = wavHeader(dataBytes);
  hash.update(header);
  request.write(header);
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
const seconds = (Date.now() - started) / 1000;
clearInterval(sampler);
const take = JSON.parse(response.body).takes?.[0];
const sentSha = hash.digest('hex');
console.log(`upload of ${(total / 1024 ** 3).toFixed(2)} GiB: HTTP ${response.status} in ${seconds.toFixed(1)} s (${(total / 1024 ** 2 / seconds).toFixed(0)} MiB/s)`);
console.log(`web server RSS: ${baselineRss.toFixed(0)} MB before, ${peakRss.toFixed(0)} MB peak (target < 300 MB)`);
console.log(`stored SHA-256 ${take?.sha256 === sentSha ? 'matches' : 'DOES NOT MATCH'} the bytes sent`);
process.exitCode = response.status === 201 && take?.sha256 === sentSha ? 0 : 1;
