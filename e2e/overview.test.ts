import assert from 'node:assert/strict';
import { after, before, test } from 'node:test';
import type { BrowserContext } from 'playwright-core';
import { launchBrowser } from './support/browser.ts';
import { startProduct, type RunningProduct } from './support/product.ts';

let product: RunningProduct;
let browser: BrowserContext;

before(async () => {
  // the rain gauge falls silent after the first plant hour, so its channel must be marked stale
  product = await startProduct(['--speed', '600', '--dropout', 'rain-gauge:1-72']);
  browser = await launchBrowser();
});

after(async () => {
  await browser?.close();
  const code = await product?.stop();
  assert.equal(code, 0, `Ctrl-C should stop the product cleanly:\n${product?.output()}`);
});

test('the overview shows the pool elevation rising live, and marks a silent channel stale', async () => {
  const page = await browser.newPage();
  await page.goto(product.url);
  // demo mode prints each account's password at start; sign in as the operator through the form
  const password = /^\s+operator\s+(\S+)\s/m.exec(product.output())?.[1];
  assert.ok(password, 'no demo password for the operator in the output');
  await page.locator('input[autocomplete="username"]').fill('operator');
  await page.locator('input[type="password"]').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  const pool = page.getByTestId('pool-elevation');
  await pool.waitFor({ timeout: 30_000 });
  const read = async () => Number.parseFloat((await pool.textContent()) ?? '');
  await page.waitForFunction(
    () =>
      Number.isFinite(
        Number.parseFloat(
          document.querySelector('[data-testid="pool-elevation"]')?.textContent ?? '',
        ),
      ),
    undefined,
    { timeout: 30_000 },
  );
  const first = await read();
  assert.ok(
    first > 190 && first < 215,
    `pool elevation ${first} m is not plausible for Lake Orrin`,
  );
  await page.waitForFunction(
    (start) => {
      const v = Number.parseFloat(
        document.querySelector('[data-testid="pool-elevation"]')?.textContent ?? '',
      );
      return Number.isFinite(v) && v !== start;
    },
    first,
    { timeout: 60_000 },
  );
  assert.notEqual(await read(), first);
  assert.match((await page.getByTestId('connection-state').textContent()) ?? '', /live|connected/i);

  await page.waitForSelector('[data-testid="channel-row-rain"][data-stale="true"]', {
    timeout: 60_000,
  });
  const poolRow = page.getByTestId('channel-row-pool.radar');
  assert.equal(await poolRow.getAttribute('data-stale'), 'false');
  await page.screenshot({ path: process.env.E2E_SCREENSHOT ?? '/tmp/stillwell-overview.png' });
});
