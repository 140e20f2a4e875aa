import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { signedIn } from '../../support/http';
import { makeWav, newSession, uploadTakes, waitForTake } from '../../support/takes';
import { isRunning, waitUntil, workerPid } from '../../support/testServices';

describe('fault drill: the analysis worker is killed mid-measurement', () => {
  it('keeps the web server serving, starts a new worker with a log line, and the new worker finishes the take', async () => {
    // Generated before the requests: an idle keep-alive connection is closed by the server after 5 s.
    const seconds = 240;
    const bytes = makeWav({ seconds, seed: 5151, amplitude: 0.05 });
    const engineer = await signedIn('engineer');
    const sessionId = await newSession(engineer, 'Worker crash drill');
    const first = workerPid();
    expect(isRunning(first)).toBe(true);
    const { status, body } = await uploadTakes(engineer, sessionId, [{ name: 'crash-drill.wav', bytes }]);
    expect(status).toBe(201);
    const takeId: number = body.takes[0].id;
    await waitUntil('the take is being measured', async () => (await (await engineer.fetch(`/api/takes/${takeId}`)).json()).status === 'measuring');

    process.kill(first, 'SIGKILL');
    // The web server answers all along.
    await waitUntil('a new worker is running', async () => {
      expect((await engineer.fetch(`/api/takes/${takeId}`)).status).toBe(200);
      const now = workerPid();
      return now !== 0 && now !== first && isRunning(now);
    });
    expect((await engineer.fetch('/api/sessions')).status).toBe(200);

    const finished = await waitForTake(engineer, takeId, 180_000);
    expect(finished.status).toBe('measured');
    expect(finished.report.file.frames).toBe(seconds * 48000);
    const log = readFileSync(path.join(process.env.TAKEPROOF_TEST_DIR ?? 'var/test', 'worker.log'), 'utf8');
    expect(log).toMatch(/worker: stopped \(exit code 137\); starting it again in \d+ s/);
  });
});
