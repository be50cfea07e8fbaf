// Hedgeleaf benchmark: the one-file page in headless Chromium.
//
//   node bench/page_bench.mjs [PAGE] [--rates 1,4] [--contexts 5] [--trade FILE] [--with-window]
//   (default dist/hedgeleaf.html)
//   node bench/page_bench.mjs [PAGE] --against OLD [--rates 1,4] [--contexts 10]
//
// With --against, only the cold open, of OLD and PAGE taken in turn in fresh contexts
// (OLD, PAGE, OLD, PAGE, ...; `--contexts` of each per rate): the machine's speed drifts by
// 100 ms and more between runs a few minutes apart, and two pages opened in turn share it.
//
// For each CPU rate (1 = this machine; 4 = the page's main thread slowed 4x
// through the DevTools protocol, Emulation.setCPUThrottlingRate, as a slow
// laptop would run it; Chromium slows pages only, so the engine workers keep
// their speed) it prints the cold open of the file to the first premium shown
// (fresh browser context each time, offline, from file://; asked for once the browser's new
// window is quiet, as in a browser already running, or at once with --with-window), the time until the
// opened page settles, and the time of a full recompute after an edit of spot:
// from the end of the page's 250 ms input debounce to the last change the
// recompute makes to the page (premium, sensitivities, profit chart, hedge
// schedule, spot ladder (opened first), print sheet). Also the machine's load
// average, since other work on the cores moves every figure. Uses Debian's
// Chromium through playwright-core from web/node_modules (tests/browser/harness.mjs).
// With --trade the page opens on that trade file (a #trade= link) instead of its example:
// bench/trades/four-legs-smile.json is four legs priced on a 6 x 9 smile grid with rate, yield
// and borrow curves (issue 14's figure).
import { readFileSync, statSync } from 'node:fs';
import { loadavg } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

import { launchChromium, tradeLink } from '../tests/browser/harness.mjs';

const root = dirname(dirname(fileURLToPath(import.meta.url)));
const flag = (name, fallback) => {
  const i = process.argv.indexOf(name);
  return i > 0 ? process.argv[i + 1] : fallback;
};
const positional = process.argv.slice(2).find((arg, i, all) => !arg.startsWith('--') && !all[i - 1]?.startsWith('--'));
const pagePath = resolve(positional ?? join(root, 'dist/hedgeleaf.html'));
const rates = flag('--rates', '1,4').split(',').map(Number);
const againstPath = flag('--against', null);
const contexts = Number(flag('--contexts', againstPath ? '10' : '5'));
const tradePath = flag('--trade', null);
const withWindow = process.argv.includes('--with-window');
// how long each open waited for the browser's new window to be quiet (browserQuiet)
const windowWaits = [];
const budgets = { 1: { open: 500, recompute: 16 }, 4: { open: 1500, recompute: 50 } };
const debounceMs = 250;
const editsPerContext = 4; // web/src/recompute.js: changed(delay = 250)

// Injected before the page's own scripts (by the browser, so the page's CSP does
// not apply): timestamps of the first premium and of every later change, and the node
// each change was made to (to tell, once the page has settled, which changes were on screen).
// `drawn[i]` is when the browser had drawn change i: the first task after the animation frame
// that follows it (that frame's style, layout and paint come between), so a change whose
// layout is slow shows as such there and not in `changes`. It also counts the wait for the
// frame itself (up to one display refresh, 16.7 ms at 60 Hz).
function recorder() {
  window.__bench = { firstPremium: null, firstDrawn: null, changes: [], targets: [], drawn: [] };
  // (a user-blocking task runs ahead of the page's own queued tasks, such as the next card's result)
  const afterFrame = (note) =>
    requestAnimationFrame(() =>
      globalThis.scheduler.postTask(() => note(performance.now()), { priority: 'user-blocking' }),
    );
  const watch = () => {
    new MutationObserver((records) => {
      const now = performance.now();
      const i = window.__bench.changes.push(now) - 1;
      window.__bench.targets.push(records.map((r) => r.target));
      afterFrame((t) => (window.__bench.drawn[i] = t));
      if (window.__bench.firstPremium === null && document.querySelector('[data-result="premium"][data-value]')) {
        window.__bench.firstPremium = now;
        afterFrame((t) => (window.__bench.firstDrawn = t));
      }
    }).observe(document.documentElement, { subtree: true, childList: true, attributes: true, characterData: true });
  };
  if (document.documentElement) watch();
  else document.addEventListener('readystatechange', watch, { once: true });
}

const sleep = (ms) => new Promise((r) => setTimeout(r, ms));

/**
 * Wait until the browser's own processes are quiet, and return how long that took (ms). A
 * new context in headless Chromium opens a new window, and the window's own interface (the
 * address bar's pages, rendered by a process of their own) takes some 1.5 s of CPU in its first
 * two seconds: opened at once, the page shares the two cores with it. A user opens the file in
 * a browser already running, so the page is asked for once every process of the browser has
 * used at most 10 ms of CPU in each of three 100 ms spells in a row (DevTools protocol,
 * SystemInfo.getProcessInfo; its clock counts in 10 ms), at most 10 s. `--with-window` skips this.
 */
let quietSession = null; // (the browser's own DevTools session, made once)
async function browserQuiet(browser) {
  const session = (quietSession ??= await browser.newBrowserCDPSession());
  const cpu = async () =>
    (await session.send('SystemInfo.getProcessInfo')).processInfo.reduce((sum, p) => sum + p.cpuTime, 0);
  const start = Date.now();
  let before = await cpu();
  for (let quiet = 0; quiet < 3 && Date.now() - start < 10000;) {
    await sleep(100);
    const now = await cpu();
    quiet = now - before <= 0.0105 ? quiet + 1 : 0;
    before = now;
  }
  return Date.now() - start;
}

async function settle(page, quietMs = 1500, timeoutMs = 60000) {
  const end = Date.now() + timeoutMs;
  for (;;) {
    const idle = await page.evaluate(() => performance.now() - (window.__bench.changes.at(-1) ?? 0));
    if (idle > quietMs) return;
    if (Date.now() > end) throw new Error('the page did not settle');
    await sleep(100);
  }
}

const quantile = (xs, q) => {
  const sorted = [...xs].sort((a, b) => a - b);
  return sorted[Math.min(sorted.length - 1, Math.floor(q * sorted.length))];
};
const median = (xs) => quantile(xs, 0.5);

/**
 * Run in the page: what packing the engine costs when the page opens. Median of 5 of
 * unpacking the page's engine (base64 of gzip, as web/src/engine.js does) against
 * decoding the same WebAssembly as the plain base64 the module file carries.
 */
async function unpackingCost() {
  const decode = (text) =>
    typeof Uint8Array.fromBase64 === 'function'
      ? Uint8Array.fromBase64(text)
      : Uint8Array.from(atob(text), (c) => c.charCodeAt(0));
  const packed = document.getElementById('engine-wasm')?.textContent.trim();
  if (!packed) return null; // a page that carries its engine unpacked
  const unpack = async () =>
    new Uint8Array(
      await new Response(new Response(decode(packed)).body.pipeThrough(new DecompressionStream('gzip'))).arrayBuffer(),
    );
  const wasm = await unpack();
  let plain = '';
  for (let i = 0; i < wasm.length; i += 0x8000) plain += String.fromCharCode(...wasm.subarray(i, i + 0x8000));
  plain = btoa(plain);
  const time = async (fn) => {
    const xs = [];
    for (let k = 0; k < 5; k++) {
      const t = performance.now();
      await fn();
      xs.push(performance.now() - t);
    }
    return xs.sort((a, b) => a - b)[2];
  };
  return {
    packedChars: packed.length,
    plainChars: plain.length,
    unpack: await time(unpack),
    decodePlain: await time(() => decode(plain)),
  };
}

/**
 * Open `url` in a fresh offline context with the CPU at `rate` and wait until the page has
 * settled (so that the next open, or the edits, start on a quiet machine). Returns {context,
 * page, open}: `open` is ms from the navigation to the first premium shown; close the context.
 */
async function coldOpen(browser, url, rate) {
  const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
  await context.setOffline(true);
  await context.addInitScript(recorder);
  const page = await context.newPage();
  if (!withWindow) windowWaits.push(await browserQuiet(browser)); // (before the slowing, which keeps a thread busy)
  if (rate !== 1) await (await context.newCDPSession(page)).send('Emulation.setCPUThrottlingRate', { rate });
  await page.goto(url);
  for (let i = 0; i < 1200; i++) {
    const open = await page.evaluate(() => window.__bench.firstPremium);
    if (open !== null) {
      await settle(page);
      return { context, page, open, drawn: await page.evaluate(() => window.__bench.firstDrawn) };
    }
    await sleep(25);
  }
  await context.close();
  throw new Error('no premium was shown');
}

const rateHeading = (rate) =>
  `## CPU ${rate === 1 ? 'at full speed (1x)' : `slowed ${rate}x (main thread, DevTools protocol)`}`;

/** Open the page in `contexts` fresh contexts at CPU `rate` and time the open and four spot edits in each. */
async function measure(browser, url, rate) {
  windowWaits.length = 0; // (this speed's opens only)
  const figures = {
    opens: [],
    opensDrawn: [],
    settled: [],
    recomputes: [],
    recomputesDrawn: [],
    firstUpdates: [],
    onScreen: [],
    onScreenDrawn: [],
  };
  for (let run = 0; run < contexts; run++) {
    const { context, page, open, drawn } = await coldOpen(browser, url, rate);
    figures.opens.push(open);
    figures.opensDrawn.push(drawn);
    figures.settled.push(await page.evaluate(() => window.__bench.changes.at(-1)));
    if (run === 0) figures.unpacking = await page.evaluate(unpackingCost);
    // The spot ladder is folded at first: open it, so the timed recompute includes it.
    await page.evaluate(() => {
      const card = document.getElementById('ladder-card');
      if (!card || card.hidden) throw new Error('the page has no spot ladder card');
      card.open = true;
    });
    await page.waitForSelector('#ladder-output table', { timeout: 10000 });
    await settle(page);
    // Edit spot as a user would (an input event), then time the recompute it starts;
    // four edits per context (up, down, up, down), the first right after the open.
    for (let edit = 0; edit < editsPerContext; edit++) {
      const premiumBefore = await page.evaluate(() => document.querySelector('[data-result="premium"]').dataset.value);
      const edited = await page.evaluate(
        (factor) => {
          const input = document.querySelector('[data-path="market.spot"]');
          if (!input) return null;
          const value = Number(String(input.value).replace(/,/g, ''));
          input.value = String(Math.round(value * factor * 100) / 100);
          const t = performance.now();
          input.dispatchEvent(new Event('input', { bubbles: true }));
          return t;
        },
        edit % 2 ? 1 / 1.01 : 1.01,
      );
      if (edited === null) throw new Error('no input for market.spot on the page');
      await sleep(debounceMs * rate + 100);
      await settle(page, 600);
      const timing = await page.evaluate(
        ({ edited, debounce, before }) => {
          const { changes, targets, drawn } = window.__bench;
          const after = changes.filter((t) => t > edited + debounce);
          const latestDrawn = (keep) => Math.max(...changes.map((t, i) => (keep(t, i) ? drawn[i] : -Infinity)));
          const premium = document.querySelector('[data-result="premium"]').dataset.value;
          // On screen: a change to a node that shows in the window (the 1280 x 900 viewport,
          // scrolled to the top) once the page has settled; the <body>'s own attributes (the
          // automation flag) and nodes not drawn (the print-only sheet, folded cards) are not.
          const shown = (node) => {
            const element = node.nodeType === 1 ? node : node.parentElement;
            if (!element || element === document.body || element === document.documentElement) return false;
            const box = element.getBoundingClientRect();
            return box.width > 0 && box.height > 0 && box.bottom > 0 && box.top < window.innerHeight;
          };
          const onScreen = changes.filter((t, i) => t > edited + debounce && targets[i].some(shown));
          return {
            last: after.at(-1) - edited - debounce,
            first: after[0] - edited - debounce,
            screen: onScreen.at(-1) - edited - debounce,
            lastDrawn: latestDrawn((t) => t > edited + debounce) - edited - debounce,
            screenDrawn: latestDrawn((t, i) => t > edited + debounce && targets[i].some(shown)) - edited - debounce,
            changed: premium !== before,
          };
        },
        { edited, debounce: debounceMs, before: premiumBefore },
      );
      if (!timing.changed) throw new Error('the premium did not change after the spot edit');
      figures.recomputes.push(timing.last);
      figures.firstUpdates.push(timing.first);
      figures.onScreen.push(timing.screen);
      figures.recomputesDrawn.push(timing.lastDrawn);
      figures.onScreenDrawn.push(timing.screenDrawn);
    }
    await context.close();
  }
  return figures;
}

function report(rate, figures) {
  const { opens, opensDrawn, settled, recomputes, recomputesDrawn, firstUpdates, onScreen, onScreenDrawn, unpacking } =
    figures;
  const budget = budgets[rate];
  const within = (figure, limit) => (limit ? `; budget ${limit} ms, ${figure < limit ? 'met' : 'NOT met'}` : '');
  const ms = (x, digits = 0) => `${x.toFixed(digits)} ms`;
  console.log(rateHeading(rate));
  if (process.env.PAGE_BENCH_ALL) {
    console.log(`on screen: ${onScreen.map((x) => x.toFixed(1)).join(' ')}`);
    console.log(`every card: ${recomputes.map((x) => x.toFixed(1)).join(' ')}`);
    console.log(`on screen, drawn: ${onScreenDrawn.map((x) => x.toFixed(1)).join(' ')}`);
    console.log(`every card, drawn: ${recomputesDrawn.map((x) => x.toFixed(1)).join(' ')}`);
  }
  console.log(
    `cold open from file:// to the first premium shown: median ${ms(median(opens))}, best ${ms(Math.min(...opens))}, ` +
      `worst ${ms(Math.max(...opens))} (${opens.length} fresh contexts${within(median(opens), budget?.open)})`,
  );
  console.log(
    withWindow
      ? '  (--with-window: each asked for at once, while the browser made its new window)'
      : `  (each asked for in a new tab once the browser was quiet: waited a median ${ms(median(windowWaits))} for its new window)`,
  );
  console.log(
    `  ... and drawn (the frame that shows it done): median ${ms(median(opensDrawn))}, best ${ms(Math.min(...opensDrawn))}, ` +
      `worst ${ms(Math.max(...opensDrawn))}`,
  );
  console.log(`page settled after opening (last change): median ${ms(median(settled))}`);
  const kib = (chars) => `${(chars / 1024).toFixed(0)} KiB`;
  if (unpacking)
    console.log(
      `unpacking the engine (${kib(unpacking.packedChars)} of base64 gzip): ${ms(unpacking.unpack, 1)}; ` +
        `decoding it as the module file's plain base64 (${kib(unpacking.plainChars)}) would take ${ms(unpacking.decodePlain, 1)}`,
    );
  console.log(
    `recompute after a spot edit, figures on screen (after the ${debounceMs} ms debounce): median ` +
      `${ms(median(onScreen), 1)}, 90th percentile ${ms(quantile(onScreen, 0.9), 1)}, best ` +
      `${ms(Math.min(...onScreen), 1)} (${onScreen.length} edits in ${opens.length} contexts` +
      `${within(quantile(onScreen, 0.9), budget?.recompute)})`,
  );
  console.log(
    `  ... and drawn: median ${ms(median(onScreenDrawn), 1)}, 90th percentile ${ms(quantile(onScreenDrawn, 0.9), 1)}, ` +
      `best ${ms(Math.min(...onScreenDrawn), 1)}`,
  );
  console.log(
    `full recompute, every card including those below the window and the print sheet: first change ` +
      `${ms(median(firstUpdates), 1)}, last change median ${ms(median(recomputes), 1)}, ` +
      `90th percentile ${ms(quantile(recomputes, 0.9), 1)}, best ${ms(Math.min(...recomputes), 1)} ` +
      `(${recomputes.length} edits${within(quantile(recomputes, 0.9), budget?.recompute)})`,
  );
  console.log(
    `  ... and drawn: median ${ms(median(recomputesDrawn), 1)}, 90th percentile ${ms(quantile(recomputesDrawn, 0.9), 1)}, ` +
      `best ${ms(Math.min(...recomputesDrawn), 1)}`,
  );
}

/** --against: the cold opens of the old page and this one, taken in turn. */
async function pairOfOpens(browser, oldUrl, newUrl) {
  const openOnce = async (url, rate) => {
    const { context, open } = await coldOpen(browser, url, rate);
    await context.close();
    return open;
  };
  for (const rate of rates) {
    const opens = { old: [], new: [] };
    for (let run = 0; run < contexts; run++) {
      opens.old.push(await openOnce(oldUrl, rate));
      opens.new.push(await openOnce(newUrl, rate));
    }
    console.log(rateHeading(rate));
    for (const [name, xs] of Object.entries(opens))
      console.log(
        `cold open, ${name} page: median ${median(xs).toFixed(0)} ms (${xs.map((x) => x.toFixed(0)).join(' ')})`,
      );
  }
}

async function main() {
  const size = statSync(pagePath).size;
  // the page's file:// address, opening on the --trade file when one is given
  const pageUrl = (path) => {
    const page = pathToFileURL(path).href;
    return tradePath ? tradeLink(page, readFileSync(resolve(tradePath), 'utf8')) : page;
  };
  const url = pageUrl(pagePath);
  const load = () =>
    loadavg()
      .map((x) => x.toFixed(2))
      .join(' ');
  console.log(`# Page (bench/page_bench.mjs): ${pagePath}`);
  if (tradePath) console.log(`trade: ${tradePath}`);
  console.log(`file size: ${size} bytes (${(size / 1024 / 1024).toFixed(2)} MiB; budget 1 MiB)`);
  console.log(`load average before: ${load()} (1, 5, 15 min)`);
  const browser = await launchChromium();
  try {
    if (againstPath) {
      console.log(`old page: ${resolve(againstPath)} (${statSync(againstPath).size} bytes)`);
      await pairOfOpens(browser, pageUrl(resolve(againstPath)), url);
    } else for (const rate of rates) report(rate, await measure(browser, url, rate));
  } finally {
    await browser.close();
  }
  console.log(`load average after: ${load()}`);
}

main().catch((error) => {
  console.error(error);
  process.exit(1);
});
