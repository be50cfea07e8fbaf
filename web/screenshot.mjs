// Hedgeleaf page: the README's screenshot, docs/page.png, from the built page.
//
//   node web/screenshot.mjs   (after node web/build.mjs; needs web/node_modules)
//
// Opens dist/hedgeleaf.html offline in Debian's Chromium with the example trade
// plus a client name (fictional), and photographs the top of the page.
import { mkdirSync, readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const web = dirname(fileURLToPath(import.meta.url));
const root = dirname(web);
const { chromium } = createRequire(join(web, 'package.json'))('playwright-core');

const trade = JSON.parse(readFileSync(join(root, 'examples/american-put.json'), 'utf8'));
trade.quote = {
  client: 'Orchard Lane Growers (treasury)',
  currency: 'EUR',
  margin_type: 'fraction_of_premium',
  margin: 0.02,
  tick: 0.01,
};
const url = `${pathToFileURL(join(root, 'dist/hedgeleaf.html')).href}#trade=${Buffer.from(JSON.stringify(trade)).toString('base64url')}`;

const browser = await chromium.launch({
  executablePath: process.env.CHROMIUM ?? '/usr/bin/chromium',
  args: ['--no-sandbox', '--disable-gpu'],
});
const context = await browser.newContext({ viewport: { width: 1360, height: 1150 }, deviceScaleFactor: 1 });
await context.setOffline(true);
const page = await context.newPage();
await page.goto(url);
await page.locator('#profile-chart svg path').first().waitFor({ timeout: 20000 });
await page.evaluate(() => {
  document.getElementById('notice').hidden = true;
}); // the 'opened from the link' line
await page.waitForTimeout(500);
mkdirSync(join(root, 'docs'), { recursive: true });
await page.screenshot({ path: join(root, 'docs/page.png') });
await browser.close();
console.log('docs/page.png written');
