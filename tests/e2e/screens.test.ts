import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { AxeResults } from 'axe-core';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { BASE_URL, launchBrowser, screenshot, signInAs } from '../support/browser';
import { signedIn, type DemoPerson } from '../support/http';
import { createSession, hotInterviewTake, unreadableWav, uploadTake, waitMeasured } from '../support/reviewTakes';
import { makeWav } from '../support/takes';

/** A laptop screen: what a producer sees without scrolling. */
const LAPTOP = { width: 1280, height: 720 };
const THEMES = ['light', 'dark'] as const;
type Theme = (typeof THEMES)[number];

// axe-core's own bundle, injected into each page as its documentation describes.
const AXE_SOURCE = readFileSync(createRequire(import.meta.url).resolve('axe-core/axe.min.js'), 'utf8');

let browser: Browser;
let sessionId: number;
let clippedId: number;
let brokenId: number;

beforeAll(async () => {
  browser = await launchBrowser();
  const engineer = await signedIn('engineer');
  sessionId = await createSession(engineer, 'Tidewater Tales — episode 4, studio B');
  clippedId = await uploadTake(engineer, sessionId, 'ep4-host-intro-hot.wav', hotInterviewTake(401));
  const quietId = await uploadTake(engineer, sessionId, 'ep4-room-tone.wav', makeWav({ seconds: 3, seed: 402, amplitude: 0.05 }));
  brokenId = await uploadTake(engineer, sessionId, 'ep4-card-error.wav', unreadableWav());
  await waitMeasured(engineer, clippedId);
  await waitMeasured(engineer, quietId);
}, 150_000);

afterAll(async () => {
  await browser?.close();
});

async function signedInContext(person: DemoPerson, theme: Theme): Promise<{ context: BrowserContext; page: Page }> {
  const context = await browser.newContext({ viewport: LAPTOP, colorScheme: theme });
  await context.addCookies([{ name: 'tp-theme', value: theme, url: BASE_URL }]);
  const page = await context.newPage();
  await signInAs(page, person);
  return { context, page };
}

/** axe-core's violations on the page as it stands, one line each. */
async function axeViolations(page: Page): Promise<string[]> {
  await page.addScriptTag({ content: AXE_SOURCE });
  const results = (await page.evaluate(() => (window as unknown as { axe: { run: () => Promise<unknown> } }).axe.run())) as AxeResults;
  return results.violations.map((v) => `${v.id}: ${v.help} — ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`);
}

/** Waits until the page has settled: no request in flight and every font loaded. */
async function settled(page: Page): Promise<void> {
  await page.waitForLoadState('networkidle');
  await page.evaluate(() => document.fonts.ready.then(() => undefined));
}

interface Screen {
  name: string;
  person: DemoPerson;
  path: () => string;
  /** Something on the page that shows it finished loading. */
  ready?: (page: Page) => Promise<unknown>;
}

const SCREENS: Screen[] = [
  { name: 'overview', person: 'producer', path: () => '/' },
  { name: 'sessions', person: 'producer', path: () => '/sessions' },
  { name: 'session', person: 'producer', path: () => `/sessions/${sessionId}`, ready: (page) => page.getByTestId('take-summary').waitFor() },
  { name: 'take-review-failed', person: 'producer', path: () => `/takes/${clippedId}`, ready: (page) => page.getByTestId('measures').waitFor() },
  { name: 'take-unreadable', person: 'engineer', path: () => `/takes/${brokenId}`, ready: (page) => page.getByTestId('unreadable').waitFor() },
  { name: 'fleet', person: 'manager', path: () => '/fleet' },
  { name: 'recorders', person: 'manager', path: () => '/recorders' },
  { name: 'specs', person: 'manager', path: () => '/specs' },
  { name: 'spec-new', person: 'manager', path: () => '/specs/new' },
  { name: 'team', person: 'manager', path: () => '/team' },
  { name: 'audit', person: 'manager', path: () => '/audit' },
  { name: 'outbox', person: 'manager', path: () => '/outbox' },
  { name: 'account', person: 'engineer', path: () => '/account' },
  { name: 'manager-page-refused', person: 'producer', path: () => '/fleet' },
];

describe('the main pages at 1280×720', () => {
  it('shows a failed take’s reason above the fold on its review page', async () => {
    const { context, page } = await signedInContext('producer', 'light');
    await page.goto(`${BASE_URL}/takes/${clippedId}`);
    const reason = page.getByTestId('verdict-reason');
    await reason.waitFor();
    await expect(reason.textContent()).resolves.toMatch(/clip/i);
    const box = await reason.boundingBox();
    expect(box).not.toBeNull();
    expect(box!.y + box!.height).toBeLessThanOrEqual(LAPTOP.height);
    // Beside the waveform: each lane named after its channel, and the findings that have no moment in time.
    await expect(page.getByTestId('lane-name').allTextContents()).resolves.toEqual(['L', 'R']);
    await expect(page.getByTestId('untimed-findings').textContent()).resolves.toMatch(/Noise floor/);
    await context.close();
  });

  it('fits the session take table into the window without horizontal scrolling', async () => {
    const { context, page } = await signedInContext('producer', 'light');
    await page.goto(`${BASE_URL}/sessions/${sessionId}`);
    await page.getByTestId(`take-row-${clippedId}`).waitFor();
    const widths = await page.evaluate(() => {
      const table = document.querySelector('table[aria-describedby="takes-heading"]')!;
      return { page: document.documentElement.scrollWidth, window: window.innerWidth, table: table.parentElement!.scrollWidth, box: table.parentElement!.clientWidth };
    });
    expect(widths.page).toBeLessThanOrEqual(widths.window);
    expect(widths.table).toBeLessThanOrEqual(widths.box);
    // Worst first: the failed take heads the table, with its reason under its name.
    await expect(page.locator('tbody tr').first().getAttribute('data-testid')).resolves.toBe(`take-row-${clippedId}`);
    await expect(page.getByTestId(`take-row-${clippedId}`).getByTestId('reason').textContent()).resolves.toMatch(/clip/i);
    await context.close();
  });

  it('offers Measure again on the unreadable take’s page, and it queues the take', async () => {
    const { context, page } = await signedInContext('engineer', 'light');
    await page.goto(`${BASE_URL}/takes/${brokenId}`);
    const [answer] = await Promise.all([
      page.waitForResponse((r) => r.url().endsWith(`/api/takes/${brokenId}/remeasure`)),
      page.getByTestId('unreadable').getByRole('button', { name: 'Measure again' }).click(),
    ]);
    expect(answer.status()).toBe(202);
    // The page follows the take through the queue and back to its (still unreadable) state by itself.
    await page.getByTestId('unreadable').waitFor({ timeout: 60_000 });
    await context.close();
  });

  for (const theme of THEMES) {
    it(`passes axe-core on every main page in the ${theme} theme, and saves a screenshot of each`, async () => {
      const found: Record<string, string[]> = {};
      for (const screen of SCREENS) {
        const { context, page } = await signedInContext(screen.person, theme);
        await page.goto(`${BASE_URL}${screen.path()}`);
        await screen.ready?.(page);
        await settled(page);
        await screenshot(page, `${screen.name}-${theme}`);
        const violations = await axeViolations(page);
        if (violations.length) found[screen.name] = violations;
        await context.close();
      }
      expect(found).toEqual({});
    });
  }
});
