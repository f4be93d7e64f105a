import assert from 'node:assert/strict';
import { after, before, test } from 'node:test';
import type { BrowserContext } from 'playwright-core';
import { demoPassword, launchBrowser, signInThroughForm } from './support/browser.ts';
import { startProduct, type RunningProduct } from './support/product.ts';

let product: RunningProduct;
let browser: BrowserContext;

before(async () => {
  product = await startProduct(['--speed', '60']);
  browser = await launchBrowser();
});

after(async () => {
  await browser?.close();
  const code = await product?.stop();
  assert.equal(code, 0, `Ctrl-C should stop the product cleanly:\n${product?.output()}`);
});

/** A flood as an operator might keep it in a spreadsheet: times in hours, flows in m3/s. */
const FLOOD_CSV = ['hour,flow', '0,250', '4,1200', '8,2100', '14,900', '30,250', ''].join('\n');

const metres = (text: string | null) =>
  Number.parseFloat(/(\d+(?:\.\d+)?)\s*m\b/.exec(text ?? '')![1]!);

test('the operator uploads a hydrograph, routes it under two schedules and compares them', async () => {
  const page = await browser.newPage();
  await page.goto(product.url);
  await signInThroughForm(page, 'operator', demoPassword(product.output(), 'operator'));
  await page
    .getByRole('navigation', { name: 'Screens' })
    .getByRole('link', { name: 'What-if' })
    .click();
  const screen = page.getByTestId('what-if-screen');
  await screen.waitFor({ timeout: 30_000 });
  assert.match(
    (await screen.getByTestId('forecast-caution').first().textContent()) ?? '',
    /Decision support only.*emergency action plan, local codes and the responsible licensed engineer prevail/,
  );

  // a file with a bad row is refused whole, naming the row; the table keeps what it had
  await page.getByTestId('hydrograph-file').setInputFiles({
    name: 'bad-flood.csv',
    mimeType: 'text/csv',
    buffer: Buffer.from('hour,flow\n0,250\n4,lots\n'),
  });
  assert.match((await page.getByTestId('csv-problems').textContent()) ?? '', /row 3.*flow/i);
  assert.match((await page.getByTestId('hydrograph-source').textContent()) ?? '', /not loaded/);

  await page.getByTestId('hydrograph-file').setInputFiles({
    name: 'tamsel-flood.csv',
    mimeType: 'text/csv',
    buffer: Buffer.from(FLOOD_CSV),
  });
  await page.getByTestId('hydrograph-source').getByText('tamsel-flood.csv: 5 rows').waitFor();
  assert.equal(await page.getByTestId('csv-problems').count(), 0);

  // A opens every gate at once (the page's first schedule); B holds them shut for 3 hours
  await page.getByTestId('schedule-a-name').fill('Open at once');
  await page.getByTestId('schedule-b-name').fill('Hold 3 hours');
  await page.getByTestId('start-elevation').fill('205');
  await page.getByTestId('run-what-if').click();

  const results = page.getByTestId('what-if-results');
  await results.waitFor({ timeout: 60_000 });
  const table = results.getByTestId('comparison');
  assert.match((await table.getByTestId('comparison-label-a').textContent()) ?? '', /Open at once/);
  assert.match((await table.getByTestId('comparison-label-b').textContent()) ?? '', /Hold 3 hours/);
  const peakA = metres(await table.getByTestId('comparison-peak-a').textContent());
  const peakB = metres(await table.getByTestId('comparison-peak-b').textContent());
  assert.ok(peakA > 205 && peakA < 215, `peak under A ${peakA} m is not plausible`);
  // the gates held shut pass less of the flood early on: the pool must peak higher under B
  assert.ok(peakB > peakA, `peak under B ${peakB} m should be above A's ${peakA} m`);
  assert.equal(await table.getByTestId('comparison-peak-b').getAttribute('data-worse'), 'true');
  await page.getByTestId('what-if-pool-chart').waitFor();
  assert.match(
    (await screen.getByTestId('forecast-caution').last().textContent()) ?? '',
    /Decision support only/,
  );
  await page.screenshot({
    path: process.env.E2E_SCREENSHOT ?? '/tmp/stillwell-what-if.png',
    fullPage: true,
  });
  await page.close();
});
