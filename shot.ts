import { launchBrowser, signInAs } from './tests/support/browser.ts';
const base = 'http://127.0.0.1:3100';
const [who, ...urls] = process.argv.slice(2);
const { context, close } = await launchBrowser();
const page = await context.newPage();
await signInAs(page, base, `${who}@demo.test`);
for (const u of urls) {
  const [url, w] = u.split('@');
  await page.setViewportSize({ width: Number(w ?? 1280), height: 900 });
  await page.goto(base + url);
  await page.waitForTimeout(1500);
  const name = url.replace(/[^a-z0-9]+/gi, '_') + '_' + (w ?? 1280);
  await page.screenshot({ path: `/tmp/shots/${who}${name}.png`, fullPage: true });
  console.log(name);
}
await close();
