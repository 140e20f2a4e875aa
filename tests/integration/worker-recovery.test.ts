import type { ChildProcess } from 'node:child_process';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { signedIn, type Client } from '../support/http';
import { makeWav, newSession, uploadTakes, waitForTake } from '../support/takes';
import { spawnWorker, workerPid } from '../support/testServices';

// The test server's own worker; paused while a second worker takes the job, so the second one gets it.
const backgroundWorker = workerPid();
let engineer: Client;
let doomed: ChildProcess | null = null;

beforeAll(async () => {
  engineer = await signedIn('engineer');
});

afterAll(() => {
  doomed?.kill('SIGKILL');
  if (backgroundWorker) process.kill(backgroundWorker, 'SIGCONT');
});

describe('analysis worker recovery', () => {
  it.runIf(backgroundWorker > 0)('finishes a take on another worker after the first one is killed mid-measurement', async () => {
    // Generated before the requests: an idle keep-alive connection is closed by the server after 5 s.
    const bytes = makeWav({ seconds: 240, seed: 81, amplitude: 0.02 });
    const sessionId = await newSession(engineer, 'Worker recovery drill');
    process.kill(backgroundWorker, 'SIGSTOP');
    try {
      // Long enough (4 min of stereo 24-bit) that the measurement is still running when the worker dies.
      const { status, body } = await uploadTakes(engineer, sessionId, [{ name: 'long-room-tone.wav', bytes }]);
      expect(status).toBe(201);
      const takeId = body.takes[0].id;

      doomed = spawnWorker();
      let seen: { status: string } = { status: 'queued' };
      const until = Date.now() + 60_000;
      while (seen.status !== 'measuring' && Date.now() < until) {
        seen = await (await engineer.fetch(`/api/takes/${takeId}`)).json();
        if (seen.status === 'measured') break;
        await new Promise((r) => setTimeout(r, 20));
      }
      expect(seen.status).toBe('measuring');
      doomed.kill('SIGKILL');
      await new Promise((r) => doomed!.once('exit', r));
      doomed = null;
      const stuck = await (await engineer.fetch(`/api/takes/${takeId}`)).json();
      expect(stuck.status).toBe('measuring');
      expect(stuck.progress).toBeLessThan(100);

      process.kill(backgroundWorker, 'SIGCONT');
      const finished = await waitForTake(engineer, takeId, 120_000);
      expect(finished.status).toBe('measured');
      expect(finished.report.file.frames).toBe(240 * 48000);
    } finally {
      process.kill(backgroundWorker, 'SIGCONT');
    }
  });
});
