import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { BASE_URL, launchBrowser, screenshot, signInAs } from '../support/browser';
import { signedIn } from '../support/http';
import { CLIP_AT_SEC, DROPOUT_AT_SEC, createSession, hotInterviewTake, unreadableWav, uploadTake, waitMeasured } from '../support/reviewTakes';

let browser: Browser;
let sessionId: number;
let takeId: number;
let brokenId: number;

beforeAll(async () => {
  browser = await launchBrowser();
  const engineer = await signedIn('engineer');
  sessionId = await createSession(engineer, 'The Night Ferry — pickups, scene 17');
  takeId = await uploadTake(engineer, sessionId, 'scene17-guest-hot.wav', hotInterviewTake(201));
  brokenId = await uploadTake(engineer, sessionId, 'scene17-card-error.wav', unreadableWav());
  await waitMeasured(engineer, takeId);
}, 150_000);

afterAll(async () => {
  await browser?.close();
});

/** The playhead readout as seconds. */
async function playhead(page: Page): Promise<number> {
  const text = (await page.getByTestId('current-time').textContent()) ?? '';
  const [m, s] = text.split(':').map(Number);
  return m * 60 + s;
}

describe('the take review page', () => {
  it('shows the clipping on the waveform and in the findings, moves the playhead to a finding, and records a rejection', async () => {
    const page = await browser.newPage({ viewport: { width: 1440, height: 900 } });
    await signInAs(page, 'producer');
    await page.goto(`${BASE_URL}/takes/${takeId}`);
    await expect(page.getByRole('heading', { level: 1 }).textContent()).resolves.toBe('scene17-guest-hot.wav');

    // Full-scale clipping: the page warns to lower the monitors before playing.
    await expect(page.getByTestId('hearing-caution').textContent()).resolves.toMatch(/Lower your monitor level/);
    // …and the player starts turned well down.
    await expect(page.getByRole('slider', { name: /Volume/ }).inputValue()).resolves.toBe('0.1');

    // Regions drawn on the waveform (inside the waveform's shadow DOM), labelled and marked by severity.
    const clipRegion = page.locator('[data-testid=waveform] [data-kind=clip]');
    await clipRegion.first().waitFor({ state: 'attached', timeout: 30_000 });
    await expect(clipRegion.first().getAttribute('data-severity')).resolves.toBe('fail');
    await expect(clipRegion.first().textContent()).resolves.toContain('Clip R');
    // It sits on the right channel's lane, over the clipped stretch.
    await clipRegion.first().waitFor({ state: 'visible', timeout: 10_000 });
    const lanes = await clipRegion.first().evaluate((el) => {
      const region = el.getBoundingClientRect();
      const all = el.parentElement!.getBoundingClientRect();
      return { topShare: (region.top - all.top) / all.height, heightShare: region.height / all.height, widthShare: region.width / all.width };
    });
    expect(lanes.topShare).toBeCloseTo(0.5, 1);
    expect(lanes.heightShare).toBeCloseTo(0.5, 1);
    // 0.3 s of an 8 s take.
    expect(lanes.widthShare).toBeCloseTo(0.3 / 8, 2);
    await expect(page.locator('[data-testid=waveform] [data-kind=dropout]').count()).resolves.toBe(1);
    // The waveform was drawn from server peaks: canvases exist and the full file was never fetched whole.
    await expect(page.locator('[data-testid=waveform] canvas').count()).resolves.toBeGreaterThan(0);

    // Zooming in widens the waveform past the view; zooming out fits the whole take again.
    const scrollWidth = () => page.locator('[data-testid=waveform] .scroll').evaluate((el) => el.scrollWidth / el.clientWidth);
    expect(await scrollWidth()).toBeCloseTo(1, 1);
    for (let i = 0; i < 4; i++) await page.getByRole('button', { name: 'Zoom in' }).click();
    await expect(page.getByTestId('zoom-level').textContent()).resolves.toBe('× 16');
    await page.waitForFunction(() => {
      const el = document.querySelector('[data-testid=waveform]')?.firstElementChild?.shadowRoot?.querySelector('.scroll');
      return !!el && el.scrollWidth > 1.5 * el.clientWidth;
    });
    for (let i = 0; i < 4; i++) await page.getByRole('button', { name: 'Zoom out' }).click();
    await expect(page.getByTestId('zoom-level').textContent()).resolves.toBe('Whole take');

    // The findings list names them in time order: the clip, the true-peak over inside it, the dropout.
    const findings = page.getByTestId('findings-list').getByRole('button');
    await expect(findings.count()).resolves.toBe(3);
    await expect(findings.nth(0).textContent()).resolves.toMatch(/Fail.*0:04\.0.*Clip R/);
    await expect(findings.nth(1).textContent()).resolves.toMatch(/Fail.*0:04\.\d.*True peak/);
    await expect(findings.nth(2).textContent()).resolves.toMatch(/Dropout/);

    // Measures: each with a word mark, and the format line in plain words.
    await expect(page.getByTestId('measure-peaks').locator('[data-mark]').textContent()).resolves.toMatch(/Fail/);
    await expect(page.getByTestId('measure-format').textContent()).resolves.toMatch(/24-bit file, \d+ bits used/);
    await expect(page.getByTestId('spectrum-plot').locator('canvas').count()).resolves.toBe(1);
    await expect(page.getByTestId('loudness-plot').locator('canvas').count()).resolves.toBe(1);

    // Clicking the clipping finding moves the playhead to a second before it.
    expect(await playhead(page)).toBe(0);
    await findings.nth(0).click();
    await page.waitForFunction(() => /0:0[3-5]/.test(document.querySelector('[data-testid=current-time]')?.textContent ?? ''));
    const atClip = await playhead(page);
    expect(atClip).toBeGreaterThanOrEqual(CLIP_AT_SEC - 1.05);
    expect(atClip).toBeLessThan(CLIP_AT_SEC + 1);
    await expect(findings.nth(0).getAttribute('aria-current')).resolves.toBe('true');

    // Space pauses; the right arrow moves on to the true-peak over, then to the dropout.
    await page.keyboard.press('Space');
    await page.getByRole('button', { name: 'Play', exact: true }).waitFor();
    await page.keyboard.press('ArrowRight');
    await expect.poll(() => findings.nth(1).getAttribute('aria-current')).toBe('true');
    await page.keyboard.press('ArrowRight');
    await page.waitForFunction(() => /0:0[5-6]/.test(document.querySelector('[data-testid=current-time]')?.textContent ?? ''));
    expect(await playhead(page)).toBeCloseTo(DROPOUT_AT_SEC - 1, 0);
    await expect(findings.nth(2).getAttribute('aria-current')).resolves.toBe('true');

    // Typing in the note field does not drive the player.
    const note = page.getByLabel(/Note for the engineer/);
    await note.click();
    await page.keyboard.press('ArrowLeft');
    await page.keyboard.type(' ');
    expect(await playhead(page)).toBeCloseTo(DROPOUT_AT_SEC - 1, 0);
    await note.fill('');

    await page.evaluate(() => (document.documentElement.dataset.theme = 'light'));
    await page.waitForTimeout(300);
    await screenshot(page, 'take-review-light');
    await page.evaluate(() => (document.documentElement.dataset.theme = 'dark'));
    await page.waitForTimeout(600);
    // The canvases follow the theme: the plot was drawn again with the dark palette.
    await expect(page.getByTestId('spectrum-plot').locator('canvas').count()).resolves.toBe(1);
    await screenshot(page, 'take-review-dark');
    await page.evaluate(() => (document.documentElement.dataset.theme = 'light'));

    // Rejecting needs a reason.
    await page.getByRole('button', { name: 'Reject' }).click();
    await expect(page.locator('#decision-note-error').textContent()).resolves.toMatch(/Say why the take is rejected/);
    await note.fill('Guest channel clips at 0:04; please send the backup recorder file.');
    await page.getByRole('button', { name: 'Reject' }).click();
    await page.getByTestId('decision-state').getByText('Rejected').waitFor();
    await expect(page.getByTestId('decision-state').textContent()).resolves.toMatch(/Rejected.*by Tomasz Okafor/);
    await expect(page.getByTestId('decision-note').textContent()).resolves.toMatch(/backup recorder/);

    // The session's take table shows the decision.
    await page.getByRole('link', { name: /The Night Ferry — pickups, scene 17/ }).click();
    await page.waitForURL(`${BASE_URL}/sessions/${sessionId}`);
    const row = page.getByTestId(`take-row-${takeId}`);
    await row.waitFor();
    await expect(row.getByTestId('decision').textContent()).resolves.toMatch(/Rejected/);
    // …and its take name leads back to the review page.
    await row.getByRole('link', { name: 'scene17-guest-hot.wav' }).click();
    await page.waitForURL(`${BASE_URL}/takes/${takeId}`);
    await page.close();
  });

  it('drops a time-stamped comment at the playhead that shows on the waveform and in the list', async () => {
    const page = await browser.newPage({ viewport: { width: 1280, height: 900 } });
    await signInAs(page, 'producer');
    await page.goto(`${BASE_URL}/takes/${takeId}`);
    await page.getByLabel('At', { exact: true }).fill('1:02');
    await page.getByLabel('Comment', { exact: true }).fill('After the end');
    await page.getByRole('button', { name: 'Add comment' }).click();
    await expect(page.locator('#comment-at-error').textContent()).resolves.toMatch(/past the end/);
    await page.getByLabel('At', { exact: true }).fill('0:02.5');
    await page.getByLabel('Comment', { exact: true }).fill('Door slam');
    await page.getByRole('button', { name: 'Add comment' }).click();
    await page.getByTestId('comments-list').getByText('Door slam').waitFor();
    await expect(page.getByTestId('comments-list').textContent()).resolves.toMatch(/0:02\.5\s*Door slam/);
    await page.locator('[data-testid=waveform] [data-kind=comment]').first().waitFor({ state: 'attached' });
    await page.close();
  });

  it('steps to the next take of the session, which explains in words that its file could not be read', async () => {
    const page = await browser.newPage();
    await signInAs(page, 'producer');
    await page.goto(`${BASE_URL}/takes/${takeId}`);
    await expect(page.getByText(/Take 1 of 2/).count()).resolves.toBe(1);
    await page.getByRole('link', { name: 'Next take ›' }).click();
    await page.waitForURL(`${BASE_URL}/takes/${brokenId}`);
    const notice = page.getByTestId('unreadable');
    await notice.waitFor({ timeout: 60_000 });
    await expect(notice.textContent()).resolves.toMatch(/This file could not be read: \S+/);
    await page.getByRole('link', { name: '‹ Previous take' }).click();
    await page.waitForURL(`${BASE_URL}/takes/${takeId}`);
    await page.close();
  });

  it('shows an engineer the decision but no decision buttons', async () => {
    const page = await browser.newPage();
    await signInAs(page, 'engineer');
    await page.goto(`${BASE_URL}/takes/${takeId}`);
    await expect(page.getByTestId('decision-state').textContent()).resolves.toMatch(/Rejected/);
    await page.getByTestId('findings-list').waitFor();
    await expect(page.getByRole('button', { name: 'Reject' }).count()).resolves.toBe(0);
    await expect(page.getByRole('button', { name: /Approve/ }).count()).resolves.toBe(0);
    await screenshot(page, 'take-review-engineer');
    await page.getByText('Producers and studio managers decide on takes.').waitFor({ state: 'visible', timeout: 10_000 });
    // Engineers may still comment.
    await page.getByRole('button', { name: 'Add comment' }).waitFor({ state: 'visible', timeout: 10_000 });
    await page.close();
  });
});
