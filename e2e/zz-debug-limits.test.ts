import { test } from 'node:test';
import { demoPassword, launchBrowser, signInThroughForm } from './support/browser.ts';
import { startProduct } from './support/product.ts';

test('debug', async () => {
  const product = await startProduct(['--speed', '600']);
  const browser = await launchBrowser();
  try {
    const page = await browser.newPage();
    page.on('response', async (r) => {
      const u = r.url();
      if (/\/api\/reservoirs\/lake-orrin$/.test(u) || u.includes('definition/limits')) {
        const t = await r.text().catch(() => '');
        const m = /"version":(\d+)/.exec(t);
        const f = /"weir-left"[^}]*"maxFlow":([\d.]+)/.exec(t);
        console.log(Date.now() % 100000, r.request().method(), u.slice(-40), r.status(), m?.[1], f?.[1]);
      }
    });
    await page.goto(`${product.url}/reservoirs/lake-orrin/dam-safety`);
    await signInThroughForm(page, 'engineer', demoPassword(product.output(), 'engineer'));
    await page.getByTestId('limits-form').waitFor();
    await page.getByTestId('limit-weir.weir-left.maxFlow').fill('16.5');
    await page.getByTestId('limits-note').fill('debugging the reload');
    await page.getByTestId('limits-save').click();
    await page.getByTestId('step-up-password').fill(demoPassword(product.output(), 'engineer'));
    await page.getByTestId('step-up-confirm').click();
    await page.getByTestId('limits-saved').waitFor();
    console.log(Date.now() % 100000, 'saved shown');
    await page.waitForTimeout(3000);
    console.log('value', await page.getByTestId('limit-weir.weir-left.maxFlow').inputValue());
  } finally {
    await browser.close();
    await product.stop();
  }
});
