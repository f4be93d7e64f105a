import assert from 'node:assert/strict';
import { after, before, test } from 'node:test';
import type { BrowserContext, Page } from 'playwright-core';
import { launchBrowser } from './support/browser.ts';
import { startProduct, type RunningProduct } from './support/product.ts';
import { until } from './support/waits.ts';

const RES = 'lake-orrin';
const ORDERS = `/reservoirs/${RES}/orders`;

let product: RunningProduct;
// two browsers: the operator on shift and the duty engineer, each with a session of their own
let operatorBrowser: BrowserContext;
let engineerBrowser: BrowserContext;
const tokens = new Map<string, string>();

before(async () => {
  // at 360x the default grace (120 site seconds) is a third of a wall second: too tight for a loaded
  // CI machine, where the gate's first position report can lag that much
  product = await startProduct(['--speed', '360'], { ORDER_FOLLOW_GRACE_S: '1800' });
  operatorBrowser = await launchBrowser();
  engineerBrowser = await launchBrowser();
});

after(async () => {
  await operatorBrowser?.close();
  await engineerBrowser?.close();
  const code = await product?.stop();
  assert.equal(code, 0, `Ctrl-C should stop the product cleanly:\n${product?.output()}`);
});

/** Demo mode prints each account's password at start. */
function passwordOf(role: string): string {
  const password = new RegExp(`^\\s+${role}\\s+(\\S+)\\s`, 'm').exec(product.output())?.[1];
  assert.ok(password, `no demo password for ${role} in the output`);
  return password;
}

async function tokenOf(role: string): Promise<string> {
  const known = tokens.get(role);
  if (known) return known;
  const res = await fetch(`${product.url}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ username: role, password: passwordOf(role) }),
  });
  assert.equal(res.status, 200, await res.clone().text());
  const token = ((await res.json()) as { accessToken: string }).accessToken;
  tokens.set(role, token);
  return token;
}

async function api<T>(role: string, path: string): Promise<T> {
  const res = await fetch(`${product.url}${path}`, {
    headers: { Authorization: `Bearer ${await tokenOf(role)}` },
  });
  assert.ok(res.ok, `${path}: ${res.status} ${await res.clone().text()}`);
  return (await res.json()) as T;
}

/**
 * Signs a person in through the console's own form, once per browser: the session then lives in
 * that browser's refresh cookie, and every page opened later in it resumes the session.
 */
const signedIn = new WeakMap<BrowserContext, string>();
async function pageAs(browser: BrowserContext, role: string): Promise<Page> {
  const page = await browser.newPage();
  if (signedIn.get(browser) === role) return page;
  assert.equal(signedIn.get(browser), undefined, 'one person per browser');
  await page.goto(`${product.url}${ORDERS}`);
  await page.locator('input[autocomplete="username"]').fill(role);
  await page.locator('input[type="password"]').fill(passwordOf(role));
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByTestId('connection-state').waitFor({ timeout: 30_000 });
  signedIn.set(browser, role);
  return page;
}

async function openOrder(page: Page, id: number): Promise<void> {
  await page.goto(`${product.url}${ORDERS}`);
  await page.locator(`[data-testid="order-row"][data-order-id="${id}"]`).first().click();
  await page.locator(`[data-testid="order-detail"][data-order-id="${id}"]`).waitFor();
}

interface Status {
  pool: unknown;
  channels: Array<{ channel: string; value: number }>;
}

test('operator drafts, engineer authorises, operator sends, the gate moves, the logbook holds every step', async () => {
  await until('a fresh pool reading and gate positions', async () => {
    const s = await api<Status>('operator', `/api/reservoirs/${RES}/status`);
    return s.pool && s.channels.some((c) => c.channel === 'gate.3.opening') ? true : undefined;
  });

  // the operator drafts and sees the routed effect before submitting
  const operator = await pageAs(operatorBrowser, 'operator');
  await operator.goto(`${product.url}${ORDERS}`);
  await operator.getByTestId('draft-open').click();
  await operator.getByTestId('draft-target-0-gate-3').fill('1');
  await operator
    .getByTestId('draft-reason')
    .fill('begin drawing down ahead of the forecast peak (e2e)');
  await operator.getByTestId('order-impact').waitFor();
  assert.match((await operator.getByTestId('order-impact').textContent()) ?? '', /after the order/);
  await operator.getByTestId('draft-submit').click();
  const detail = operator.getByTestId('order-detail');
  await detail.waitFor();
  const id = Number(await detail.getAttribute('data-order-id'));
  assert.ok(id > 0);
  assert.equal(await detail.getAttribute('data-state'), 'proposed');
  // the operator is offered nothing that authorises
  assert.equal(await operator.getByTestId('order-authorise').count(), 0);
  // a 1 m opening stays below every zone's threshold: downstream needs no notice (the notices
  // test covers an order that does)
  const checks = await api<{ results: Array<{ code: string; ok: boolean; message: string }> }>(
    'operator',
    `/api/orders/${id}/interlocks`,
  );
  const downstream = checks.results.find((r) => r.code === 'downstream-clearance');
  assert.ok(downstream?.ok, JSON.stringify(downstream));
  assert.match(downstream.message, /No downstream zone is affected/);

  // the duty engineer, in a browser of their own, reviews and authorises, confirming identity
  const engineer = await pageAs(engineerBrowser, 'engineer');
  await openOrder(engineer, id);
  await engineer
    .getByTestId('order-comment')
    .fill('checked against the forecast and the downstream impact');
  await engineer.getByTestId('order-authorise').click();
  await engineer.getByTestId('step-up-password').fill(passwordOf('engineer'));
  await engineer.getByTestId('step-up-confirm').click();
  await engineer.locator(`[data-testid="order-detail"][data-state="authorised"]`).waitFor();

  // the operator sends it to the gates
  await openOrder(operator, id);
  await operator.getByTestId('order-execute').click();
  await operator
    .locator(
      '[data-testid="order-detail"][data-state="dispatched"], [data-testid="order-detail"][data-state="travelling"], [data-testid="order-detail"][data-state="in-position"]',
    )
    .first()
    .waitFor();

  // the simulated gate travels at its own speed; telemetry confirms the position
  const done = await until('the order in position', async () => {
    const o = await api<{ state: string; commands: Array<{ state: string }> }>(
      'operator',
      `/api/orders/${id}`,
    );
    assert.notEqual(o.state, 'faulted', JSON.stringify(o));
    return o.state === 'in-position' ? o : undefined;
  });
  assert.equal(done.commands[0]?.state, 'in-position');
  const gate = (await api<Status>('operator', `/api/reservoirs/${RES}/status`)).channels.find(
    (c) => c.channel === 'gate.3.opening',
  );
  assert.ok(gate && Math.abs(gate.value - 1) <= 0.05, `gate 3 at ${gate?.value} m`);
  await openOrder(operator, id);
  assert.equal(
    await operator.getByTestId('order-detail').getAttribute('data-state'),
    'in-position',
  );

  // the logbook shows every step, and the chain verifies
  const logbook = await pageAs(operatorBrowser, 'operator');
  await logbook.goto(`${product.url}/reservoirs/${RES}/logbook`);
  const grid = logbook.getByTestId('logbook-grid');
  for (const kind of [
    'order.drafted',
    'order.authorised',
    'order.executed',
    'command.sent',
    'command.acknowledged',
    'order.in-position',
  ]) {
    await grid.getByText(kind, { exact: true }).first().waitFor({ timeout: 30_000 });
  }
  await logbook.getByTestId('logbook-verify').click();
  await logbook.locator('[data-testid="logbook-chain-state"][data-ok="true"]').waitFor();
  const hash = (await logbook.getByTestId('logbook-head-hash').textContent()) ?? '';
  assert.match(hash, /^[0-9a-f]{64}$/);
  await logbook.screenshot({
    path: process.env.E2E_SCREENSHOT_ORDERS ?? '/tmp/stillwell-orders-logbook.png',
    fullPage: true,
  });

  // the head on a sheet of its own, to print and keep; it shows the head as it is now
  await logbook.getByTestId('logbook-head-sheet-link').click();
  const sheet = logbook.getByTestId('logbook-head-sheet-hash');
  await sheet.waitFor();
  const printed = (await sheet.getAttribute('data-hash')) ?? '';
  const printedSeq = Number(await logbook.getByTestId('logbook-head-seq').textContent());
  assert.match(printed, /^[0-9a-f]{64}$/);
  // whoever keeps the sheet can verify the chain against it
  const verified = await api<{ ok: boolean }>(
    'operator',
    `/api/logbook/verify?headSeq=${printedSeq}&headHash=${printed}`,
  );
  assert.equal(verified.ok, true);
  assert.equal((await sheet.textContent())?.replaceAll(' ', ''), printed);
  await logbook.emulateMedia({ media: 'print' });
  assert.equal(await logbook.getByTestId('head-sheet-print').isVisible(), false);
  await logbook.screenshot({ path: '/tmp/stillwell-logbook-head-sheet.png' });
  await operator.screenshot({ path: '/tmp/stillwell-orders.png', fullPage: true });
});
