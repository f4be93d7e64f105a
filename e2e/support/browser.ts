import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';

/** Debian's Chromium through playwright-core: never a downloaded browser. */
export function launchBrowser(): Promise<BrowserContext> {
  return chromium.launchPersistentContext(mkdtempSync(join(tmpdir(), 'stillwell-chromium-')), {
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    headless: true,
    viewport: { width: 1600, height: 1000 },
    args: [
      '--headless',
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
  });
}

/** The password `npm start` printed for a demo account (demo mode only). */
export function demoPassword(output: string, role: string): string {
  const password = new RegExp(`^\\s+${role}\\s+(\\S+)\\s`, 'm').exec(output)?.[1];
  if (!password) throw new Error(`no demo password for ${role} in the product's output`);
  return password;
}

/**
 * Signs in through the console's sign-in form, as a person does, and waits for the console to
 * open: the shell names who is signed in, or the first-password screen asks for a new one.
 */
export async function signInThroughForm(
  page: Page,
  username: string,
  password: string,
): Promise<void> {
  const form = page.getByTestId('sign-in');
  await form.waitFor({ timeout: 30_000 });
  await form.locator('input[autocomplete="username"]').fill(username);
  await form.locator('input[type="password"]').fill(password);
  await form.getByRole('button', { name: 'Sign in' }).click();
  await page
    .locator('[data-testid="signed-in-as"], [data-testid="first-password"]')
    .first()
    .waitFor({ timeout: 30_000 });
}
