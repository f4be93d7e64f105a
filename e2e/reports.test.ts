import assert from 'node:assert/strict';
import { readFileSync, writeFileSync } from 'node:fs';
import { after, before, test } from 'node:test';
import type { BrowserContext, Page } from 'playwright-core';
import { demoPassword, launchBrowser, signInThroughForm } from './support/browser.ts';
import { apiToken, startProduct, type RunningProduct } from './support/product.ts';
import { until } from './support/waits.ts';

const RES = 'lake-orrin';
const HOUR = 3_600_000;

let product: RunningProduct;
let browser: BrowserContext;

before(async () => {
  // one site hour a wall second: some hours of the demo storm are in the record within seconds
  product = await startProduct(['--speed', '3600']);
  browser = await launchBrowser();
});

after(async () => {
  await browser?.close();
  const code = await product?.stop();
  assert.equal(code, 0, `Ctrl-C should stop the product cleanly:\n${product?.output()}`);
});

const tokenOf = (role: string) => apiToken(product, role);

/** Clicks a download button and returns the file the browser saved. */
async function download(page: Page, testId: string): Promise<{ name: string; body: Buffer }> {
  const [file] = await Promise.all([
    page.waitForEvent('download'),
    page.getByTestId(testId).click(),
  ]);
  const path = await file.path();
  return { name: file.suggestedFilename(), body: readFileSync(path) };
}

test('a reviewer produces the demo storm report in the console, watches it finish and downloads PDF and CSV', async () => {
  const reviewer = await tokenOf('reviewer');
  // six site hours of the storm stored, so the report has a window worth the name
  await until('six hours of the demo storm in the record', async () => {
    const res = await fetch(`${product.url}/api/reservoirs/${RES}/reports/demo-window`, {
      headers: { Authorization: `Bearer ${reviewer}` },
    });
    if (!res.ok) return undefined;
    const w = (await res.json()) as { from: string; to: string };
    return Date.parse(w.to) - Date.parse(w.from) >= 6 * HOUR ? true : undefined;
  });

  const page = await browser.newPage();
  await page.goto(`${product.url}/reservoirs/${RES}/overview`);
  await signInThroughForm(page, 'reviewer', demoPassword(product.output(), 'reviewer'));
  await page.getByRole('link', { name: 'Reports' }).first().click();
  await page.getByTestId('reports-screen').waitFor({ timeout: 30_000 });
  assert.match(
    (await page.getByTestId('report-caution').textContent()) ?? '',
    /responsible licensed engineer prevail/,
  );

  const demo = page.getByTestId('report-demo-window');
  await page.waitForFunction(
    () =>
      !(document.querySelector('[data-testid="report-demo-window"]') as HTMLButtonElement)
        ?.disabled,
    undefined,
    { timeout: 30_000 },
  );
  await demo.click();
  assert.notEqual(await page.getByTestId('report-from').inputValue(), '');
  await page.getByTestId('report-start').click();

  // the bar follows the job to the end
  await page.getByTestId('report-progress').waitFor({ timeout: 30_000 });
  await page
    .locator('[data-testid="report-progress"][data-stage="done"]')
    .waitFor({ timeout: 120_000 });
  assert.equal(await page.getByRole('progressbar').getAttribute('aria-valuenow'), '100');
  assert.match((await page.getByTestId('report-progress-text').textContent()) ?? '', /^Ready/);

  // the figures on the page
  await page.getByTestId('report-peak-pool').waitFor({ timeout: 30_000 });
  const peak = Number(
    (await page.getByTestId('report-peak-pool').textContent())?.replace(/,/g, ''),
  );
  assert.ok(peak > 150 && peak < 300, `peak pool ${peak} m`);
  assert.match((await page.getByTestId('report-head-hash').textContent()) ?? '', /[0-9a-f]{64}/);
  await page.screenshot({
    path: process.env.E2E_REPORTS_SCREENSHOT ?? '/tmp/stillwell-reports.png',
    fullPage: true,
  });

  const pdf = await download(page, 'report-download-pdf');
  assert.equal(pdf.body.subarray(0, 5).toString('latin1'), '%PDF-');
  assert.match(pdf.name, /\.pdf$/);
  writeFileSync(process.env.E2E_REPORTS_PDF ?? '/tmp/stillwell-report.pdf', pdf.body);
  const csv = await download(page, 'report-download-csv');
  const [header, first] = csv.body.toString('utf8').split('\r\n');
  assert.equal(header, 'channel,device_id,seq,time,time_ms,value,quality,received_at');
  assert.ok(first && first.split(',').length === 8, `first CSV row: ${first}`);
  assert.match(csv.name, /\.csv$/);
  await page.close();
});
