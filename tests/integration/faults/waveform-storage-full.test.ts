import { execFileSync, type ChildProcess } from 'node:child_process';
import { closeSync, createWriteStream, mkdirSync, openSync, readdirSync, rmSync, unlinkSync, writeFileSync, writeSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client, DEMO } from '../../support/http';
import { makeWav, waitForTake } from '../../support/takes';
import { spawnWorker, startExtraServer, waitUntil, workerPid } from '../../support/testServices';

// A real full disk: a 2 MiB tmpfs as the storage of a second web server and a second worker from
// the same build. The test server's own worker is paused meanwhile, so only the second worker
// (which sees this storage) claims the takes made here.
const testDir = path.resolve(process.env.TAKEPROOF_TEST_DIR ?? 'var/test');
const smallDisk = path.join(testDir, 'waveform-small-disk');
const filler = path.join(smallDisk, 'filler.bin');
const pausedWorker = workerPid();
let server: Awaited<ReturnType<typeof startExtraServer>> | null = null;
let worker: ChildProcess | null = null;
let client: Client;

beforeAll(async () => {
  mkdirSync(smallDisk, { recursive: true });
  execFileSync('mount', ['-t', 'tmpfs', '-o', 'size=2m', 'tmpfs', smallDisk]);
  server = await startExtraServer(Number(process.env.PORT ?? 3100) + 41, { STORAGE_DRIVER: 'local', STORAGE_DIR: smallDisk });
  client = new Client(server.url);
  await client.signIn(DEMO.engineer);
  if (pausedWorker) process.kill(pausedWorker, 'SIGSTOP');
});

afterAll(() => {
  worker?.kill('SIGKILL');
  server?.child.kill('SIGTERM');
  if (pausedWorker) process.kill(pausedWorker, 'SIGCONT');
  try {
    execFileSync('umount', [smallDisk]);
  } catch {
    // already unmounted
  }
});

function startWorker() {
  const log = createWriteStream(path.join(testDir, 'waveform-drill-worker.log'));
  worker = spawnWorker({ STORAGE_DRIVER: 'local', STORAGE_DIR: smallDisk }, 'pipe');
  worker.stdout!.pipe(log);
  worker.stderr!.pipe(log);
}

/** Writes zeros until the disk refuses more. */
function fillDisk() {
  const fd = openSync(filler, 'w');
  const chunk = Buffer.alloc(64 * 1024);
  try {
    for (;;) writeSync(fd, chunk);
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code !== 'ENOSPC') throw error;
  } finally {
    closeSync(fd);
  }
}

async function upload(sessionId: number, name: string, seed: number): Promise<number> {
  const form = new FormData();
  form.append('file', new Blob([new Uint8Array(makeWav({ seconds: 2, seed }))], { type: 'audio/wav' }), name);
  const response = await client.fetch(`/api/sessions/${sessionId}/takes`, { method: 'POST', body: form, headers: { origin: server!.url } });
  expect(response.status).toBe(201);
  return (await response.json()).takes[0].id;
}

function storedTakes(): string[] {
  return readdirSync(path.join(smallDisk, 'takes'), { recursive: true, withFileTypes: true }).filter((e) => e.isFile()).map((e) => path.join(e.parentPath, e.name));
}

describe('fault drill: storage is full when the waveform file is written', () => {
  it('ends the take "measured, waveform missing", says so on the review page, and stores the waveform once space is freed', async () => {
    const created = await client.fetch('/api/sessions', { method: 'POST', json: { title: 'Waveform on a full disk' }, headers: { origin: server!.url } });
    const sessionId: number = (await created.json()).id;

    // A take whose audio vanished from storage: a fault on Takeproof's side, not in the file.
    const lostId = await upload(sessionId, 'lost-audio.wav', 611);
    for (const file of storedTakes()) unlinkSync(file);
    const goodId = await upload(sessionId, 'good-take.wav', 612);
    fillDisk();
    startWorker();

    const good = await waitForTake(client, goodId, 120_000);
    expect(good.status).toBe('measured');
    expect(good.error).toBeNull();
    expect(good.verdict).not.toBeNull();
    expect(good.report.file.frames).toBe(2 * 48000);
    expect(good.hasPeaks).toBe(false);
    expect(good.waveformMissing).toBe(true);
    const peaks = await client.fetch(`/api/takes/${goodId}/peaks?buckets=200`);
    expect(peaks.status).toBe(404);
    expect((await peaks.json()).message).toMatch(/waveform of this take is missing/);

    // Item 18: the other take ends with a plain message; the cause stays in the log.
    const lost = await waitForTake(client, lostId, 120_000);
    expect(lost.status).toBe('unreadable');
    expect(lost.error).toMatch(/fault on its own side, not in the file/);
    expect(lost.error).not.toMatch(/ENOENT|no such file|UPDATE|SELECT|\//);
    // The session report (PDF, as e-mailed) says the same plain words.
    const pdf = Buffer.from(await (await client.fetch(`/api/sessions/${sessionId}/report.pdf`)).arrayBuffer());
    writeFileSync(path.join(testDir, 'waveform-drill-report.pdf'), pdf);
    const text = execFileSync('pdftotext', ['-layout', path.join(testDir, 'waveform-drill-report.pdf'), '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ');
    expect(text).toMatch(/Takeproof could not/);
    expect(text).not.toMatch(/ENOENT|no such file|UPDATE/);

    rmSync(filler);
    await waitUntil('the waveform has been stored', async () => (await (await client.fetch(`/api/takes/${goodId}`)).json()).hasPeaks === true, 120_000);
    const after = await (await client.fetch(`/api/takes/${goodId}`)).json();
    expect(after).toMatchObject({ status: 'measured', waveformMissing: false, verdict: good.verdict });
    expect((await client.fetch(`/api/takes/${goodId}/peaks?buckets=200`)).status).toBe(200);
  });
});
