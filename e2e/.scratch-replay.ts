import { demoPassword, launchBrowser, signInThroughForm } from './support/browser.ts';
import { startProduct } from './support/product.ts';
const RES = 'lake-orrin';
const product = await startProduct(['--speed', '3600']);
const tok = async (role: string) => {
  const r = await fetch(`${product.url}/api/auth/sign-in`, { method: 'POST', headers: { 'Content-Type': 'application/json' }, body: JSON.stringify({ username: role, password: demoPassword(product.output(), role) }) });
  return ((await r.json()) as { accessToken: string }).accessToken;
};
const get = async (t: string, p: string) => (await fetch(`${product.url}${p}`, { headers: { Authorization: `Bearer ${t}` } })).json();
try {
  const rv = await tok('reviewer');
  const op = await tok('operator');
  const t0 = Date.now();
  for (;;) {
    const l = await get(rv, `/api/reservoirs/${RES}/replay/events`);
    if (l.events.some((e: { kind: string }) => e.kind === 'high-pool')) break;
    await new Promise((r) => setTimeout(r, 500));
  }
  console.log('storm after', (Date.now() - t0) / 1000, 's');
  for (const text of ['note A', 'note B', 'note C']) {
    const f = new FormData(); f.set('text', text);
    await fetch(`${product.url}/api/logbook/shift-notes`, { method: 'POST', headers: { Authorization: `Bearer ${op}` }, body: f });
    console.log('posted', text, 'site now', (await get(rv, `/api/reservoirs/${RES}/replay/events`)).nowMs);
    await new Promise((r) => setTimeout(r, 2000));
  }
  await new Promise((r) => setTimeout(r, 8000));
  const l = await get(rv, `/api/reservoirs/${RES}/replay/events`);
  console.log(JSON.stringify(l, null, 1).slice(0, 1500));
  const ev = l.events.find((e: { kind: string }) => e.kind === 'high-pool');
  const from = new Date(ev.fromMs).toISOString(), to = new Date(ev.toMs).toISOString();
  const en = await get(rv, `/api/reservoirs/${RES}/replay/entries?from=${from}&to=${to}&limit=500`);
  for (const e of en.entries) console.log(new Date(e.siteTimeMs).toISOString(), e.timeSource, e.kind, e.time, JSON.stringify(e.payload).slice(0, 80));
  const w = await get(rv, `/api/reservoirs/${RES}/replay/window?from=${from}&to=${to}`);
  console.log('runs', w.forecastRuns.length, w.forecastRuns.slice(0, 3), 'alarmEvents', w.alarmEvents.length, w.resolution);
  const b = await launchBrowser();
  const page = await b.newPage();
  await page.goto(`${product.url}/reservoirs/${RES}/replay`);
  await signInThroughForm(page, 'reviewer', demoPassword(product.output(), 'reviewer'));
  await page.goto(`${product.url}/reservoirs/${RES}/replay`);
  await page.getByTestId('replay-chart').waitFor({ timeout: 30000 });
  await page.getByTestId('replay-entry-list').locator('li', { hasText: 'note A' }).getByRole('button').click();
  await page.getByRole('combobox', { name: 'Speed' }).click();
  await page.getByRole('option', { name: '3600x' }).click();
  await page.getByTestId('replay-play').click();
  await new Promise((r) => setTimeout(r, 3000));
  await page.screenshot({ path: '/tmp/rp/band.png', fullPage: true });
  await b.close();
} finally {
  console.log('stop', await product.stop());
}
