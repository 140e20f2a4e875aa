// Uploads one generated 2 GB take through the real upload routes and samples the web server's
// memory while it streams: once in one multipart request, once as a resumable (tus) upload.
// Run with `npm run bench:upload` (it starts its own Takeproof).
//   BENCH_UPLOAD_BYTES=…  size of the take (default 2 GiB)
import { readFileSync } from 'node:fs';
import * as tus from 'tus-js-client';
import { Client, DEMO } from '../tests/support/http';
import { generatedWav, streamGeneratedUpload } from '../tests/support/streamUpload';

const total = Number(process.env.BENCH_UPLOAD_BYTES ?? 2 * 1024 ** 3);
const serverPid = Number(process.env.TAKEPROOF_SERVER_PID);
const base = process.env.TAKEPROOF_TEST_URL!;
const TUS_CHUNK_BYTES = 64 * 1024 * 1024;

function rssMb(pid: number): number {
  const status = readFileSync(`/proc/${pid}/status`, 'utf8');
  return Number(/VmRSS:\s+(\d+)/.exec(status)![1]) / 1024;
}

async function measure(label: string, upload: () => Promise<{ ok: boolean; detail: string }>) {
  let peakRss = rssMb(serverPid);
  const baselineRss = peakRss;
  const sampler = setInterval(() => (peakRss = Math.max(peakRss, rssMb(serverPid))), 100);
  const started = Date.now();
  const result = await upload();
  const seconds = (Date.now() - started) / 1000;
  clearInterval(sampler);
  console.log(`${label} of ${(total / 1024 ** 3).toFixed(2)} GiB: ${result.detail} in ${seconds.toFixed(1)} s (${(total / 1024 ** 2 / seconds).toFixed(0)} MiB/s)`);
  console.log(`  web server RSS: ${baselineRss.toFixed(0)} MB before, ${peakRss.toFixed(0)} MB peak (target < 300 MB)`);
  return result.ok;
}

const client = new Client(base);
await client.signIn(DEMO.engineer);
const session = await (await client.fetch('/api/sessions', { method: 'POST', json: { title: 'Upload benchmark' }, headers: { origin: base } })).json();

const multipartOk = await measure('one-request upload', async () => {
  const result = await streamGeneratedUpload(client, base, session.id, total, 'two-gigabyte-take.wav');
  const ok = result.status === 201 && result.stored === result.sent;
  return { ok, detail: `HTTP ${result.status}, stored SHA-256 ${ok ? 'matches' : 'DOES NOT MATCH'}` };
});

const resumableOk = await measure('resumable (tus) upload', () => {
  const source = generatedWav(total, 2);
  return new Promise((resolve) => {
    const upload = new tus.Upload(source.stream, {
      endpoint: `${base}/api/sessions/${session.id}/uploads`,
      uploadSize: source.size,
      chunkSize: TUS_CHUNK_BYTES,
      headers: { cookie: client.cookieHeader(), origin: base },
      metadata: { filename: 'two-gigabyte-take-resumable.wav' },
      // A part can take a while to read on a busy machine, and the server closes idle keep-alive
      // connections meanwhile: a retry opens a fresh one and continues from the server's offset.
      retryDelays: [0, 1000, 3000],
      onSuccess: (payload) => {
        const stored = JSON.parse(payload.lastResponse.getBody() ?? '{}').takes?.[0]?.sha256;
        const ok = stored === source.sha256();
        resolve({ ok, detail: `${Math.ceil(source.size / TUS_CHUNK_BYTES)} PATCH requests, stored SHA-256 ${ok ? 'matches' : 'DOES NOT MATCH'}` });
      },
      onError: (error) => resolve({ ok: false, detail: `failed: ${error.message.slice(0, 300)}` }),
    });
    upload.start();
  });
});
process.exitCode = multipartOk && resumableOk ? 0 : 1;
