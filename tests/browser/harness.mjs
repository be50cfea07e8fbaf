// What the browser tests and the page benchmark share.
//
// launchChromium() and until(page, ...) drive Debian's Chromium through
// playwright-core (the Chromium-only tests and bench/page_bench.mjs).
//
// openBrowser(name) gives one API over three engines, so that a scenario is
// written once and runs on each (tests/browser/scenarios.mjs):
//   chromium  Debian's Chromium, playwright-core (DevTools protocol)
//   firefox   Firefox ESR, puppeteer-core over WebDriver BiDi
//   webkit    WebKitGTK's MiniBrowser, selenium-webdriver and WebKitWebDriver under Xvfb
// A browser opens tabs; a tab (engines/*.mjs) has
//   goto(url), evaluate(fn, arg), fill(selector, text), click(selector),
//   pressTab(), savedFile(selector) -> {name, text}, pdf() -> Buffer | null,
//   problems() -> [text], close()
// and this file adds until(), printMedia() and the in-page hooks the engines share.
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '../..');
const { chromium } = createRequire(join(root, 'web/package.json'))('playwright-core');

/** The engines openBrowser knows, in the order the tests run them. */
export const engineNames = ['chromium', 'firefox', 'webkit'];

/** Chromium's switches: headless, no GPU, none of the browser's own background requests. */
export const chromiumArgs = [
  '--no-sandbox',
  '--disable-gpu',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
  '--no-first-run',
];

/** A fresh Chromium ($CHROMIUM, else /usr/bin/chromium); close it when done. */
export function launchChromium() {
  return chromium.launch({ executablePath: process.env.CHROMIUM ?? '/usr/bin/chromium', args: chromiumArgs });
}

const sleep = (ms) => new Promise((resolve) => setTimeout(resolve, ms));

/**
 * Poll `fn` in the page until it returns something truthy, and return that. `page` is a
 * playwright page or a harness tab. (page.waitForFunction compiles its predicate with
 * eval, which the page's CSP rightly refuses.)
 */
export async function until(page, fn, arg, timeout = 20000) {
  const end = Date.now() + timeout;
  for (;;) {
    const value = await page.evaluate(fn, arg);
    if (value) return value;
    if (Date.now() > end) throw new Error(`timed out waiting for ${fn}`);
    await sleep(100);
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

/** Start engine `name` (one of engineNames); close() it when done. */
export async function openBrowser(name) {
  if (!engineNames.includes(name)) throw new Error(`unknown browser engine ${name}`);
  const driver = await import(`./engines/${name}.mjs`);
  return driver.start();
}

/**
 * Installed in the page by engines that cannot see its console from outside
 * (WebKit's driver has no log endpoint): console errors and warnings, uncaught
 * errors and refused promises, and security-policy violations, kept in
 * window.__problems. The engine worker forwards its own violations to the page's
 * console (web/src/worker.js), so they land here too.
 */
export function problemHook() {
  if (window.__problems) return;
  const problems = [];
  window.__problems = problems;
  for (const level of ['error', 'warn']) {
    const original = console[level].bind(console);
    console[level] = (...args) => {
      problems.push(`console ${level}: ${args.map(String).join(' ').slice(0, 300)}`);
      original(...args);
    };
  }
  window.addEventListener('error', (e) => problems.push(`page error: ${e.message}`));
  window.addEventListener('unhandledrejection', (e) => problems.push(`unhandled rejection: ${e.reason}`));
  window.addEventListener('securitypolicyviolation', (e) =>
    problems.push(`CSP ${e.violatedDirective}: ${String(e.blockedURI).slice(0, 80)}`),
  );
}

/**
 * Installed in the page by engines whose driver cannot save a download: the file the
 * page hands the browser (a Blob behind an <a download> click) is kept in
 * window.__saved instead of being saved, as {name, text}.
 */
export function saveHook() {
  if (window.__savedHook) return;
  window.__savedHook = true;
  const blobs = new Map();
  const createObjectURL = URL.createObjectURL.bind(URL);
  URL.createObjectURL = (blob) => {
    const url = createObjectURL(blob);
    blobs.set(url, blob);
    return url;
  };
  const click = HTMLAnchorElement.prototype.click;
  HTMLAnchorElement.prototype.click = function () {
    const blob = this.download && blobs.get(this.href);
    if (!blob) return click.call(this);
    window.__saved = null;
    blob.text().then((text) => {
      window.__saved = { name: this.download, text };
    });
  };
}

/**
 * Show the page as it prints. `emulate(on)` switches the print media where the
 * engine's driver can (Chromium); elsewhere the page's own `@media print` rules
 * are switched to apply on screen, which renders the same sheet. The page's
 * beforeprint handler runs first either way, as it does when a person prints.
 */
export async function printMedia(tab, on, emulate = null) {
  if (on) await tab.evaluate(() => window.dispatchEvent(new Event('beforeprint')));
  if (emulate) return emulate(on);
  await tab.evaluate((show) => {
    for (const sheet of document.styleSheets) {
      for (const rule of sheet.cssRules) {
        if (!(rule instanceof CSSMediaRule)) continue;
        if (show && rule.media.mediaText === 'print') rule.media.mediaText = 'all and (min-width: 0), print';
        else if (!show && rule.media.mediaText.endsWith(', print')) rule.media.mediaText = 'print';
      }
    }
  }, on);
}

/**
 * In the page: paste `text` into the element at `selector` as a spreadsheet's copy arrives (a
 * paste event with text/plain). Pass it to evaluate with [selector, text]. Firefox fills a made-up
 * paste event's clipboardData from its own init members (dataType, data: Gecko's
 * ClipboardEventInit, from memory) and ignores the DataTransfer given; Chromium and WebKit take
 * the DataTransfer.
 */
export function pasteInPage([selector, text]) {
  const data = new DataTransfer();
  data.setData('text/plain', text);
  const init = { clipboardData: data, dataType: 'text/plain', data: text, bubbles: true, cancelable: true };
  document.querySelector(selector).dispatchEvent(new ClipboardEvent('paste', init));
}
