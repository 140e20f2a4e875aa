import { afterAll, describe, expect, it } from 'vitest';
import { signedIn } from '../../support/http';
import { makeWav, newSession, uploadTakes, waitForTake } from '../../support/takes';
import { startDatabase, stopDatabase } from '../../support/testServices';

let stopped = false;
afterAll(async () => {
  if (stopped) await startDatabase();
});

describe('fault drill: MariaDB restarts while Takeproof runs', () => {
  it('answers 503 in plain words while the database is down and recovers by itself, worker included', async () => {
    const engineer = await signedIn('engineer');
    const sessionId = await newSession(engineer, 'Database restart drill');
    stopDatabase();
    stopped = true;
    const down = await engineer.fetch('/api/sessions');
    expect(down.status).toBe(503);
    const body = await down.json();
    expect(body.error).toBe('unavailable:database');
    expect(body.message).toMatch(/cannot reach its database/);
    // A page asks the browser to retry instead of showing a stack trace.
    const page = await engineer.fetch('/sessions');
    expect(await page.text()).not.toMatch(/at .*\.js:\d+:\d+/);

    await startDatabase();
    stopped = false;
    let status = 0;
    for (let i = 0; i < 40 && status !== 200; i++) {
      status = (await engineer.fetch('/api/sessions')).status;
      if (status !== 200) await new Promise((r) => setTimeout(r, 500));
    }
    expect(status).toBe(200);
    // The analysis worker lived through the outage and still measures new takes.
    const { status: uploaded, body: up } = await uploadTakes(engineer, sessionId, [{ name: 'after-restart.wav', bytes: makeWav({ seconds: 1, seed: 901 }) }]);
    expect(uploaded).toBe(201);
    expect((await waitForTake(engineer, up.takes[0].id, 60_000)).status).toBe('measured');
  });
});
