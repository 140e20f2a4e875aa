import { readFileSync } from 'node:fs';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { signedIn } from '../../support/http';
import { makeWav, newSession, uploadTakes, waitForTake } from '../../support/takes';
import { isRunning, startDatabase, stopDatabase, waitUntil, workerPid } from '../../support/testServices';

const serverPid = Number(process.env.TAKEPROOF_SERVER_PID);
const OUTAGE_MS = 20_000;
let stopped = false;
afterAll(async () => {
  if (stopped) await startDatabase();
});

describe('fault drill: MariaDB stops for 20 s while a long take is measured', () => {
  it('keeps the worker and the web server alive, answers 503 meanwhile, and ends the take measured', async () => {
    // Five minutes of stereo 24-bit: long enough that the measurement runs into the outage. Generated
    // before the requests: an idle keep-alive connection is closed by the server after 5 s.
    const seconds = 300;
    const bytes = makeWav({ seconds, seed: 4242, amplitude: 0.05 });
    const engineer = await signedIn('engineer');
    const sessionId = await newSession(engineer, 'Database outage while measuring');
    const worker = workerPid();
    expect(isRunning(worker)).toBe(true);
    const { status, body } = await uploadTakes(engineer, sessionId, [{ name: 'long-interview.wav', bytes }]);
    expect(status).toBe(201);
    const takeId: number = body.takes[0].id;
    await waitUntil('the take is being measured', async () => {
      const take = await (await engineer.fetch(`/api/takes/${takeId}`)).json();
      return take.status === 'measuring';
    });

    stopDatabase();
    stopped = true;
    const outageEnds = Date.now() + OUTAGE_MS;
    let answers503 = 0;
    while (Date.now() < outageEnds) {
      const response = await engineer.fetch(`/api/takes/${takeId}`);
      expect(response.status).toBe(503);
      const error = await response.json();
      expect(error.message).toMatch(/cannot reach its database/);
      answers503++;
      expect(isRunning(worker), 'the worker process is still running').toBe(true);
      if (serverPid) expect(isRunning(serverPid), 'the web server is still running').toBe(true);
      await new Promise((r) => setTimeout(r, 1000));
    }
    expect(answers503).toBeGreaterThan(0);
    await startDatabase();
    stopped = false;

    const finished = await waitForTake(engineer, takeId, 180_000);
    expect(finished.status).toBe('measured');
    expect(finished.report.file.frames).toBe(seconds * 48000);
    expect(finished.hasPeaks).toBe(true);
    // The same worker process rode it out: not restarted by its supervisor, and no promise left unhandled.
    expect(workerPid()).toBe(worker);
    expect(isRunning(worker)).toBe(true);
    const log = readFileSync(path.join(process.env.TAKEPROOF_TEST_DIR ?? 'var/test', 'worker.log'), 'utf8');
    expect(log).not.toMatch(/unhandled rejection/i);
  });
});
