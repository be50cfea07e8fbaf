// Browser tests of the page's security and of "no lost work", on the built page
// (dist/hedgeleaf.html, or $HEDGELEAF_PAGE) opened from file:// in Debian's Chromium:
//   - no request leaves the page, also after import, export, print, link and page copy;
//   - no eval: the CSP has no 'unsafe-eval', eval is refused, no violation is reported;
//   - user text (client name, notes, currency, an imported file's strings and name, a
//     link's trade) is shown as text and never becomes HTML;
//   - an edited trade comes back after a reload; a corrupt import changes nothing;
//     local storage filled to its quota gives a clear warning;
//   - cases of tests/bad_inputs.json show the engine's message inline and keep the
//     last good result.
import assert from 'node:assert/strict';
import { existsSync, readFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { after, before, test } from 'node:test';
import { fileURLToPath, pathToFileURL } from 'node:url';

import { badInputs, caseText } from '../bad_inputs.mjs';
import { launchChromium, until } from './harness.mjs';

const root = join(dirname(fileURLToPath(import.meta.url)), '../..');
const pagePath = resolve(process.env.HEDGELEAF_PAGE ?? join(root, 'dist/hedgeleaf.html'));
const pageUrl = pathToFileURL(pagePath).href;
const exampleText = readFileSync(join(root, 'examples/american-put.json'), 'utf8');
const linkTo = (text) => `${pageUrl}#trade=${Buffer.from(text).toString('base64url')}`;

// Markup that would run script or fetch something if it were ever parsed as HTML.
const payloads = [
  '<script>window.__pwned = "script"</script>',
  '<img src=x onerror="window.__pwned = \'onerror\'">',
  '<svg onload="window.__pwned = \'onload\'"></svg>',
];

let browser;
let context;
const requests = []; // every request any page or worker of the context made
const foreign = []; // requests other than the page file and the engine worker's blob:

before(async () => {
  assert.ok(existsSync(pagePath), `build the page first: node web/build.mjs (${pagePath})`);
  browser = await launchChromium();
  context = await browser.newContext({ acceptDownloads: true, viewport: { width: 1280, height: 900 } });
  await context.grantPermissions(['clipboard-read', 'clipboard-write']);
  await context.setOffline(true);
  context.on('request', (request) => {
    const url = request.url();
    requests.push(url);
    if (url.split('#')[0] !== pageUrl && !url.startsWith('blob:')) foreign.push(url);
  });
  // Count security-policy violations in every page and its workers.
  await context.addInitScript(() => {
    globalThis.__violations = [];
    globalThis.addEventListener('securitypolicyviolation', (e) => {
      globalThis.__violations.push(`${e.violatedDirective}: ${e.blockedURI}`);
    });
  });
});

after(async () => {
  await browser?.close();
});

const premiumOf = (page) => until(page, () => document.querySelector('[data-result="premium"]')?.dataset.value);

async function open(url = linkTo(exampleText)) {
  const page = await context.newPage();
  page.on('websocket', (ws) => foreign.push(`websocket: ${ws.url()}`));
  page.on('worker', (worker) => {
    worker
      .evaluate(() => {
        globalThis.__violations = [];
        globalThis.addEventListener('securitypolicyviolation', (e) =>
          globalThis.__violations.push(e.violatedDirective),
        );
      })
      .catch(() => {});
  });
  await page.goto(url);
  await premiumOf(page);
  return page;
}

/** Nothing the user typed became an element or ran. */
async function assertInert(page, where) {
  const state = await page.evaluate(() => ({
    pwned: window.__pwned ?? null,
    injected: document.querySelectorAll(
      'img[src="x"], svg[onload], [onerror], [onload], body script:not([id]):not([type])',
    ).length,
    violations: window.__violations,
  }));
  assert.equal(state.pwned, null, `${where}: user text ran as script`);
  assert.equal(state.injected, 0, `${where}: user text became elements`);
  assert.deepEqual(state.violations, [], `${where}: CSP violations`);
}

test('the CSP allows no eval or inline script; both are refused and reported', async () => {
  const page = await open();
  const csp = await page.getAttribute('meta[http-equiv="Content-Security-Policy"]', 'content');
  assert.ok(csp, 'no CSP meta tag');
  assert.ok(!csp.includes("'unsafe-eval'"), csp);
  assert.ok(!csp.includes("'unsafe-inline'"), csp);
  assert.match(csp, /default-src 'none'/);
  assert.ok(!/connect-src/.test(csp), 'no connect-src: fetch and XHR fall under default-src none');
  await assertInert(page, 'after opening');
  // A string timer is eval by another name; an injected inline script is what an HTML
  // injection would bring. Neither runs, and each is reported as a violation.
  const probe = await page.evaluate(
    () =>
      new Promise((done) => {
        const before = window.__violations.length;
        setTimeout('window.__pwned = "string timer"', 0);
        const script = document.createElement('script');
        script.textContent = 'window.__pwned = "inline script"';
        document.body.append(script);
        script.remove();
        setTimeout(() => done({ pwned: window.__pwned ?? null, reported: window.__violations.slice(before) }), 300);
      }),
  );
  assert.equal(probe.pwned, null);
  assert.deepEqual(probe.reported.map((v) => v.split(':')[0]).sort(), ['script-src', 'script-src-elem']);
  assert.ok(
    probe.reported.some((v) => v.endsWith(': eval')),
    probe.reported.join(', '),
  );
  await page.evaluate(() => {
    window.__violations.length = 0;
  });
  await page.close();
});

test('no request leaves the page, also after import, export, print, link and page copy', async () => {
  const page = await open();
  const premium = await premiumOf(page);
  const [saved] = await Promise.all([page.waitForEvent('download'), page.click('#action-export')]);
  const text = readFileSync(await saved.path(), 'utf8');
  await page.setInputFiles('#import-file', {
    name: 'back.json',
    mimeType: 'application/json',
    buffer: Buffer.from(text),
  });
  await page.locator('#notice').filter({ hasText: 'back.json' }).waitFor();
  await page.click('#action-link');
  await page
    .locator('#notice')
    .filter({ hasText: /clipboard|address bar/ })
    .waitFor();
  const [copy] = await Promise.all([page.waitForEvent('download'), page.click('#action-copy-page')]);
  assert.ok(readFileSync(await copy.path(), 'utf8').includes('id="embedded-trade">{'));
  await page.emulateMedia({ media: 'print' });
  assert.ok((await page.pdf({ format: 'A4' })).length > 10000);
  await page.emulateMedia({ media: 'screen' });
  // Every card that computes something, once.
  for (const details of await page.locator('details').all())
    await details.evaluate((d) => {
      d.open = true;
    });
  await new Promise((r) => setTimeout(r, 1500));
  assert.equal(await premiumOf(page), premium);
  await assertInert(page, 'after import, export, print, link and copy');
  assert.ok(
    requests.some((url) => url.startsWith(pageUrl)),
    'the page itself was seen',
  );
  assert.deepEqual(foreign, [], 'requests beyond the page file');
  await page.close();
});

test('text typed into client, notes and currency stays text', async () => {
  const page = await open();
  for (const payload of payloads) {
    await page.fill('[data-path="quote.currency"]', 'EUR');
    await page.fill('[data-path="quote.client"]', payload);
    await page.fill('[data-path="quote.notes"]', `${payload}\nsecond line ${payload}`);
    await page.emulateMedia({ media: 'print' });
    await until(page, (p) => document.getElementById('quote-sheet').innerText.includes(p), payload);
    await page.emulateMedia({ media: 'screen' });
    // The engine refuses the currency and quotes it; the quote is shown as text too.
    await page.fill('[data-path="quote.currency"]', payload.slice(0, 12));
    const error = page.locator('[data-error="quote.currency"]');
    await error.filter({ hasText: 'ISO 4217' }).waitFor({ timeout: 10000 });
    assert.match(
      await error.getAttribute('data-engine-message'),
      /^quote\.currency: must be an ISO 4217 currency code/,
    );
    assert.ok((await error.textContent()).includes(payload.slice(0, 12)));
    await assertInert(page, `typed ${payload}`);
  }
  assert.deepEqual(foreign, []);
  await page.close();
});

test("strings of an imported file, its name and a link's trade stay text", async () => {
  for (const payload of payloads) {
    const trade = JSON.parse(exampleText);
    trade.quote = { client: payload, notes: payload, currency: 'EUR' };
    // Opened from a link:
    const page = await open(linkTo(JSON.stringify(trade)));
    assert.equal(await page.inputValue('[data-path="quote.client"]'), payload);
    await assertInert(page, `link with ${payload}`);
    // Imported, under a file name that is markup itself:
    await page.setInputFiles('#import-file', {
      name: `${payload}.json`,
      mimeType: 'application/json',
      buffer: Buffer.from(JSON.stringify(trade)),
    });
    // (wait for this file's notice, not the link's "Opened the trade from the link")
    await page
      .locator('#notice')
      .filter({ hasText: `${payload}.json` })
      .waitFor();
    assert.match(await page.textContent('#notice'), /^Opened “/);
    // Refused, with the markup quoted inside the engine's message:
    const bad = JSON.parse(exampleText);
    bad.option.type = payload;
    await page.setInputFiles('#import-file', {
      name: 'bad.json',
      mimeType: 'application/json',
      buffer: Buffer.from(JSON.stringify(bad)),
    });
    await page.locator('#notice').filter({ hasText: 'was not opened' }).waitFor();
    assert.ok((await page.textContent('#notice')).includes('option.type: must be one of'));
    await assertInert(page, `imported ${payload}`);
    await page.close();
  }
  assert.deepEqual(foreign, []);
});

test('a link whose trade is nested thousands deep is refused with a notice; the page keeps working', async () => {
  const deep = `{"market": ${'{"a": '.repeat(5000)}1${'}'.repeat(5000)}}`;
  const page = await open(linkTo(deep));
  await page
    .locator('#notice')
    .filter({ hasText: 'could not be read (it is nested more than 64 levels deep' })
    .waitFor();
  assert.ok(Number(await premiumOf(page)) > 0, 'the last trade is priced instead');
  await page.close();
});

test('an edited trade is back after a reload', async () => {
  const page = await open();
  const first = await premiumOf(page);
  await page.fill('[data-path="option.strike"]', '47.5');
  await page.fill('[data-path="quote.currency"]', 'EUR');
  await page.fill('[data-path="quote.client"]', 'Kestrel Mill Holdings');
  await until(page, (p) => document.querySelector('[data-result="premium"]').dataset.value !== p, first);
  await new Promise((r) => setTimeout(r, 800)); // past the recompute debounce
  await until(page, () => !('computing' in document.body.dataset));
  const premium = await premiumOf(page);
  await page.reload();
  await until(page, () => document.querySelector('[data-path="option.strike"]')?.value === '47.5');
  assert.equal(await page.inputValue('[data-path="quote.client"]'), 'Kestrel Mill Holdings');
  await until(page, (p) => document.querySelector('[data-result="premium"]')?.dataset.value === p, premium);
  await page.close();
});

test('a corrupt import leaves the current trade as it was', async () => {
  const page = await open();
  await page.fill('[data-path="option.strike"]', '44');
  await until(
    page,
    () =>
      !('computing' in document.body.dataset) && document.querySelector('[data-path="option.strike"]').value === '44',
  );
  await new Promise((r) => setTimeout(r, 600));
  const premium = await premiumOf(page);
  const saved = await page.evaluate(() => localStorage.getItem('hedgeleaf.autosave.v1'));
  const corrupt = [
    ['truncated.json', exampleText.slice(0, exampleText.length / 2), 'not a JSON trade file'],
    ['binary.json', Buffer.from([0xff, 0xfe, 0x00, 0x7b, 0x22]), 'not a JSON trade file'],
    ['list.json', '[1, 2, 3]', 'does not hold a trade'],
    ['nan.json', exampleText.replace('"spot": 48.20', '"spot": NaN'), 'not a JSON trade file'],
    // (a trade with a number typed as text opens, as the page saves a half-typed one; a choice no
    // list holds does not)
    ['wrong.json', exampleText.replace('"type": "put"', '"type": 3'), 'option.type: must be one of'],
    ['huge.json', `{"notes": "${'x'.repeat((1 << 20) + 10)}"}`, 'larger than 1 MB'],
    // nesting this deep once stopped the engine (a stack overflow when the document was copied)
    ['deep.json', `{"market": ${'{"a": '.repeat(5000)}1${'}'.repeat(5000)}}`, 'nested more than 64 levels deep'],
  ];
  for (const [name, content, why] of corrupt) {
    await page.evaluate(() => {
      document.getElementById('notice').textContent = '';
    });
    await page.setInputFiles('#import-file', { name, mimeType: 'application/json', buffer: Buffer.from(content) });
    await page.locator('#notice').filter({ hasText: why }).waitFor();
    assert.match(await page.textContent('#notice'), /The current trade is unchanged/);
    assert.equal(await page.inputValue('[data-path="option.strike"]'), '44', name);
    assert.equal(await premiumOf(page), premium, name);
  }
  assert.equal(
    await page.evaluate(() => localStorage.getItem('hedgeleaf.autosave.v1')),
    saved,
    'the autosave is untouched',
  );
  await page.close();
});

test('local storage full: a clear warning, and the trade on screen keeps working', async () => {
  const page = await open();
  const filled = await page.evaluate(() => {
    localStorage.removeItem('hedgeleaf.autosave.v1');
    let chunk = 'x'.repeat(1 << 20);
    let n = 0;
    // Fill with halving chunks until not even one character fits.
    while (chunk.length > 0) {
      try {
        localStorage.setItem(`filler-${n}`, chunk);
        n += 1;
      } catch {
        chunk = chunk.slice(0, chunk.length >> 1);
      }
    }
    return n;
  });
  assert.ok(filled > 0);
  await page.fill('[data-path="quote.client"]', 'Larkspur Ceramics');
  await page.locator('#notice').filter({ hasText: 'local storage is full' }).waitFor({ timeout: 5000 });
  assert.match(await page.textContent('#notice'), /Save file to keep it/);
  assert.equal(await page.getAttribute('#notice', 'data-kind'), 'warning');
  await page.fill('[data-path="option.strike"]', '45');
  await until(page, () => !('computing' in document.body.dataset));
  assert.ok(Number(await premiumOf(page)) > 0, 'pricing goes on');
  await page.evaluate(() => localStorage.clear());
  await page.close();
});

test('bad inputs from the shared table: the message inline, the last good result kept', async () => {
  const page = await open();
  // Form fields that take the table's bad value as typed (volatility in percent).
  const typed = {
    'spot 0': ['market.spot', '0'],
    'strike -1': ['option.strike', '-1'],
    'volatility 0': ['market.volatility', '0'],
  };
  for (const c of badInputs.cases.filter((x) => x.name in typed)) {
    const [path, value] = typed[c.name];
    const before = await page.textContent('[data-result="premium"]');
    const good = await page.inputValue(`[data-path="${path}"]`);
    await page.fill(`[data-path="${path}"]`, value);
    // the engine's line beside the field (data-engine-message; the text is in the units on screen)
    const line = `${c.field}: ${c.message}`;
    await until(page, ([f, m]) => document.querySelector(`[data-error="${f}"]`)?.dataset.engineMessage === m, [
      c.field,
      line,
    ]);
    assert.match(await page.textContent(`[data-error="${c.field}"]`), /must be above 0( %)?, got /);
    assert.equal(await page.textContent('[data-result="premium"]'), before, `${c.name}: the last result stays`);
    await page.fill(`[data-path="${path}"]`, good);
    await until(page, (p) => !document.querySelector(`[data-error="${p}"]`)?.textContent, c.field);
  }
  // Whole documents from the table, imported: a misspelt or unknown field is refused with the
  // engine's message and nothing changes; a trade with one input to mend opens as it is, the
  // message beside that input (nothing typed is lost in a saved file).
  const premium = await premiumOf(page);
  for (const c of badInputs.cases.filter((x) => ['volatilty', 'quantty'].includes(x.name))) {
    await page.setInputFiles('#import-file', {
      name: 'case.json',
      mimeType: 'application/json',
      buffer: Buffer.from(caseText(c)),
    });
    await page.locator('#notice').filter({ hasText: c.message }).waitFor();
    assert.ok((await page.textContent('#notice')).includes(`${c.field}: `));
    assert.equal(await premiumOf(page), premium);
  }
  for (const c of badInputs.cases.filter((x) => ['expiry before valuation', 'strikes out of order'].includes(x.name))) {
    await page.setInputFiles('#import-file', {
      name: 'draft.json',
      mimeType: 'application/json',
      buffer: Buffer.from(caseText(c)),
    });
    await page.locator('#notice').filter({ hasText: 'it still has an input to mend' }).waitFor();
    await until(page, (f) => document.querySelector(`[data-error="${f}"]`)?.textContent, c.field);
  }
  await page.close();
});

test('no request left the page in any test', () => {
  assert.deepEqual(foreign, []);
});
