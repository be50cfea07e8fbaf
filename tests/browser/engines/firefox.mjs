// The harness's Firefox (tests/browser/harness.mjs): Firefox ESR through
// puppeteer-core over WebDriver BiDi. Its log channel reports console messages
// and errors of the page and of its workers (a worker's security-policy refusal
// arrives as an error), and its network events every request. The network is
// sent to a closed local port, so nothing the page asked for could arrive.
// Downloads go to a fresh folder (Firefox saves them without asking); PDFs come
// from BiDi's print command.
import { mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { createRequire } from 'node:module';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

import { printMedia } from '../harness.mjs';

const root = join(dirname(fileURLToPath(import.meta.url)), '../../..');
const puppeteer = createRequire(join(root, 'web/package.json'))('puppeteer-core');
const short = (text) => String(text).slice(0, 300);
const sleep = (ms) => new Promise((resolve) => setTimeout(resolve, ms));

class FirefoxTab {
  constructor(browser, page) {
    this.browser = browser;
    this.page = page;
    this.seen = [];
    page.on('console', (message) => {
      if (['error', 'warn', 'warning'].includes(message.type()))
        this.seen.push(`console ${message.type()}: ${short(message.text())}`);
    });
    page.on('pageerror', (error) => this.seen.push(`page error: ${short(error.message ?? error)}`));
    page.on('request', (request) => {
      const url = request.url();
      if (!url.startsWith('file:') && !url.startsWith('blob:') && !url.startsWith('data:'))
        this.seen.push(`request: ${url}`);
    });
  }

  async goto(url) {
    await this.page.goto(url);
  }
  evaluate(fn, arg) {
    return this.page.evaluate(fn, arg);
  }
  /** Select what the field holds and type over it, key by key. */
  async fill(selector, text) {
    await this.page.$eval(selector, (input) => {
      input.focus();
      input.select();
    });
    await this.page.keyboard.type(text);
  }
  click(selector) {
    return this.page.click(selector);
  }
  pressTab() {
    return this.page.keyboard.press('Tab');
  }
  async savedFile(selector) {
    const before = new Set(readdirSync(this.browser.downloads));
    await this.click(selector);
    const end = Date.now() + 10000;
    for (;;) {
      const name = readdirSync(this.browser.downloads).find((f) => !before.has(f) && !f.endsWith('.part'));
      if (name) {
        await sleep(200); // written in one go, but let Firefox close it
        return { name, text: readFileSync(join(this.browser.downloads, name), 'utf8') };
      }
      if (Date.now() > end) throw new Error('Firefox saved no file');
      await sleep(100);
    }
  }
  async pdf() {
    return Buffer.from(await this.page.pdf({ format: 'A4' }));
  }
  printMedia(on) {
    return printMedia(this, on);
  }
  problems() {
    return [...this.seen];
  }
  close() {
    return this.page.close();
  }
}

/** Firefox ESR ($FIREFOX, else /usr/bin/firefox-esr), headless, with its own download folder. */
export async function start() {
  const downloads = mkdtempSync(join(tmpdir(), 'hedgeleaf-firefox-'));
  const browser = await puppeteer.launch({
    browser: 'firefox',
    executablePath: process.env.FIREFOX ?? '/usr/bin/firefox-esr',
    headless: true,
    defaultViewport: { width: 1280, height: 900 },
    extraPrefsFirefox: {
      // every request of the browser goes to a closed port: the page must need none
      'network.proxy.type': 1,
      'network.proxy.http': '127.0.0.1',
      'network.proxy.http_port': 9,
      'network.proxy.ssl': '127.0.0.1',
      'network.proxy.ssl_port': 9,
      'network.proxy.no_proxies_on': '',
      // a downloaded file lands in `downloads` without a dialog
      'browser.download.folderList': 2,
      'browser.download.dir': downloads,
      'browser.download.useDownloadDir': true,
      'browser.download.always_ask_before_handling_new_types': false,
      'browser.download.start_downloads_in_tmp_dir': false,
    },
  });
  const handle = { downloads };
  return {
    name: 'firefox',
    version: await browser.version(),
    async newTab(url) {
      const page = await browser.newPage();
      const tab = new FirefoxTab(handle, page);
      if (url) await tab.goto(url);
      return tab;
    },
    async close() {
      await browser.close();
      rmSync(downloads, { recursive: true, force: true });
    },
  };
}
