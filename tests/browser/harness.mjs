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
