// What the browser tests and the page benchmark share: Debian's Chromium through
// playwright-core (from web/node_modules), started the same way everywhere
// (headless, no GPU, none of the browser's own background requests, so every
// request seen is the page's), and waiting for a condition inside the page.
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '../..');
const { chromium } = createRequire(join(root, 'web/package.json'))('playwright-core');

/** A fresh Chromium ($CHROMIUM, else /usr/bin/chromium); close it when done. */
export function launchChromium() {
  return chromium.launch({
    executablePath: process.env.CHROMIUM ?? '/usr/bin/chromium',
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
      '--no-first-run',
    ],
  });
}

/**
 * Poll `fn` in the page until it returns something truthy, and return that. (page.waitForFunction
 * compiles its predicate with eval, which the page's CSP rightly refuses.)
 */
export async function until(page, fn, arg, timeout = 20000) {
  const end = Date.now() + timeout;
  for (;;) {
    const value = await page.evaluate(fn, arg);
    if (value) return value;
    if (Date.now() > end) throw new Error(`timed out waiting for ${fn}`);
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
}

// ---- Shared by the page tests that drive one feature each (saving, numbers, panels, display, layout).
// (Imports here are hoisted like those at the top; kept here so this part stays one appended block.)
import { readFileSync } from 'node:fs';
import { resolve as resolvePath } from 'node:path';
import { pathToFileURL } from 'node:url';

/** The page under test: $HEDGELEAF_PAGE, else dist/hedgeleaf.html; its path and file:// URL. */
export function pageUnderTest() {
  const path = resolvePath(process.env.HEDGELEAF_PAGE ?? join(root, 'dist/hedgeleaf.html'));
  return { path, url: pathToFileURL(path).href };
}

/** A file:// link to `url` carrying the trade `text` (JSON) in its #trade= fragment. */
export function tradeLink(url, text) {
  return `${url}#trade=${Buffer.from(text).toString('base64url')}`;
}

/** The example trade the docs use (examples/american-put.json), as text. */
export const exampleTradeText = readFileSync(join(root, 'examples/american-put.json'), 'utf8');

/** A fresh copy of the example trade, to change. */
export const exampleTrade = () => JSON.parse(exampleTradeText);

/** A link to the page under test carrying `text` (the example unless given). */
export const linkToPage = (text = exampleTradeText) => tradeLink(pageUnderTest().url, text);

/** Wait until no recompute is pending or running (figures match the inputs, or the refusal is shown). */
export function settled(page) {
  return until(page, () => document.body.classList.contains('ready') && !('computing' in document.body.dataset));
}

/**
 * Open `url` (the page under test, with no trade in the address, unless given) in a new page of
 * `context` and wait until it has settled. Console errors and page errors are pushed to `problems`.
 */
export async function openPage(context, url = pageUnderTest().url, problems = []) {
  const page = await context.newPage();
  page.on('console', (message) => {
    if (message.type() === 'error') problems.push(`console error: ${message.text()}`);
  });
  page.on('pageerror', (error) => problems.push(`page error: ${error.message}`));
  await page.goto(url);
  await settled(page);
  return page;
}

/** The trade as "Save file" writes it (the download, parsed). */
export async function savedTrade(page) {
  const [download] = await Promise.all([page.waitForEvent('download'), page.click('#action-export')]);
  return { name: download.suggestedFilename(), trade: JSON.parse(readFileSync(await download.path(), 'utf8')) };
}

/**
 * Chromium for one test file: started before its tests (or at the first `ready()`) and closed
 * after them (pass node:test's `before` and `after`). `ready()` resolves to the browser.
 */
export function chromiumForFile(before, after) {
  let started = null;
  const ready = () => (started ??= launchChromium());
  before(ready);
  after(async () => {
    await (await started)?.close();
  });
  return { ready };
}

/** A new context of `browser`, offline and taking downloads, `width` × `height` px, in `locale`. */
export async function offlineContext(browser, { width = 1280, height = 900, locale } = {}) {
  const context = await browser.newContext({ locale, acceptDownloads: true, viewport: { width, height } });
  await context.setOffline(true);
  return context;
}
