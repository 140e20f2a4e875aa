import { existsSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { launchBrowser, screenshot, signInAs } from '../support/browser';

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

// Demo takes made by scripts/make-samples.ts before the tests run.
const SAMPLES = ['samples/take-01-clean-interview.wav', 'samples/take-02-hot-preamp.wav'];

describe('an engineer uploads takes after a session', () => {
  it('uploads two demo takes, watches them get measured and sees their verdicts', async () => {
    expect(SAMPLES.filter((f) => !existsSync(f))).toEqual([]);
    const context = await browser.newContext();
    const page = await context.newPage();
    await signInAs(page, 'engineer');
    await page.getByRole('link', { name: 'Sessions' }).click();
    await page.getByLabel('Title').fill('Harbour Lights — pickups');
    await page.getByRole('button', { name: 'Create session' }).click();
    await page.waitForURL(/\/sessions\/\d+$/);
    await page.getByText('No takes yet.').waitFor();

    await page.getByTestId('take-file-input').setInputFiles(SAMPLES);
    // Each upload's line turns into its take's live status, then its verdict, without a reload.
    const uploads = page.getByRole('list', { name: 'Uploads' }).getByRole('listitem');
    await expect.poll(async () => (await uploads.allTextContents()).filter((t) => /Pass|Warn|Fail/.test(t)).length, { timeout: 120_000 }).toBe(2);
    await expect(uploads.filter({ hasText: 'take-02-hot-preamp.wav' }).textContent()).resolves.toMatch(/Fail.*clip/i);
    const rows = page.locator('tbody tr');
    await expect.poll(() => rows.count(), { timeout: 30_000 }).toBe(2);
    // Both reach "Measured" without a reload, through the table's live polling.
    await expect.poll(async () => (await page.getByTestId('status').allTextContents()).join('|'), { timeout: 90_000 }).toMatch(/^\W*Measured\|\W*Measured$/);
    const verdicts = await page.getByTestId('verdict').allTextContents();
    expect(verdicts).toHaveLength(2);
    for (const v of verdicts) expect(v).toMatch(/Pass|Warn|Fail/);
    // The clipped take must not pass.
    const clippedRow = page.locator('tbody tr', { hasText: 'take-02-hot-preamp.wav' });
    await expect(clippedRow.getByTestId('verdict').textContent()).resolves.toMatch(/Fail/);
    await expect(clippedRow.getByTestId('reason').textContent()).resolves.toMatch(/clip/i);
    await expect(page.getByTestId('take-summary').textContent()).resolves.toMatch(/2 takes/);
    await screenshot(page, 'session-with-takes');
    await context.close();
  });

  it('refuses a file that is not a WAV in the browser, before sending anything', async () => {
    const context = await browser.newContext();
    const page = await context.newPage();
    await signInAs(page, 'engineer');
    await page.getByRole('link', { name: 'Sessions' }).click();
    await page.getByLabel('Title').fill('Harbour Lights — wrong file');
    await page.getByRole('button', { name: 'Create session' }).click();
    await page.waitForURL(/\/sessions\/\d+$/);
    let uploadsSent = 0;
    page.on('request', (request) => {
      if (request.method() === 'POST' && /\/api\/sessions\/\d+\/takes$/.test(request.url())) uploadsSent++;
    });
    await page.getByTestId('take-file-input').setInputFiles({ name: 'notes.wav', mimeType: 'audio/wav', buffer: Buffer.from('These are the producer’s notes, not audio.') });
    await page.getByText('is not a WAV file').waitFor({ timeout: 10_000 });
    await expect(page.getByText('Nothing was sent.').isVisible()).resolves.toBe(true);
    expect(uploadsSent).toBe(0);
    await context.close();
  });
});
