import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { BASE_URL, launchBrowser, screenshot, signInAs } from '../support/browser';
import { newPerson, newStudio, testDb } from '../support/people';

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await testDb.end();
});

describe('signing in through the browser', () => {
  it('shows a styled sign-in page that uses the shipped font', async () => {
    const page = await browser.newPage();
    await page.goto(`${BASE_URL}/signin`);
    await expect(page.getByRole('heading', { name: 'Sign in' }).isVisible()).resolves.toBe(true);
    const font = await page.evaluate(() => getComputedStyle(document.body).fontFamily);
    expect(font).toMatch(/atkinsonHyperlegible/);
    // The font file is served by Takeproof itself and really loads (no font CDN).
    const loaded = await page.evaluate(async () => {
      await document.fonts.ready;
      return [...document.fonts].filter((f) => f.status === 'loaded').map((f) => f.family);
    });
    expect(loaded.some((family) => /atkinsonHyperlegible/.test(family))).toBe(true);
    // The page must have loaded Tailwind's output: the card has a border and a background of its own.
    const cardBorder = await page.locator('.tp-card').first().evaluate((el) => getComputedStyle(el).borderTopWidth);
    expect(cardBorder).toBe('1px');
    await screenshot(page, 'sign-in');
    await page.close();
  });

  it('tells the person plainly when the password is wrong', async () => {
    const page = await browser.newPage();
    await page.goto(`${BASE_URL}/signin`);
    await page.getByLabel('E-mail').fill('producer@demo.test');
    await page.getByLabel('Password').fill('wrong-password');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await expect(page.locator('form [role=alert]').textContent()).resolves.toMatch(/do not match/);
    expect(page.url()).toBe(`${BASE_URL}/signin`);
    await page.close();
  });

  const expectedNav = {
    engineer: { shows: ['Overview', 'Sessions', 'Converter checks'], role: 'Engineer' },
    producer: { shows: ['Overview', 'Sessions'], role: 'Producer' },
    manager: { shows: ['Overview', 'Sessions', 'Fleet', 'Converter checks', 'Delivery specs', 'Team', 'Audit log', 'Outbox'], role: 'Studio manager' },
  } as const;

  for (const person of ['engineer', 'producer', 'manager'] as const) {
    it(`lets the ${person} in and shows the navigation for that role`, async () => {
      const context = await browser.newContext();
      const page = await context.newPage();
      await signInAs(page, person);
      const nav = page.getByRole('navigation', { name: 'Main' });
      const links = await nav.getByRole('link').allTextContents();
      expect(links).toEqual([...expectedNav[person].shows]);
      await expect(page.getByTestId('who').textContent()).resolves.toContain(expectedNav[person].role);
      await page.getByRole('button', { name: 'Sign out' }).click();
      await page.waitForURL(/\/signin/);
      await context.close();
    });
  }

  it('creates a session from the form and opens it', async () => {
    const context = await browser.newContext();
    const page = await context.newPage();
    await signInAs(page, 'engineer');
    await page.getByRole('link', { name: 'Sessions' }).click();
    await page.getByLabel('Title').fill('Seaside ambience walk');
    await page.getByLabel('Room').fill('Pier');
    await page.getByRole('button', { name: 'Create session' }).click();
    await page.waitForURL(/\/sessions\/\d+$/);
    await expect(page.getByRole('heading', { level: 1 }).textContent()).resolves.toBe('Seaside ambience walk');
    for (const theme of ['light', 'dark'] as const) {
      await page.evaluate((t) => (document.documentElement.dataset.theme = t), theme);
      await screenshot(page, `session-${theme}`);
    }
    await context.close();
  });

  it('changes the person’s own password from their account page and sends them to sign in again', async () => {
    const person = await newPerson(await newStudio('Account page'), 'producer', 'account-page');
    const next = 'harbour-lights-at-dawn';
    const context = await browser.newContext();
    const page = await context.newPage();
    const signIn = async (password: string) => {
      await page.getByLabel('E-mail').fill(person.email);
      await page.getByLabel('Password').fill(password);
      await page.getByRole('button', { name: 'Sign in' }).click();
    };
    await page.goto(`${BASE_URL}/signin`);
    await signIn(person.password);
    await page.waitForURL(`${BASE_URL}/`);

    await page.getByTestId('who').click();
    await page.getByRole('heading', { name: 'Change your password' }).waitFor();
    await page.getByLabel('Current password').fill('not-the-password');
    await page.getByLabel('New password', { exact: true }).fill(next);
    await page.getByLabel('Repeat the new password').fill(next);
    await page.getByRole('button', { name: 'Save the new password' }).click();
    await expect(page.getByText('That is not your current password.').textContent()).resolves.toMatch(/not your current password/);

    await page.getByLabel('Current password').fill(person.password);
    await page.getByRole('button', { name: 'Save the new password' }).click();
    await page.waitForURL(/\/signin\?notice=password-changed/);
    await expect(page.getByTestId('sign-in-notice').textContent()).resolves.toMatch(/password was changed/);
    await signIn(next);
    await page.waitForURL(`${BASE_URL}/`);
    await context.close();
  });
});
