import assert from 'node:assert/strict';
import { after, before, test } from 'node:test';
import type { BrowserContext } from 'playwright-core';
import { demoPassword, launchBrowser, signInThroughForm } from './support/browser.ts';
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

/** A poster to the gateway as one demo role, signed in with the password it printed. */
async function asRole(role: string) {
  const signedIn = await fetch(`${product.url}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ username: role, password: demoPassword(product.output(), role) }),
  });
  assert.equal(signedIn.status, 200, await signedIn.clone().text());
  const { accessToken } = (await signedIn.json()) as { accessToken: string };
  /** POSTs the body, or GETs without one; refuses any answer but a success. */
  return async <T>(path: string, body?: unknown): Promise<T> => {
    const res = await fetch(`${product.url}${path}`, {
      method: body === undefined ? 'GET' : 'POST',
      headers: { Authorization: `Bearer ${accessToken}`, 'Content-Type': 'application/json' },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
    assert.ok(res.ok, `${role} ${path}: ${res.status} ${await res.clone().text()}`);
    return (await res.json()) as T;
  };
}

interface LatestForecast {
  run: {
    computedAtMs: number;
    inputs: { openings: Record<string, number> };
    peak: { elevation: number };
  } | null;
}

test('during the storm the overview counts down to act, and the forecast answers a gate opening', async () => {
  // a browser of its own: the first test's session would otherwise resume here
  const own = await launchBrowser();
  try {
    const page = await own.newPage();
    await page.goto(product.url);
    await signInThroughForm(page, 'operator', demoPassword(product.output(), 'operator'));
    // the flood rises from plant hour 24: at 600x that is about three wall minutes in
    await page.waitForSelector('[data-testid="time-left"][data-state="ok"]', { timeout: 300_000 });
    const clock = (await page.getByTestId('time-left-clock').textContent()) ?? '';
    assert.match(clock, /^\d+:\d{2}:\d{2}$/, `countdown "${clock}"`);
    const peakText = async () => (await page.getByTestId('forecast-peak').textContent()) ?? '';
    const peakBefore = Number.parseFloat(await peakText());
    assert.ok(peakBefore > 207 && peakBefore < 216, `forecast peak ${peakBefore} m`);

    const outlook = page.getByTestId('threshold-outlook');
    assert.ok((await outlook.locator('[data-tone]').count()) >= 4, 'every threshold is listed');
    assert.ok((await outlook.locator('[data-tone="ahead"]').count()) >= 1);
    assert.match((await outlook.textContent()) ?? '', /Dam crest.*(in \d|not reached)/s);
    assert.match(
      (await page.getByTestId('level-inflow-chart').getAttribute('aria-label')) ?? '',
      /forecast band \(p10 to p90\) with its median/,
    );
    assert.match(
      (await page.getByTestId('forecast-caution').first().textContent()) ?? '',
      /Decision support only/,
    );
    await page.screenshot({
      path: process.env.E2E_STORM_SCREENSHOT ?? '/tmp/stillwell-overview-storm.png',
      fullPage: true,
    });

    // a gate opened through a gate order: drafted, authorised with the password again, executed
    const operator = await asRole('operator');
    const engineer = await asRole('engineer');
    // one gate part-open: a release under the lowest level anyone downstream must be told of
    // (150 m3/s at the Quarry Road site), so the order needs no notices before it runs
    const order = await operator<{ id: number }>('/api/reservoirs/lake-orrin/orders', {
      steps: [{ offsetMin: 0, targets: [{ control: 'gate-1', target: 1.2 }] }],
      reason: 'Release ahead of the flood peak, as the forecast advises',
    });
    await engineer('/api/auth/step-up', { password: demoPassword(product.output(), 'engineer') });
    await engineer(`/api/orders/${order.id}/authorise`, { comment: 'Agreed on the forecast' });
    await operator(`/api/orders/${order.id}/execute`, {});

    // the forecast is run again from the gate as it opens, and the overview shows that run: its
    // peak and its time left (the storm moves on at 600x, so the peak itself is not compared)
    const latest = `/api/reservoirs/lake-orrin/forecasts/latest`;
    const shown = async () => Number.parseFloat(await peakText()).toFixed(2);
    let matched = false;
    for (const deadline = Date.now() + 120_000; !matched && Date.now() < deadline;) {
      const { run } = await operator<LatestForecast>(latest);
      const gateOpen = (run?.inputs.openings['gate-1'] ?? 0) > 0.5;
      matched = gateOpen && (await shown()) === run!.peak.elevation.toFixed(2);
      if (!matched) await page.waitForTimeout(500);
    }
    assert.ok(matched, 'the overview never showed a forecast run with gate 1 open');
    await page.screenshot({
      path: process.env.E2E_GATES_SCREENSHOT ?? '/tmp/stillwell-overview-gates-open.png',
      fullPage: true,
    });
    // the countdown stays on screen, re-read from the new forecast
    const state = await page.getByTestId('time-left').getAttribute('data-state');
    assert.ok(
      ['ok', 'past', 'impossible', 'not-needed'].includes(state ?? ''),
      `time left to act after the gate opened: ${state}`,
    );
  } finally {
    await own.close();
  }
});
