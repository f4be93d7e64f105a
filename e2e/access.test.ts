import assert from 'node:assert/strict';
import { after, before, test } from 'node:test';
import type { BrowserContext, Page } from 'playwright-core';
import { demoPassword, launchBrowser, signInThroughForm } from './support/browser.ts';
import { startProduct, type RunningProduct } from './support/product.ts';

let product: RunningProduct;
let browser: BrowserContext;

before(async () => {
  product = await startProduct(['--speed', '600']);
  browser = await launchBrowser();
});

after(async () => {
  await browser?.close();
  const code = await product?.stop();
  assert.equal(code, 0, `Ctrl-C should stop the product cleanly:\n${product?.output()}`);
});

const who = (page: Page) => page.getByTestId('signed-in-as');

async function signOut(page: Page): Promise<void> {
  await who(page).getByRole('button', { name: 'Sign out' }).click();
  await page.getByTestId('sign-in').waitFor({ timeout: 15_000 });
}

test("the operator sees the operator's screens and not the administrator's", async () => {
  const page = await browser.newPage();
  await page.goto(product.url);
  await signInThroughForm(page, 'operator', demoPassword(product.output(), 'operator'));

  assert.match((await who(page).textContent()) ?? '', /Signed in as\s*Mara Quill/);
  await who(page).getByText('Operator', { exact: true }).waitFor();
  await page.getByTestId('pool-elevation').waitFor({ timeout: 30_000 });
  const screens = page.getByRole('navigation', { name: 'Screens' });
  await screens.getByRole('link', { name: 'Gate orders' }).waitFor();
  assert.equal(await screens.getByRole('link', { name: 'Demo outbox' }).count(), 0);
  assert.equal(await who(page).getByRole('link', { name: 'Users' }).count(), 0);

  // typing the administrator's address: a clear refusal, and no accounts shown
  await page.goto(`${product.url}/users`);
  const refusal = page.getByTestId('not-allowed');
  await refusal.waitFor({ timeout: 30_000 });
  assert.match((await refusal.textContent()) ?? '', /Not allowed.*Your roles \(Operator\)/s);
  assert.equal(await page.getByTestId('users-grid').count(), 0);
  // the gateway refuses the operator as well: the console's hiding is not the control
  const signedIn = await fetch(`${product.url}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({
      username: 'operator',
      password: demoPassword(product.output(), 'operator'),
    }),
  });
  const { accessToken } = (await signedIn.json()) as { accessToken: string };
  const users = await fetch(`${product.url}/api/users`, {
    headers: { Authorization: `Bearer ${accessToken}` },
  });
  assert.equal(users.status, 403);

  await signOut(page);
  await page.close();
});

test('the administrator creates an account, and that person signs in and chooses a password', async () => {
  const page = await browser.newPage();
  await page.goto(product.url);
  const adminPassword = demoPassword(product.output(), 'admin');
  await signInThroughForm(page, 'admin', adminPassword);

  await who(page).getByRole('link', { name: 'Users' }).click();
  const grid = page.getByTestId('users-grid');
  await grid.getByText('Mara Quill').waitFor({ timeout: 30_000 });

  await page.getByTestId('new-user').click();
  const form = page.getByTestId('create-user');
  await form.getByLabel('Username').fill('wren.ashby');
  await form.getByLabel('Full name').fill('Wren Ashby');
  await form.getByLabel('Reviewer').check();
  await form.getByTestId('create-user-submit').click();
  // creating an account is an authorising act: the password again
  await page.getByTestId('step-up-password').fill(adminPassword);
  await page.getByTestId('step-up-confirm').click();
  const secret = page.getByTestId('temporary-password');
  await secret.waitFor({ timeout: 30_000 });
  const temporary = ((await secret.textContent()) ?? '').trim();
  assert.ok(temporary.length >= 8, `temporary password "${temporary}"`);
  await page.getByRole('button', { name: 'Done' }).click();
  await grid.getByText('Wren Ashby').waitFor();
  await signOut(page);

  await signInThroughForm(page, 'wren.ashby', temporary);
  const first = page.getByTestId('first-password');
  await first.waitFor();
  await first.getByLabel('Temporary password').fill(temporary);
  await first.getByLabel('New password', { exact: true }).fill('short');
  await first.getByRole('button', { name: 'Change password' }).click();
  await first.getByText('at least 8 characters').waitFor();
  await first.getByLabel('New password', { exact: true }).fill('copper-reeds-below-the-weir');
  await first.getByLabel('New password again').fill('copper-reeds-below-the-weir');
  await first.getByRole('button', { name: 'Change password' }).click();

  await who(page).waitFor({ timeout: 30_000 });
  assert.match((await who(page).textContent()) ?? '', /Wren Ashby/);
  await who(page).getByText('Reviewer', { exact: true }).waitFor();
  assert.equal(await who(page).getByRole('link', { name: 'Users' }).count(), 0);
  await page.close();
});
