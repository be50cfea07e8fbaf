// The harness's Chromium (tests/browser/harness.mjs): Debian's Chromium through
// playwright-core, offline. Problems are read from outside the page: console
// messages and uncaught errors of the page, and, through a DevTools-protocol
// session that attaches to every worker before it runs, the log and console of
// each engine worker (playwright reports neither a worker's security-policy
// messages nor its log), plus any request that is not the page itself.
import { readFileSync } from 'node:fs';

import { launchChromium, printMedia } from '../harness.mjs';

const levels = new Set(['error', 'warning']);
const short = (text) => String(text).slice(0, 300);

/** Watch the log and console of `page` and of every worker it starts, into `problems`. */
async function watchWorkers(context, page, problems) {
  const cdp = await context.newCDPSession(page);
  let id = 0;
  const send = (sessionId, method) =>
    cdp.send('Target.sendMessageToTarget', { sessionId, message: JSON.stringify({ id: (id += 1), method }) });
  cdp.on('Target.attachedToTarget', async ({ sessionId }) => {
    for (const method of ['Log.enable', 'Runtime.enable', 'Runtime.runIfWaitingForDebugger'])
      await send(sessionId, method).catch(() => {});
  });
  cdp.on('Target.receivedMessageFromTarget', ({ message }) => {
    const { method, params } = JSON.parse(message);
    if (method === 'Log.entryAdded' && levels.has(params.entry.level))
      problems.push(`worker log ${params.entry.level}: ${short(params.entry.text)}`);
    else if (method === 'Runtime.consoleAPICalled' && ['error', 'warning'].includes(params.type))
      problems.push(`worker console ${params.type}: ${short(params.args.map((a) => a.value).join(' '))}`);
    else if (method === 'Runtime.exceptionThrown')
      problems.push(`worker error: ${short(params.exceptionDetails.exception?.description)}`);
  });
  cdp.on('Log.entryAdded', ({ entry }) => {
    if (levels.has(entry.level)) problems.push(`log ${entry.level}: ${short(entry.text)}`);
  });
  await cdp.send('Log.enable');
  // not flattened: this session's own view of the workers, beside playwright's
  await cdp.send('Target.setAutoAttach', { autoAttach: true, waitForDebuggerOnStart: true, flatten: false });
}

class ChromiumTab {
  constructor(context, page) {
    this.context = context;
    this.page = page;
    this.seen = [];
    page.on('console', (message) => {
      if (['error', 'warning'].includes(message.type()))
        this.seen.push(`console ${message.type()}: ${short(message.text())}`);
    });
    page.on('pageerror', (error) => this.seen.push(`page error: ${short(error.message)}`));
  }

  async goto(url) {
    await this.page.goto(url);
  }
  evaluate(fn, arg) {
    return this.page.evaluate(fn, arg);
  }
  fill(selector, text) {
    return this.page.fill(selector, text);
  }
  click(selector) {
    return this.page.click(selector);
  }
  pressTab() {
    return this.page.keyboard.press('Tab');
  }
  async savedFile(selector) {
    const [download] = await Promise.all([this.page.waitForEvent('download'), this.page.click(selector)]);
    return { name: download.suggestedFilename(), text: readFileSync(await download.path(), 'utf8') };
  }
  pdf() {
    return this.page.pdf({ format: 'A4' });
  }
  printMedia(on) {
    return printMedia(this, on, (print) => this.page.emulateMedia({ media: print ? 'print' : null }));
  }
  problems() {
    return [...this.seen, ...this.context.problems];
  }
  close() {
    return this.page.close();
  }
}

/** Chromium, one offline context; each tab's problems include the context's stray requests. */
export async function start() {
  const browser = await launchChromium();
  const context = await browser.newContext({ acceptDownloads: true, viewport: { width: 1280, height: 900 } });
  await context.setOffline(true);
  context.problems = [];
  context.on('request', (request) => {
    const url = request.url();
    if (!url.startsWith('file:') && !url.startsWith('blob:') && !url.startsWith('data:'))
      context.problems.push(`request: ${url}`);
  });
  return {
    name: 'chromium',
    version: browser.version(),
    async newTab(url) {
      const page = await context.newPage();
      const tab = new ChromiumTab(context, page);
      await watchWorkers(context, page, tab.seen);
      if (url) await tab.goto(url);
      return tab;
    },
    close: () => browser.close(),
  };
}
