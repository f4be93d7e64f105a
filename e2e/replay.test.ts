import assert from 'node:assert/strict';
import { after, before, test } from 'node:test';
import type { BrowserContext, Page } from 'playwright-core';
import { demoPassword, launchBrowser, signInThroughForm } from './support/browser.ts';
import { apiToken, startProduct, type RunningProduct } from './support/product.ts';
import { until } from './support/waits.ts';

const RES = 'lake-orrin';
const NOTES = [
  'replay check: pool rising, gates closed',
  'replay check: rain easing at the gauge',
  'replay check: spillway watch posted',
];

let product: RunningProduct;
let browser: BrowserContext;

before(async () => {
  // one site hour a wall second: the storm's rise past the watch level is recorded within a minute
  product = await startProduct(['--speed', '3600']);
  browser = await launchBrowser();
});

after(async () => {
  await browser?.close();
  const code = await product?.stop();
  assert.equal(code, 0, `Ctrl-C should stop the product cleanly:\n${product?.output()}`);
});

const tokenOf = (role: string) => apiToken(product, role);

interface EventList {
  events: Array<{ id: string; kind: string; fromMs: number; toMs: number }>;
}

const cursorOf = async (page: Page) =>
  Number(await page.getByTestId('replay-chart').getAttribute('data-cursor-ms'));
const currentKeyOf = async (page: Page) =>
  (await page.getByTestId('replay-entry-list').getAttribute('data-current-key')) ?? '';

test('the replay of the demo storm plays at speed: the chart cursor and the record move together, and a click on an entry jumps there', async () => {
  const reviewer = await tokenOf('reviewer');
  await until('the storm in the record (pool above the watch level)', async () => {
    const res = await fetch(`${product.url}/api/reservoirs/${RES}/replay/events`, {
      headers: { Authorization: `Bearer ${reviewer}` },
    });
    const list = (await res.json()) as EventList;
    return list.events.some((e) => e.kind === 'high-pool') ? true : undefined;
  });

  // shift notes during the storm, two site hours apart: the record the replay must step through
  const operator = await tokenOf('operator');
  for (const text of NOTES) {
    const form = new FormData();
    form.set('text', text);
    const res = await fetch(`${product.url}/api/logbook/shift-notes`, {
      method: 'POST',
      headers: { Authorization: `Bearer ${operator}` },
      body: form,
    });
    assert.ok(res.ok, `shift note: ${res.status} ${await res.clone().text()}`);
    await new Promise((r) => setTimeout(r, 2000));
  }

  const page = await browser.newPage();
  await page.goto(`${product.url}/reservoirs/${RES}/overview`);
  await signInThroughForm(page, 'reviewer', demoPassword(product.output(), 'reviewer'));
  await page.getByRole('link', { name: 'Replay' }).first().click();
  await page.getByTestId('replay-screen').waitFor({ timeout: 30_000 });

  // choose the storm found in the record
  await page.getByRole('combobox', { name: 'Event' }).click();
  await page.getByTestId('replay-event-high-pool').first().click();
  await page.getByTestId('replay-chart').waitFor({ timeout: 30_000 });
  const list = page.getByTestId('replay-entry-list');
  await list.waitFor({ timeout: 30_000 });
  for (const text of NOTES) await list.getByText(text).waitFor({ timeout: 30_000 });
  assert.match(
    (await page.getByTestId('replay-resolution').textContent()) ?? '',
    /Raw readings|One-minute aggregates|Hourly roll-ups/,
  );

  const startCursor = await cursorOf(page);
  const startKey = await currentKeyOf(page);
  await page.getByRole('combobox', { name: 'Speed' }).click();
  await page.getByRole('option', { name: '3600x' }).click();
  await page.getByTestId('replay-play').click();
  await page.waitForFunction(
    ([start, key]) => {
      const cursor = Number(
        document.querySelector('[data-testid="replay-chart"]')?.getAttribute('data-cursor-ms'),
      );
      const current = document
        .querySelector('[data-testid="replay-entry-list"]')
        ?.getAttribute('data-current-key');
      return cursor > Number(start) + 3_600_000 && current !== key;
    },
    [String(startCursor), startKey] as const,
    { timeout: 60_000 },
  );
  await page.screenshot({ path: process.env.E2E_REPLAY_SCREENSHOT ?? '/tmp/stillwell-replay.png' });
  assert.equal(await page.getByTestId('replay-play').textContent(), 'Pause');
  await page.getByTestId('replay-play').click();
  const paused = await cursorOf(page);
  await new Promise((r) => setTimeout(r, 500));
  assert.equal(await cursorOf(page), paused, 'the cursor stays put while paused');
  assert.ok(paused > startCursor, 'the cursor moved while playing');

  // a click on the first shift note moves the cursor to its time and makes it current
  const item = list.locator('li', { hasText: NOTES[0] });
  const itemKey = ((await item.getAttribute('data-testid')) ?? '').replace('replay-item-', '');
  const itemMs = Number(await item.getAttribute('data-site-time-ms'));
  assert.ok(Number.isFinite(itemMs) && itemMs > 0, 'the entry carries its site time');
  await item.getByRole('button').click();
  await page.waitForFunction(
    (ms) =>
      document.querySelector('[data-testid="replay-chart"]')?.getAttribute('data-cursor-ms') ===
      String(Math.round(ms)),
    itemMs,
    { timeout: 10_000 },
  );
  assert.equal(await cursorOf(page), Math.round(itemMs));
  assert.equal(await currentKeyOf(page), itemKey);
  assert.equal(await item.getAttribute('data-current'), 'true');
});
