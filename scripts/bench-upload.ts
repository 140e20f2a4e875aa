// Uploads one generated 2 GB take through the real upload route and samples the web server's
// memory while it streams. Run with `npm run bench:upload` (it starts its own Takeproof).
//   BENCH_UPLOAD_BYTES=…  size of the take (default 2 GiB)
import { readFileSync } from 'node:fs';
import { Client, DEMO } from '../tests/support/http';
import { streamGeneratedUpload } from '../tests/support/streamUpload';

const total = Number(process.env.BENCH_UPLOAD_BYTES ?? 2 * 1024 ** 3);
const serverPid = Number(process.env.TAKEPROOF_SERVER_PID);
const base = process.env.TAKEPROOF_TEST_URL!;

function rssMb(pid: number): number {
  const status = readFileSync(`/proc/${pid}/status`, 'utf8');
  return Number(/VmRSS:\s+(\d+)/.exec(status)![1]) / 1024;
}

const client = new Client(base);
await client.signIn(DEMO.engineer);
const session = await (await client.fetch('/api/sessions', { method: 'POST', json: { title: 'Upload benchmark' } })).json();

let peakRss = rssMb(serverPid);
const baselineRss = peakRss;
const sampler = setInterval(() => (peakRss = Math.max(peakRss, rssMb(serverPid))), 100);
const started = Date.now();
const result = await streamGeneratedUpload(client, base, session.id, total, 'two-gigabyte-take.wav');
const seconds = (Date.now() - started) / 1000;
clearInterval(sampler);
console.log(`upload of ${(total / 1024 ** 3).toFixed(2)} GiB: HTTP ${result.status} in ${seconds.toFixed(1)} s (${(total / 1024 ** 2 / seconds).toFixed(0)} MiB/s)`);
console.log(`web server RSS: ${baselineRss.toFixed(0)} MB before, ${peakRss.toFixed(0)} MB peak (target < 300 MB)`);
console.log(`stored SHA-256 ${result.stored === result.sent ? 'matches' : 'DOES NOT MATCH'} the bytes sent`);
process.exitCode = result.status === 201 && result.stored === result.sent ? 0 : 1;
