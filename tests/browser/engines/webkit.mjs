// The harness's WebKit (tests/browser/harness.mjs): WebKitGTK's MiniBrowser
// through selenium-webdriver and Debian's WebKitWebDriver, on an Xvfb display of
// its own. Xvfb picks a free display itself (-displayfd) and the driver gets a
// free port, so runs side by side do not collide; close() stops exactly the
// processes start() began.
//
// What this driver cannot do, and what the harness does instead:
//   - no log endpoint and no script before the page's own: problems are caught
//     by in-page hooks (harness.mjs problemHook) installed right after each page
//     load, so they cover what runs after it, including engine workers started
//     then (their policy violations are forwarded to the page's console);
//   - no download folder: the file the page hands the browser is read from the
//     page (harness.mjs saveHook);
//   - no print command: pdf() gives null, and the print sheet is rendered with
//     the page's print rules switched on (harness.mjs printMedia).
// The network goes to a closed local port (a manual proxy), as in Firefox.
import { spawn } from 'node:child_process';
import { createServer } from 'node:net';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

import { printMedia, problemHook, saveHook } from '../harness.mjs';

const root = join(dirname(fileURLToPath(import.meta.url)), '../../..');
const { Builder, By, Key } = createRequire(join(root, 'web/package.json'))('selenium-webdriver');
const miniBrowser = process.env.MINIBROWSER ?? '/usr/lib/x86_64-linux-gnu/webkit2gtk-4.1/MiniBrowser';
const sleep = (ms) => new Promise((resolve) => setTimeout(resolve, ms));

/** Start Xvfb on a display it picks; resolves with {process, display}. */
function startXvfb() {
  return new Promise((resolve, reject) => {
    const xvfb = spawn('Xvfb', ['-displayfd', '3', '-screen', '0', '1280x1024x24', '-nolisten', 'tcp'], {
      stdio: ['ignore', 'ignore', 'ignore', 'pipe'],
    });
    let text = '';
    xvfb.stdio[3].on('data', (chunk) => {
      text += chunk;
      if (text.includes('\n')) resolve({ process: xvfb, display: `:${text.trim()}` });
    });
    xvfb.on('error', reject);
    xvfb.on('exit', (code) => reject(new Error(`Xvfb exited (${code})`)));
  });
}

/** A TCP port nobody listens on just now. */
function freePort() {
  return new Promise((resolve, reject) => {
    const server = createServer();
    server.on('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const { port } = server.address();
      server.close(() => resolve(port));
    });
  });
}

/** WebKitWebDriver on a free port on `display`; resolves when it answers. */
async function startDriver(display) {
  for (let attempt = 0; attempt < 5; attempt += 1) {
    const port = await freePort();
    const driver = spawn('WebKitWebDriver', [`--port=${port}`], {
      stdio: 'ignore',
      env: { ...process.env, DISPLAY: display },
    });
    let exited = false;
    driver.on('exit', () => {
      exited = true;
    });
    for (let i = 0; i < 50 && !exited; i += 1) {
      try {
        const status = await fetch(`http://127.0.0.1:${port}/status`);
        if (status.ok) return { process: driver, port };
      } catch {
        // not listening yet
      }
      await sleep(100);
    }
    driver.kill();
  }
  throw new Error('WebKitWebDriver did not start');
}

class WebKitTab {
  constructor(driver, handle) {
    this.driver = driver;
    this.handle = handle;
    this.seen = [];
  }

  async focus() {
    if ((await this.driver.getWindowHandle()) !== this.handle) await this.driver.switchTo().window(this.handle);
  }
  /** Keep what the hooks of the page being left saw. */
  async harvest() {
    try {
      const found = await this.driver.executeScript('return window.__problems ? window.__problems.splice(0) : []');
      this.seen.push(...found);
    } catch {
      // no page yet
    }
  }
  async goto(url) {
    await this.focus();
    await this.harvest();
    await this.driver.get(url);
    await this.driver.executeScript(problemHook);
  }
  async evaluate(fn, arg) {
    await this.focus();
    return this.driver.executeScript(fn, arg);
  }
  /** Select what the field holds and type over it, key by key. */
  async fill(selector, text) {
    await this.focus();
    const input = await this.driver.findElement(By.css(selector));
    await this.driver.executeScript((el) => {
      el.focus();
      el.select();
    }, input);
    await this.driver.actions().sendKeys(text).perform();
  }
  async click(selector) {
    await this.focus();
    const element = await this.driver.findElement(By.css(selector));
    // cards off screen skip their layout (content-visibility): bring it in first, or the
    // driver finds the element not interactable
    await this.driver.executeScript((el) => el.scrollIntoView({ block: 'center' }), element);
    await element.click();
  }
  async pressTab() {
    await this.focus();
    await this.driver.actions().sendKeys(Key.TAB).perform();
  }
  async savedFile(selector) {
    await this.evaluate(saveHook);
    await this.evaluate(() => {
      window.__saved = undefined;
    });
    await this.click(selector);
    const end = Date.now() + 10000;
    for (;;) {
      const saved = await this.evaluate(() => window.__saved);
      if (saved) return saved;
      if (Date.now() > end) throw new Error('the page handed over no file');
      await sleep(100);
    }
  }
  pdf() {
    return null; // WebKitWebDriver has no print command
  }
  printMedia(on) {
    return printMedia(this, on);
  }
  async problems() {
    await this.harvest();
    return [...this.seen];
  }
  async close() {
    await this.harvest();
    await this.focus();
    const handles = await this.driver.getAllWindowHandles();
    if (handles.length > 1) {
      await this.driver.close();
      await this.driver.switchTo().window(handles.find((h) => h !== this.handle));
    } else {
      await this.driver.get('about:blank');
    }
  }
}

/** MiniBrowser under its own Xvfb and WebKitWebDriver. */
export async function start() {
  const xvfb = await startXvfb();
  let server;
  let driver;
  try {
    server = await startDriver(xvfb.display);
    driver = await new Builder()
      .usingServer(`http://127.0.0.1:${server.port}`)
      .withCapabilities({
        browserName: 'MiniBrowser',
        proxy: { proxyType: 'manual', httpProxy: '127.0.0.1:9', sslProxy: '127.0.0.1:9' },
        'webkitgtk:browserOptions': { binary: miniBrowser, args: ['--automation'] },
      })
      .build();
    await driver.manage().window().setRect({ width: 1280, height: 900 });
  } catch (err) {
    server?.process.kill();
    xvfb.process.kill();
    throw err;
  }
  const capabilities = await driver.getCapabilities();
  let first = true;
  return {
    name: 'webkit',
    version: capabilities.get('browserVersion'),
    async newTab(url) {
      let handle;
      if (first) handle = await driver.getWindowHandle();
      else handle = (await driver.switchTo().newWindow('tab')) ?? (await driver.getWindowHandle());
      first = false;
      if (typeof handle !== 'string') handle = await driver.getWindowHandle();
      const tab = new WebKitTab(driver, handle);
      if (url) await tab.goto(url);
      return tab;
    },
    async close() {
      try {
        await driver.quit();
      } finally {
        server.process.kill();
        xvfb.process.kill();
      }
    },
  };
}
