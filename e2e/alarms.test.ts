import assert from 'node:assert/strict';
import { after, before, test } from 'node:test';
import type { BrowserContext, Page } from 'playwright-core';
import { launchBrowser } from './support/browser.ts';
import { startProduct, type RunningProduct } from './support/product.ts';

const RES = 'lake-orrin';
const COMMENT = 'rain gauge checked: the logger is down, rain from the radar meanwhile';

let product: RunningProduct;
let browser: BrowserContext;

before(async () => {
  // the rain gauge falls silent from 0.1 h: its stale alarm (advisory) comes within seconds at 600x
  product = await startProduct(['--speed', '600', '--dropout', 'rain-gauge:0.1-72']);
  browser = await launchBrowser();
});

after(async () => {
  await browser?.close();
  const code = await product?.stop();
  assert.equal(code, 0, `Ctrl-C should stop the product cleanly:\n${product?.output()}`);
});

/** Demo mode prints each account's password at start; sign in with it through the API. */
async function tokenOf(role: string): Promise<string> {
  const password = new RegExp(`^\\s+${role}\\s+(\\S+)\\s`, 'm').exec(product.output())?.[1];
  assert.ok(password, `no demo password for ${role} in the output`);
  const res = await fetch(`${product.url}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ username: role, password }),
  });
  assert.equal(res.status, 200, await res.clone().text());
  return ((await res.json()) as { accessToken: string }).accessToken;
}

/**
 * The console has no sign-in screen yet: the operator's page sends the operator's access token
 * with every request, as the console's API client will once sign-in lands.
 */
async function pageAs(role: string): Promise<Page> {
  const page = await browser.newPage();
  await page.setExtraHTTPHeaders({ Authorization: `Bearer ${await tokenOf(role)}` });
  return page;
}

test('an alarm shows in the banner and the list, is acknowledged with a comment, and the logbook has it', async () => {
  const page = await pageAs('operator');
  await page.goto(`${product.url}/reservoirs/${RES}/overview`);
  // the banner is on every screen: here on the overview first
  await page.waitForFunction(
    () =>
      Number(
        document
          .querySelector('[data-testid="alarm-count-advisory"]')
          ?.getAttribute('data-unacknowledged') ?? 0,
      ) >= 1,
    undefined,
    { timeout: 60_000 },
  );
  await page.getByTestId('alarm-banner').getByRole('link').click();
  const row = page.getByTestId('alarm-row-stale.rain-gauge');
  await row.waitFor({ timeout: 30_000 });
  assert.equal(await row.getAttribute('data-state'), 'unacknowledged');
  assert.match((await row.textContent()) ?? '', /No readings from rain-gauge/);

  await row.getByRole('button', { name: 'Acknowledge' }).click();
  await page.getByTestId('alarm-action-text').fill(COMMENT);
  await page.getByTestId('alarm-action-confirm').click();
  await page.waitForSelector(
    '[data-testid="alarm-row-stale.rain-gauge"][data-state="acknowledged"]',
    {
      timeout: 30_000,
    },
  );

  await row.getByRole('button', { name: 'History' }).click();
  await page
    .getByTestId('alarm-history')
    .getByText(/Acknowledged by operator/)
    .waitFor({ timeout: 30_000 });

  await page.goto(`${product.url}/reservoirs/${RES}/logbook`);
  const entry = page.getByTestId('logbook-grid').getByText(COMMENT);
  await entry.waitFor({ timeout: 30_000 });
  assert.match((await page.getByTestId('logbook-grid').textContent()) ?? '', /alarm\.acknowledged/);
  await page.screenshot({ path: process.env.E2E_ALARMS_SCREENSHOT ?? '/tmp/stillwell-alarms.png' });
});
