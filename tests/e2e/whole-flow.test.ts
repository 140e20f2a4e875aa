import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { launchBrowser, screenshot, signInAs } from '../support/browser';
import { mailTo, uniqueAddress } from '../support/mail';

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

const tag = Date.now().toString(36);
const SPEC = `Harbour Lights delivery ${tag}`;
const TITLE = `Harbour Lights — episode 13 (${tag})`;
// Demo takes made by scripts/make-samples.ts: one clean, one clipped by a hot preamp, one with a line-up tone.
const TAKES = ['take-01-clean-interview.wav', 'take-02-hot-preamp.wav', 'take-06-lineup-tone.wav'];
const CLIPPED = 'take-02-hot-preamp.wav';

async function as(person: 'manager' | 'engineer' | 'producer'): Promise<Page> {
  const context = await browser.newContext({ viewport: { width: 1366, height: 900 } });
  const page = await context.newPage();
  await signInAs(page, person);
  return page;
}

describe('a whole session, as the studio works it', () => {
  it('goes from a new delivery spec to a session report in the mail', async () => {
    // 1. The manager sets up the delivery spec.
    const manager = await as('manager');
    await manager.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Delivery specs' }).click();
    await manager.getByRole('link', { name: 'New spec' }).click();
    await manager.getByLabel('Name').fill(SPEC);
    await manager.getByLabel(/Loudness target/).fill('-16');
    await manager.getByRole('button', { name: 'Create spec' }).click();
    await manager.waitForURL(/\/specs\/\d+/);
    await screenshot(manager, 'flow-1-spec-created');
    await manager.context().close();

    // 2. The engineer starts the session on that spec and uploads three takes.
    const engineer = await as('engineer');
    await engineer.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Sessions' }).click();
    await engineer.getByLabel('Title').fill(TITLE);
    await engineer.getByLabel('Delivery spec').selectOption({ label: SPEC });
    await engineer.getByRole('button', { name: 'Create session' }).click();
    await engineer.waitForURL(/\/sessions\/\d+$/);
    const sessionUrl = engineer.url();
    await engineer.getByTestId('take-file-input').setInputFiles(TAKES.map((t) => `samples/${t}`));
    await expect.poll(async () => (await engineer.getByTestId('status').allTextContents()).join('|'), { timeout: 120_000 }).toMatch(/^\W*Measured\|\W*Measured\|\W*Measured$/);
    await screenshot(engineer, 'flow-2-takes-measured');
    await engineer.context().close();

    // 3. The producer rejects the clipped take with a reason and approves the others.
    const producer = await as('producer');
    await producer.goto(sessionUrl);
    for (const name of TAKES) {
      await producer.getByRole('link', { name, exact: true }).click();
      await producer.waitForURL(/\/takes\/\d+$/);
      if (name === CLIPPED) {
        await producer.getByLabel(/Note for the engineer/).fill('The guest channel flat-tops from the first laugh; please re-record with less preamp gain.');
        await producer.getByRole('button', { name: 'Reject' }).click();
        await producer.getByTestId('decision-state').getByText('Rejected').waitFor();
        await screenshot(producer, 'flow-3-clipped-take-rejected');
      } else {
        await producer.getByRole('button', { name: /Approve for the edit/ }).click();
        await producer.getByTestId('decision-state').getByText('Approved').waitFor();
      }
      await producer.goto(sessionUrl);
    }
    const decisions = await producer.locator('tbody tr').evaluateAll((rows) =>
      rows.map((r) => `${r.querySelector('a')?.textContent}=${r.querySelector('[data-testid=decision]')?.textContent}`).sort(),
    );
    expect(decisions).toEqual([`${TAKES[0]}=●Approved`, `${CLIPPED}=■Rejected`, `${TAKES[2]}=●Approved`]);
    await screenshot(producer, 'flow-4-decisions');

    // 4. The producer sends the session report.
    const to = uniqueAddress('edit-suite');
    await producer.getByRole('button', { name: 'Send report', exact: true }).click();
    await producer.getByLabel('Recipients').fill(to);
    await producer.getByRole('button', { name: 'Send to recipients' }).click();
    // The report goes through the outbox: the line says so, then that it was sent.
    await producer.getByTestId('report-result').filter({ hasText: 'Report sent to' }).waitFor();
    await expect(producer.getByTestId('report-result').textContent()).resolves.toBe(`✉Report sent to ${to}.`);
    await screenshot(producer, 'flow-5-report-sent');
    await producer.context().close();

    // 5. The report is in the outbox with its PDF, which names the session and the rejected take.
    const { mail } = await mailTo(to);
    expect(mail.subject).toContain(TITLE);
    const pdf = mail.attachments.find((a) => a.contentType === 'application/pdf');
    expect(pdf).toBeDefined();
    const dir = mkdtempSync(path.join(os.tmpdir(), 'takeproof-flow-'));
    writeFileSync(path.join(dir, 'report.pdf'), pdf!.content);
    const text = execFileSync('pdftotext', ['-layout', path.join(dir, 'report.pdf'), '-'], { encoding: 'utf8' });
    expect(text).toContain(TITLE.slice(0, 20));
    expect(text).toContain(CLIPPED);
    expect(text).toMatch(/Rejected/);
  });
});
