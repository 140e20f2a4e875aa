import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { BASE_URL, launchBrowser, screenshot, signInAs } from '../support/browser';
import { signedIn } from '../support/http';
import { mailTo, uniqueAddress } from '../support/mail';

let browser: Browser;
let sessionId: number;
const TITLE = `Foghorn Diaries — episode ${Date.now() % 10000}`;

beforeAll(async () => {
  browser = await launchBrowser();
  const manager = await signedIn('manager');
  const response = await manager.fetch('/api/sessions', { method: 'POST', json: { title: TITLE, room: 'Booth A' } });
  sessionId = (await response.json()).id;
}, 120_000);

afterAll(async () => {
  await browser?.close();
});

describe('the session report panel', () => {
  it('lets a producer send the report from the keyboard, showing field errors and the result in words', async () => {
    const page = await browser.newPage({ viewport: { width: 1280, height: 900 } });
    await signInAs(page, 'producer');
    await page.goto(`${BASE_URL}/sessions/${sessionId}`);
    await expect(page.getByRole('link', { name: 'Download PDF' }).getAttribute('href')).resolves.toBe(`/api/sessions/${sessionId}/report.pdf`);
    const toggle = page.getByRole('button', { name: 'Send report', exact: true });
    await expect(toggle.getAttribute('aria-expanded')).resolves.toBe('false');
    await toggle.focus();
    await page.keyboard.press('Enter');
    await expect(toggle.getAttribute('aria-expanded')).resolves.toBe('true');

    await page.getByLabel('Recipients').fill('edit-suite@demo.test, not-an-address');
    await page.getByRole('button', { name: 'Send to recipients' }).click();
    await expect(page.getByRole('form', { name: 'Send report' }).locator('.tp-field-error').first().textContent()).resolves.toContain('“not-an-address” is not a valid e-mail address');

    const to = uniqueAddress('edit-suite');
    await page.getByLabel('Recipients').fill(to);
    await page.getByLabel('Message (optional)').fill('Pickups are in; please check scene 2.');
    await page.getByLabel('Message (optional)').press('Tab');
    await page.keyboard.press('Enter');
    const status = page.getByTestId('report-result');
    // The report goes through the outbox: the line says so, then that it was sent.
    await status.filter({ hasText: 'Report sent to' }).waitFor();
    await expect(status.textContent()).resolves.toBe(`✉Report sent to ${to}.`);
    const { mail } = await mailTo(to);
    expect(mail.subject).toContain(TITLE);
    expect(mail.text).toContain('Pickups are in; please check scene 2.');
    // The sent report is listed with a word, not only a colour.
    await expect(page.getByText('Sent reports').isVisible()).resolves.toBe(true);
    await expect(page.locator('li', { hasText: to }).textContent()).resolves.toContain('Sent');
    for (const theme of ['light', 'dark'] as const) {
      await page.evaluate((t) => (document.documentElement.dataset.theme = t), theme);
      await screenshot(page, `session-report-${theme}`);
    }
    await page.close();
  });

  it('gives an engineer the downloads but no send form', async () => {
    const page = await browser.newPage();
    await signInAs(page, 'engineer');
    await page.goto(`${BASE_URL}/sessions/${sessionId}`);
    await screenshot(page, 'session-report-engineer');
    await page.getByRole('link', { name: 'Download CSV' }).waitFor({ timeout: 10_000 });
    await expect(page.getByRole('button', { name: 'Send report' }).count()).resolves.toBe(0);
    await page.close();
  });
});

describe('inviting a person through the team page', () => {
  it('sends an invitation, the link sets a password, and the new person signs in', async () => {
    const email = uniqueAddress('booth-op');
    const context = await browser.newContext();
    const page = await context.newPage();
    await signInAs(page, 'manager');
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Team' }).click();
    await page.waitForURL(`${BASE_URL}/team`);
    await page.getByLabel('Name').fill('Juno Halvorsen');
    await page.getByLabel('E-mail').fill(email);
    await page.getByLabel('Role', { exact: true }).selectOption('producer');
    await page.getByRole('button', { name: 'Send invitation', exact: true }).click();
    const notice = page.getByTestId('team-notice');
    await notice.waitFor();
    await expect(notice.textContent()).resolves.toBe(`✓ Invitation sent to ${email}.`);
    await expect(notice.getAttribute('role')).resolves.toBe('status');
    await expect(page.locator('tr', { hasText: email }).textContent()).resolves.toContain('Invited');
    await screenshot(page, 'team');

    // The last manager cannot demote themselves: the page says so in plain words.
    await page.getByLabel('Role of Maren Lindqvist').selectOption('producer');
    await page.getByRole('button', { name: 'Apply role for Maren Lindqvist' }).click();
    await page.waitForFunction(() => document.querySelector('[data-testid=team-notice]')?.getAttribute('role') === 'alert');
    await expect(notice.textContent()).resolves.toBe('✕ The studio needs at least one active manager. Make someone else a manager first.');
    // The refused choice goes back to the role the person still has (a render after the notice: wait for it).
    await expect.poll(() => page.getByLabel('Role of Maren Lindqvist').inputValue()).toBe('manager');
    await context.close();

    const { mail } = await mailTo(email);
    const link = /(http:\/\/\S+\/invite\/[A-Za-z0-9_-]{43})/.exec(mail.text ?? '')![1];
    const guest = await browser.newContext();
    const invitePage = await guest.newPage();
    await invitePage.goto(link);
    await expect(invitePage.getByRole('heading', { level: 1 }).textContent()).resolves.toBe('Welcome, Juno Halvorsen');
    await invitePage.getByLabel('New password').fill('short');
    await invitePage.getByLabel('Repeat the password').fill('short');
    await invitePage.getByRole('button', { name: 'Set password and activate' }).click();
    await expect(invitePage.getByRole('form', { name: 'Set your password' }).locator('.tp-field-error').first().textContent()).resolves.toContain('Use at least 10 characters');
    await invitePage.getByLabel('New password').fill('monitor-wedge-42');
    await invitePage.getByLabel('Repeat the password').fill('monitor-wedge-42');
    await invitePage.getByRole('button', { name: 'Set password and activate' }).click();
    await invitePage.getByText('Your account is ready.').waitFor();
    await invitePage.getByRole('link', { name: 'Sign in' }).click();
    await invitePage.waitForURL(`${BASE_URL}/signin`);
    await invitePage.getByLabel('E-mail').fill(email);
    await invitePage.getByLabel('Password').fill('monitor-wedge-42');
    await invitePage.getByRole('button', { name: 'Sign in' }).click();
    await invitePage.waitForURL(`${BASE_URL}/`);
    await expect(invitePage.getByRole('heading', { level: 1 }).textContent()).resolves.toBe('Hello, Juno');
    await guest.close();

    // Juno forgets the password: the manager sends a reset link from the team page, and it sets a new one.
    const desk = await browser.newContext();
    const managerPage = await desk.newPage();
    await signInAs(managerPage, 'manager');
    await managerPage.goto(`${BASE_URL}/team`);
    await managerPage.getByRole('button', { name: 'Send reset link to Juno Halvorsen' }).click();
    await expect.poll(() => managerPage.getByTestId('team-notice').textContent()).toContain(`A link to choose a new password was sent to ${email}.`);
    await desk.close();
    await expect.poll(async () => (await mailTo(email)).mail.subject).toMatch(/Choose a new password/);
    const resetLink = /(http:\/\/\S+\/invite\/[A-Za-z0-9_-]{43})/.exec((await mailTo(email)).mail.text ?? '')![1];
    const later = await browser.newContext();
    const resetPage = await later.newPage();
    await resetPage.goto(resetLink);
    await expect(resetPage.getByRole('heading', { level: 1 }).textContent()).resolves.toBe('Choose a new password, Juno Halvorsen');
    await resetPage.getByLabel('New password').fill('talkback-button-7');
    await resetPage.getByLabel('Repeat the password').fill('talkback-button-7');
    await resetPage.getByRole('button', { name: 'Save the new password' }).click();
    await resetPage.getByText('Your new password is set.').waitFor();
    await resetPage.getByRole('link', { name: 'Sign in' }).click();
    await resetPage.getByLabel('E-mail').fill(email);
    await resetPage.getByLabel('Password').fill('talkback-button-7');
    await resetPage.getByRole('button', { name: 'Sign in' }).click();
    await resetPage.waitForURL(`${BASE_URL}/`);
    await later.close();
  });
});
