import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { db } from '@/lib/db/connection.server';
import { Recorder, RecordingSession, Take, User } from '@/models';
import { BASE_URL, launchBrowser, screenshot, signInAs } from '../support/browser';
import { summaryTake } from '../support/fleetData';
import { ALERT_STATUS } from '@/lib/status';

let browser: Browser;
const tag = Math.random().toString(36).slice(2, 6);
const DRIFTING = `Drama floor stage box ${tag}`;
const QUIET = `Booth E interface ${tag}`;
const DAY = 86_400_000;
const ago = (days: number) => new Date(Date.now() - days * DAY);

beforeAll(async () => {
  db();
  const manager = await User.findOne({ where: { email: 'manager@demo.test' } });
  const studioId = manager!.studioId;
  const session = await RecordingSession.create({ studioId, title: `Fleet walk-through ${tag}`, client: null, recordedOn: null, room: null, engineerId: null, producerId: null, deliverySpecId: null, notes: null });
  const drifting = await Recorder.create({ studioId, label: DRIFTING, makeModel: 'Tidewater 24x stage box', serial: `TW24-${tag}`, location: 'Drama floor', notes: null, bextMatch: null });
  const quiet = await Recorder.create({ studioId, label: QUIET, makeModel: 'Osprey 2i converter', serial: `OS2-${tag}`, location: 'Booth E', notes: null, bextMatch: null });
  const rows = [
    // Ten weeks at -96 dBFS, then the last two weeks 6 dB noisier.
    ...Array.from({ length: 20 }, (_, i) => summaryTake(studioId, session.id, drifting.id, { measuredAt: ago(16 + i * 3.5), noiseFloorDbfs: -96 + (i % 2) * 0.3, effectiveBits: 24 })),
    ...Array.from({ length: 6 }, (_, i) => summaryTake(studioId, session.id, drifting.id, { measuredAt: ago(1 + i * 2), noiseFloorDbfs: -90 + (i % 2) * 0.3, effectiveBits: 24 })),
    ...Array.from({ length: 12 }, (_, i) => summaryTake(studioId, session.id, quiet.id, { measuredAt: ago(1 + i * 6), noiseFloorDbfs: -101, effectiveBits: 24 })),
  ];
  await Take.bulkCreate(rows as never[]);
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await db().close();
});

const floorsOnPage = async (page: Page) =>
  (await page.locator('[data-testid=fleet-row] [data-col=medianFloorDbfs]').allTextContents()).map((t) => (t.trim() === '—' ? null : Number(t)));

describe('the fleet in the browser', () => {
  it('lets the manager sort the fleet by noise floor and open a drifting recorder with its alert', async () => {
    const context = await browser.newContext({ viewport: { width: 1400, height: 900 } });
    const page = await context.newPage();
    await signInAs(page, 'manager');

    // The overview lists the alert for the manager.
    const alertsSection = page.getByRole('region', { name: 'Fleet alerts' });
    await alertsSection.getByRole('link', { name: DRIFTING }).waitFor({ timeout: 15_000 });

    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Fleet' }).click();
    await page.waitForURL(`${BASE_URL}/fleet`);
    await page.getByRole('heading', { name: 'Fleet', level: 1 }).waitFor();

    const header = page.getByRole('columnheader', { name: /Noise floor/ });
    await header.getByRole('button').click();
    await expect(header.getAttribute('aria-sort')).resolves.toBe('descending');
    let floors = (await floorsOnPage(page)).filter((v): v is number => v !== null);
    expect(floors.length).toBeGreaterThanOrEqual(2);
    expect(floors).toEqual([...floors].sort((a, b) => b - a));

    await header.getByRole('button').click();
    await expect(header.getAttribute('aria-sort')).resolves.toBe('ascending');
    floors = (await floorsOnPage(page)).filter((v): v is number => v !== null);
    expect(floors).toEqual([...floors].sort((a, b) => a - b));
    // Sorted quietest first, the quiet converter comes before the drifting stage box.
    const labels = await page.locator('[data-testid=fleet-row] td:first-child a').allTextContents();
    expect(labels.indexOf(QUIET)).toBeLessThan(labels.indexOf(DRIFTING));

    const row = page.locator('[data-testid=fleet-row]', { hasText: DRIFTING });
    // The mark of a warning-level alert, with its count in words.
    await expect(row.textContent()).resolves.toContain(`${ALERT_STATUS.warn.mark} 1 alert`);
    await screenshot(page, 'fleet-table');

    await row.getByRole('link', { name: DRIFTING }).click();
    await page.waitForURL(/\/fleet\/\d+$/);
    await expect(page.getByRole('heading', { level: 1 }).textContent()).resolves.toBe(DRIFTING);
    const alert = page.locator('[data-testid=fleet-alert][data-kind=noise-drift]');
    await expect(alert.textContent()).resolves.toMatch(/Noise floor up 6\.\d dB/);
    await expect(alert.textContent()).resolves.toMatch(/Check|Act now/);

    // The three trend charts are drawn, with their units on the axes.
    const charts = page.locator('figure');
    await expect(charts.count()).resolves.toBe(3);
    await page.locator('.uplot canvas').first().waitFor();
    await expect(page.locator('.uplot').count()).resolves.toBe(3);
    // Axis labels are drawn on the canvas; the captions and the chart's accessible name carry the unit.
    const captions = await page.locator('figure figcaption').allTextContents();
    expect(captions).toEqual(['Noise floor per week (dBFS)', 'Effective bits per week (bits)', 'Integrated loudness spread per week (LUFS)']);
    await expect(page.getByRole('img', { name: 'Noise floor per week, dBFS, by week' }).isVisible()).resolves.toBe(true);
    const legend = await page.locator('.uplot .u-legend .u-label').allTextContents();
    expect(legend).toEqual(expect.arrayContaining(['Median noise floor', 'Fewest effective bits', '10th percentile', '90th percentile']));
    await expect(page.getByRole('link', { name: /fleet-test-/ }).count()).resolves.toBeGreaterThan(0);
    for (const theme of ['light', 'dark'] as const) {
      await page.evaluate((t) => (document.documentElement.dataset.theme = t), theme);
      await page.waitForTimeout(200);
      await screenshot(page, `fleet-recorder-${theme}`);
    }
    await context.close();
  });

  it('shows a delivery spec threshold error next to its field', async () => {
    const context = await browser.newContext();
    const page = await context.newPage();
    await signInAs(page, 'manager');
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Delivery specs' }).click();
    await page.waitForURL(`${BASE_URL}/specs`);
    await page.getByText(/take precedence over Takeproof’s defaults/).first().waitFor();
    await page.getByRole('link', { name: 'New spec' }).click();
    await page.waitForURL(`${BASE_URL}/specs/new`);
    await page.getByLabel('Name').fill(`Loud master ${tag}`);
    await page.getByLabel(/Loudness target/).fill('-60');
    await page.getByRole('button', { name: 'Create spec' }).click();
    const field = page.getByLabel(/Loudness target/);
    await page.getByText('Targets below -40 LUFS are not plausible').waitFor();
    await expect(field.getAttribute('aria-invalid')).resolves.toBe('true');
    await page.getByText('EBU R 128: −23 LUFS.').waitFor();
    await screenshot(page, 'spec-field-error');
    await page.getByLabel(/Loudness target/).fill('-18');
    await page.getByRole('button', { name: 'Create spec' }).click();
    await page.waitForURL(/\/specs\/\d+\?created=1$/);
    await expect(page.getByRole('heading', { level: 1 }).textContent()).resolves.toBe(`Loud master ${tag}`);
    await context.close();
  });
});
