import assert from 'node:assert/strict';
import { after, before, test } from 'node:test';
import type { BrowserContext, Page } from 'playwright-core';
import { launchBrowser } from './support/browser.ts';
import { startProduct, type RunningProduct } from './support/product.ts';
import { until } from './support/waits.ts';

const RES = 'lake-orrin';
const QUARRY = 'Quarry Road construction site';

let product: RunningProduct;
let browser: BrowserContext;
const tokens = new Map<string, string>();

before(async () => {
  // 600x: the work site's 1-hour lead time passes in 6 wall seconds
  product = await startProduct(['--speed', '600']);
  browser = await launchBrowser();
});

after(async () => {
  await browser?.close();
  const code = await product?.stop();
  assert.equal(code, 0, `Ctrl-C should stop the product cleanly:\n${product?.output()}`);
});

/** Demo mode prints each account's password at start. */
function passwordOf(role: string): string {
  const password = new RegExp(`^\\s+${role}\\s+(\\S+)\\s`, 'm').exec(product.output())?.[1];
  assert.ok(password, `no demo password for ${role} in the output`);
  return password;
}

/** Signs in through the API with the demo password. */
async function tokenOf(role: string): Promise<string> {
  const known = tokens.get(role);
  if (known) return known;
  const password = passwordOf(role);
  const res = await fetch(`${product.url}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ username: role, password }),
  });
  assert.equal(res.status, 200, await res.clone().text());
  const token = ((await res.json()) as { accessToken: string }).accessToken;
  tokens.set(role, token);
  return token;
}

async function call<T>(role: string, path: string, body?: unknown): Promise<T> {
  const res = await fetch(`${product.url}${path}`, {
    method: body === undefined ? 'GET' : 'POST',
    headers: { Authorization: `Bearer ${await tokenOf(role)}`, 'Content-Type': 'application/json' },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  assert.ok(res.ok, `${path}: ${res.status} ${await res.clone().text()}`);
  return (await res.json()) as T;
}

/**
 * The liaison signs in once through the console's form; the session then lives in the browser's
 * refresh cookie, and every page opened later resumes it.
 */
let signedIn = false;
async function liaisonPage(path: string): Promise<Page> {
  const page = await browser.newPage();
  await page.goto(`${product.url}${path}`);
  if (!signedIn) {
    await page.locator('input[autocomplete="username"]').fill('liaison');
    await page.locator('input[type="password"]').fill(passwordOf('liaison'));
    await page.getByRole('button', { name: 'Sign in' }).click();
    signedIn = true;
  }
  return page;
}

test('a drafted order above a zone threshold is noticed, mailed, acknowledged, and sent once the lead time has run', async () => {
  await until('a fresh pool reading', async () => {
    const status = await call<{ pool: unknown }>('operator', `/api/reservoirs/${RES}/status`);
    return status.pool ? true : undefined;
  });
  const order = await call<{
    id: number;
    impact: { expectedRelease: number; currentRelease: number };
  }>('operator', `/api/reservoirs/${RES}/orders`, {
    steps: [{ offsetMin: 0, targets: [{ control: 'gate-1', target: 4 }] }],
    reason: 'draw down ahead of the storm peak',
  });
  const release = order.impact.expectedRelease;
  assert.ok(
    release > 150,
    `the order should pass the work site's threshold of 150 m3/s, not ${release}`,
  );

  type Clearance = { clear: boolean; shortfalls: Array<{ zoneName: string; reason: string }> };
  const clearance = () =>
    call<Clearance>(
      'liaison',
      `/api/reservoirs/${RES}/orders/${order.id}/clearance?targetReleaseM3s=${release}&currentReleaseM3s=${order.impact.currentRelease}`,
    );
  const before = await clearance();
  assert.equal(before.clear, false);
  type Checks = { results: Array<{ code: string; ok: boolean; message: string }> };
  const downstreamCheck = async () =>
    (await call<Checks>('operator', `/api/orders/${order.id}/interlocks`)).results.find(
      (r) => r.code === 'downstream-clearance',
    )!;
  const refused = await downstreamCheck();
  assert.equal(refused.ok, false);
  assert.match(refused.message, /Quarry Road construction site has not been sent its notice/);

  // the notices board in the console: prepared by itself when the order was drafted
  const board = await liaisonPage(`/reservoirs/${RES}/notices`);
  const card = board.getByTestId(`notice-${QUARRY}`);
  await card.waitFor({ timeout: 30_000 });
  assert.equal(await card.getAttribute('data-state'), 'prepared');
  assert.ok(before.shortfalls.some((s) => s.zoneName === QUARRY && s.reason === 'not-sent'));
  const cards = board.locator('[data-testid^="notice-"][data-state="prepared"]');
  for (let n = await cards.count(); n > 0; n = await cards.count()) {
    await cards
      .first()
      .getByRole('button', { name: /^Send to / })
      .click();
    await board.waitForFunction(
      (left) =>
        document.querySelectorAll('[data-testid^="notice-"][data-state="prepared"]').length < left,
      n,
      {
        timeout: 30_000,
      },
    );
  }
  await board.waitForSelector(`[data-testid="recipient-Juno Ashgrove"][data-standing="told"]`, {
    timeout: 30_000,
  });

  // the demo outbox shows what the demo mail server received
  const outbox = await liaisonPage(`/reservoirs/${RES}/outbox`);
  const message = outbox
    .getByTestId('outbox-message')
    .filter({ hasText: 'juno.ashgrove@brackwell-civil.example' });
  await message.waitFor({ timeout: 30_000 });
  await message.click();
  const text = (await message.getByTestId('outbox-text').textContent()) ?? '';
  assert.match(text, /Expected release: \d[\d,]* m3\/s \([\d,]+ cfs\)/);
  assert.match(text, /Expected arrival at Quarry Road construction site \(1\.5 km downstream\)/);
  const link = /http:\/\/\S+\/api\/notices\/ack\/\S+/.exec(text)?.[0];
  assert.ok(link, 'the message carries a personal acknowledgement link');
  await outbox.screenshot({ path: '/tmp/stillwell-outbox.png' });

  // the contact opens the link: no sign-in, a plain page; a second time changes nothing
  const contact = await browser.newPage();
  await contact.goto(link.replace(/^http:\/\/localhost:\d+/, product.url));
  assert.match(
    (await contact.textContent('body')) ?? '',
    /Thank you, Juno Ashgrove\. Your acknowledgement was recorded/,
  );
  await contact.reload();
  assert.match((await contact.textContent('body')) ?? '', /already acknowledged/);
  await board.waitForSelector(
    `[data-testid="recipient-Juno Ashgrove"][data-standing="acknowledged"]`,
    { timeout: 30_000 },
  );
  await board.screenshot({
    path: process.env.E2E_NOTICES_SCREENSHOT ?? '/tmp/stillwell-notices.png',
    fullPage: true,
  });

  // the lead times run on the plant clock: clear once the longest has passed
  const running = await clearance();
  assert.ok(
    running.shortfalls.every((s) => s.reason === 'lead-time-running'),
    JSON.stringify(running.shortfalls),
  );
  await until(
    'downstream clearance',
    async () => ((await clearance()).clear ? true : undefined),
    90_000,
  );

  // now the order may go: the interlock says so, a duty engineer authorises, the operator sends it
  // (the authorisation lasts 30 plant minutes, 3 wall seconds at 600x: no time lost in between)
  assert.match((await downstreamCheck()).message, /^Downstream is clear/);
  await call('engineer', '/api/auth/step-up', { password: passwordOf('engineer') });
  await call('engineer', `/api/orders/${order.id}/authorise`, {
    comment: 'downstream told and their lead time has run',
  });
  const sentOrder = await call<{ state: string }>(
    'operator',
    `/api/orders/${order.id}/execute`,
    {},
  );
  assert.ok(['dispatched', 'travelling'].includes(sentOrder.state), sentOrder.state);

  // the registry the notices came from: zones nearest first, and the people to tell
  const registry = await liaisonPage(`/reservoirs/${RES}/downstream`);
  await registry
    .getByRole('grid', { name: 'Contacts' })
    .getByText('Juno Ashgrove')
    .waitFor({ timeout: 30_000 });
  const zoneNames = await registry
    .getByRole('grid', { name: 'Zones' })
    .locator('[data-field="name"][role="gridcell"]')
    .allTextContents();
  assert.deepEqual(zoneNames, [
    'Quarry Road construction site',
    'Arnsey Mill',
    'Hessford',
    'Tamsel Mouth campground',
  ]);
  await registry.screenshot({ path: '/tmp/stillwell-registry.png', fullPage: true });

  const feed = await fetch(`${product.url}/api/notices/feed.xml`);
  const xml = await feed.text();
  assert.match(xml, /<alert xmlns="urn:oasis:names:tc:emergency:cap:1\.2">/);
  assert.match(xml, /<status>Exercise<\/status>/);
});
