import { mkdirSync } from 'node:fs';
import { chromium, type Browser, type Page } from 'playwright-core';
import { BASE_URL, DEMO, DEMO_PASSWORD, type DemoPerson } from './http';

export { BASE_URL };

/** Debian's Chromium, headless, with the background network traffic it would otherwise attempt turned off. */
export function launchBrowser(): Promise<Browser> {
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    headless: true,
    args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  });
}

/** Signs in through the real sign-in form. */
export async function signInAs(page: Page, person: DemoPerson): Promise<void> {
  await page.goto(`${BASE_URL}/signin`);
  await page.getByLabel('E-mail').fill(DEMO[person]);
  await page.getByLabel('Password').fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL(`${BASE_URL}/`);
}

export async function screenshot(page: Page, name: string): Promise<void> {
  mkdirSync('var/screenshots', { recursive: true });
  await page.screenshot({ path: `var/screenshots/${name}.png`, fullPage: true });
}
