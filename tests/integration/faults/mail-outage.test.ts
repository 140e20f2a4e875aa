import { spawn, type ChildProcess } from 'node:child_process';
import { mkdirSync, readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { BASE_URL, signedIn, type Client } from '../../support/http';
import { uniqueAddress } from '../../support/mail';
import { newSession } from '../../support/takes';
import { spawnWorker, waitUntil, workerPid } from '../../support/testServices';

// A second worker whose mail server is not there yet; the test server's own worker is paused
// meanwhile, so the report can only leave through the second one.
const testDir = path.resolve(process.env.TAKEPROOF_TEST_DIR ?? 'var/test');
const caughtDir = path.join(testDir, 'mail-outage-caught');
const smtpUrl = `smtp://127.0.0.1:${Number(process.env.SMTP_PORT ?? 2526) + 50}`;
const settings = { SMTP_URL: smtpUrl, MAIL_OUTBOX_DIR: caughtDir };
const pausedWorker = workerPid();
const children: ChildProcess[] = [];
let producer: Client;
let manager: Client;
let engineer: Client;

const startMailCatcher = () => children.push(spawn(process.execPath, ['--conditions=react-server', '--import', 'tsx', 'scripts/mail-catcher.ts'], { env: { ...process.env, ...settings }, stdio: 'ignore' }));

beforeAll(async () => {
  mkdirSync(caughtDir, { recursive: true });
  [producer, manager, engineer] = await Promise.all([signedIn('producer'), signedIn('manager'), signedIn('engineer')]);
  if (pausedWorker) process.kill(pausedWorker, 'SIGSTOP');
  children.push(spawnWorker(settings));
});

afterAll(() => {
  for (const child of children) child.kill('SIGTERM');
  if (pausedWorker) process.kill(pausedWorker, 'SIGCONT');
});

async function outgoing(id: number) {
  const { deliveries } = await (await manager.fetch('/api/outbox')).json();
  return deliveries.find((d: { id: number }) => d.id === id);
}

describe('fault drill: the mail server is down when a report is sent', () => {
  it('keeps the report queued in the outbox, tries again, and delivers it once the mail server is back', async () => {
    const sessionId = await newSession(engineer, 'Mail outage drill');
    const to = uniqueAddress('outage');
    const response = await producer.fetch(`/api/sessions/${sessionId}/report`, { method: 'POST', json: { to: [to] }, headers: { origin: BASE_URL } });
    expect(response.status).toBe(202);
    const { delivery } = await response.json();
    expect(delivery.status).toBe('queued');

    // The worker tried, could not reach the mail server, and keeps the report for later.
    await waitUntil('the first try has failed', async () => (await outgoing(delivery.id))?.attempts >= 1);
    const waiting = await outgoing(delivery.id);
    expect(waiting).toMatchObject({ status: 'queued', recipients: [to] });
    expect(waiting.error).toMatch(/could not be reached/);
    expect(waiting.nextAttemptAt).not.toBeNull();
    const page = await (await manager.fetch('/outbox')).text();
    expect(page).toContain(to);
    expect(page).toMatch(/Queued/);

    startMailCatcher();
    await waitUntil('the report has been sent', async () => (await outgoing(delivery.id))?.status === 'sent', 120_000);
    const sent = await outgoing(delivery.id);
    expect(sent.error).toBeNull();
    expect(sent.attempts).toBeGreaterThanOrEqual(2);
    const caught = readdirSync(caughtDir).filter((n) => n.endsWith('.eml')).map((n) => readFileSync(path.join(caughtDir, n), 'utf8'));
    expect(caught.filter((raw) => raw.includes(to))).toHaveLength(1);
  });
});
