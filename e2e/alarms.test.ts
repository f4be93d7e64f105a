import assert from 'node:assert/strict';
import { after, before, test } from 'node:test';
import type { BrowserContext, Page } from 'playwright-core';
import { demoPassword, launchBrowser, signInThroughForm } from './support/browser.ts';
import { startProduct, type RunningProduct } from './support/product.ts';

const RES = 'lake-orrin';
const COMMENT = 'rain gauge checked: the logger is down, rain from the radar meanwhile';
const LIMITS_NOTE = 'left weir notch recut after the survey: alarm limit raised (e2e)';
const SHOTS = process.env.E2E_SCREENSHOTS ?? '/tmp';

let product: RunningProduct;
// one person per browser: a session lives in its browser's refresh cookie
let operatorBrowser: BrowserContext;
let engineerBrowser: BrowserContext;

before(async () => {
  // the rain gauge falls silent from 0.1 h: its stale alarm (advisory) comes within seconds at 600x
  product = await startProduct(['--speed', '600', '--dropout', 'rain-gauge:0.1-72']);
  operatorBrowser = await launchBrowser();
  engineerBrowser = await launchBrowser();
});

after(async () => {
  await operatorBrowser?.close();
  await engineerBrowser?.close();
  const code = await product?.stop();
  assert.equal(code, 0, `Ctrl-C should stop the product cleanly:\n${product?.output()}`);
});

/** Opens a console page and signs in through its own form, as a person does. */
async function openAs(
  browser: BrowserContext,
  role: string,
  path: string,
  watch?: (page: Page) => void,
): Promise<Page> {
  const page = await browser.newPage();
  watch?.(page);
  await page.goto(`${product.url}${path}`);
  await signInThroughForm(page, role, demoPassword(product.output(), role));
  return page;
}

async function api<T>(role: string, path: string): Promise<T> {
  const signedIn = await fetch(`${product.url}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ username: role, password: demoPassword(product.output(), role) }),
  });
  assert.equal(signedIn.status, 200, await signedIn.clone().text());
  const { accessToken } = (await signedIn.json()) as { accessToken: string };
  const res = await fetch(`${product.url}${path}`, {
    headers: { Authorization: `Bearer ${accessToken}` },
  });
  assert.equal(res.status, 200, await res.clone().text());
  return (await res.json()) as T;
}

test('an alarm shows in the banner and the list, is acknowledged with a comment, and the logbook has it', async () => {
  // alarm lists the gateway pushes to this page over the live socket
  let pushed = 0;
  const page = await openAs(operatorBrowser, 'operator', `/reservoirs/${RES}/overview`, (p) =>
    p.on('websocket', (ws) =>
      ws.on('framereceived', (f) => {
        if (String(f.payload).includes('"alarm-list"')) pushed++;
      }),
    ),
  );
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
  assert.ok(pushed >= 1, 'the alarm list should come pushed over the live socket');
  await page.getByTestId('alarm-banner').getByRole('link').click();
  const row = page.getByTestId('alarm-row-stale.rain-gauge');
  await row.waitFor({ timeout: 30_000 });
  assert.equal(await row.getAttribute('data-state'), 'unacknowledged');
  assert.match((await row.textContent()) ?? '', /No readings from rain-gauge/);
  await page.screenshot({ path: `${SHOTS}/stillwell-alarm-list.png` });

  await row.getByRole('button', { name: 'Acknowledge' }).click();
  await page.getByTestId('alarm-action-text').fill(COMMENT);
  await page.getByTestId('alarm-action-confirm').click();
  await page.waitForSelector(
    '[data-testid="alarm-row-stale.rain-gauge"][data-state="acknowledged"]',
    { timeout: 30_000 },
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
  await page.screenshot({ path: `${SHOTS}/stillwell-alarms-logbook.png` });
});

interface Reservoir {
  version: number;
  definition: { seepageWeirs: Array<{ id: string; maxFlow: number }> };
}

test('the engineer raises a seepage limit through the form, confirming identity, and a new version holds it', async () => {
  const before = await api<Reservoir>('engineer', `/api/reservoirs/${RES}`);
  const page = await openAs(engineerBrowser, 'engineer', `/reservoirs/${RES}/dam-safety`);
  const form = page.getByTestId('limits-form');
  await form.waitFor({ timeout: 30_000 });
  assert.equal(await form.getAttribute('data-version'), String(before.version));
  const maxFlow = page.getByTestId('limit-weir.weir-left.maxFlow');
  // the demo definition's left weir alarms above 0.015 m3/s, shown in l/s
  assert.equal(await maxFlow.inputValue(), '15');
  await page.getByTestId('weir-latest-weir-left').waitFor({ timeout: 30_000 });
  await page.screenshot({ path: `${SHOTS}/stillwell-dam-safety.png`, fullPage: true });

  await maxFlow.fill('16.5');
  await page.getByTestId('limits-note').fill(LIMITS_NOTE);
  await page.getByTestId('limits-save').click();
  await page.getByTestId('step-up-password').fill(demoPassword(product.output(), 'engineer'));
  await page.getByTestId('step-up-confirm').click();

  const next = before.version + 1;
  const saved = page.getByTestId('limits-saved');
  await saved.waitFor({ timeout: 30_000 });
  assert.match(
    (await saved.textContent()) ?? '',
    new RegExp(`version ${next}: Left abutment weir, alarm above: 15 → 16\\.5 l/s`),
  );
  const after = await api<Reservoir>('engineer', `/api/reservoirs/${RES}`);
  assert.equal(after.version, next);
  assert.equal(after.definition.seepageWeirs.find((w) => w.id === 'weir-left')?.maxFlow, 0.0165);

  // the form opens again on the new version, showing the limit now in force
  await page.locator(`[data-testid="limits-form"][data-version="${next}"]`).waitFor();
  await page.screenshot({ path: `${SHOTS}/stillwell-dam-safety-saved.png`, fullPage: true });
  assert.equal(await maxFlow.inputValue(), '16.5');
});
