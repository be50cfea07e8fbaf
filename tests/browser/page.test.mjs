// Browser tests of the built page, dist/hedgeleaf.html, opened from file:// in
// Debian's Chromium through playwright-core, with the network switched off.
// Few and real: opens offline, the example's premium equals the CLI's, a bad
// volatility shows the engine's message, no request leaves the page, export ->
// import round trip, the print view carries the cautions, a clean console.
import assert from 'node:assert/strict';
import { execFileSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { existsSync, readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { after, before, test } from 'node:test';
import { fileURLToPath, pathToFileURL } from 'node:url';

import { launchChromium, until } from './harness.mjs';

const root = join(dirname(fileURLToPath(import.meta.url)), '../..');
const pagePath = join(root, 'dist/hedgeleaf.html');
const pageUrl = pathToFileURL(pagePath).href;
const cli = process.env.HEDGELEAF_CLI ?? join(root, 'build/native/hedgeleaf');
const exampleText = readFileSync(join(root, 'examples/american-put.json'), 'utf8');
const linkTo = (text) => `${pageUrl}#trade=${Buffer.from(text).toString('base64url')}`;

let browser;
let context;
const problems = []; // console errors and requests that are not the page itself
const requests = [];

before(async () => {
  assert.ok(existsSync(pagePath), 'build the page first: node web/build.mjs');
  browser = await launchChromium();
  context = await browser.newContext({ acceptDownloads: true, viewport: { width: 1280, height: 900 } });
  await context.setOffline(true);
  context.on('request', (request) => {
    const url = request.url();
    requests.push(url);
    // the page file itself, and the in-memory Blob the engine worker starts from
    if (url.split('#')[0] !== pageUrl && !url.startsWith('blob:')) problems.push(`request: ${url}`);
  });
});

after(async () => {
  await browser?.close();
});

async function open(url = linkTo(exampleText)) {
  const page = await context.newPage();
  page.on('console', (message) => {
    if (message.type() === 'error' || message.type() === 'warning')
      problems.push(`console ${message.type()}: ${message.text()}`);
  });
  page.on('pageerror', (error) => problems.push(`page error: ${error.message}`));
  await page.goto(url);
  await premiumShown(page);
  return page;
}

async function premiumShown(page) {
  return Number(await until(page, () => document.querySelector('[data-result="premium"]')?.dataset.value));
}

/** The price result the CLI prints for a trade (the module's, if no native build is around). */
async function cliResult(text) {
  if (existsSync(cli)) return JSON.parse(execFileSync(cli, ['price', '-'], { input: text, encoding: 'utf8' }));
  const { loadEngine } = await import('../../web/src/engine.js');
  const engine = await loadEngine(createRequire(import.meta.url)(join(root, 'build/wasm/hedgeleaf.js')));
  return engine.run('price', text);
}
const cliPremium = async (text) => (await cliResult(text)).premium;

test('opens from file:// offline and prices the example as the CLI does', async () => {
  const page = await open();
  const premium = await premiumShown(page);
  const expected = await cliPremium(exampleText);
  assert.ok(Math.abs(premium - expected) <= 1e-9 * expected, `page ${premium}, CLI ${expected}`); // same tolerance as the module tests
  assert.equal(await page.textContent('[data-result="premium"]'), premium.toFixed(4));
  assert.match(await page.textContent('[data-result="premium-total"]'), /^\d{1,3}(,\d{3})+\.\d\d$/);
  for (const name of [
    'delta',
    'gamma',
    'theta',
    'vega',
    'rho',
    'closed-form-premium',
    'error-estimate',
    'premium-total',
  ]) {
    assert.ok(await page.getAttribute(`[data-result="${name}"]`, 'data-value'), `${name} has no value`);
  }
  await page.close();
});

test('a bad volatility shows the engine message beside the field; the last result stays, greyed', async () => {
  const page = await open();
  const before = await page.textContent('[data-result="premium"]');
  await page.fill('[data-path="market.volatility"]', '-20');
  const error = page.locator('[data-error="market.volatility"]');
  await error.filter({ hasText: 'must be' }).waitFor({ timeout: 10000 });
  // the engine's line (the CLI's words) is kept; the page says it in the units on screen
  assert.equal(await error.getAttribute('data-engine-message'), 'market.volatility: must be > 0, got -0.2');
  assert.equal(await error.textContent(), 'Volatility must be above 0 %, got −20 %');
  assert.equal(await page.getAttribute('[data-path="market.volatility"]', 'aria-invalid'), 'true');
  assert.equal(await page.textContent('[data-result="premium"]'), before);
  assert.match(await page.getAttribute('.headline', 'class'), /stale/);
  await page.fill('[data-path="market.volatility"]', '31');
  await until(page, () => !document.querySelector('.headline').classList.contains('stale'));
  assert.equal(await error.textContent(), '');
  await page.close();
});

test('export then import gives back the same trade; a bad file is refused', async () => {
  const page = await open();
  const premium = await premiumShown(page);
  const [download] = await Promise.all([page.waitForEvent('download'), page.click('#action-export')]);
  const saved = readFileSync(await download.path(), 'utf8');
  assert.deepEqual(JSON.parse(saved), JSON.parse(exampleText));
  // the fingerprint on screen and on the sheet is the saved file's SHA-256 (sha256sum agrees)
  const digest = createHash('sha256').update(saved).digest('hex').slice(0, 12);
  await until(page, (d) => document.querySelector('[data-result="fingerprint"]').textContent === d, digest);

  await page.fill('[data-path="option.strike"]', '50');
  await until(page, (p) => Number(document.querySelector('[data-result="premium"]').dataset.value) !== p, premium);
  await page.setInputFiles('#import-file', {
    name: 'bad.json',
    mimeType: 'application/json',
    buffer: Buffer.from('{"market": {"spot": -1}}'),
  });
  await page.locator('#notice').filter({ hasText: 'was not opened' }).waitFor();
  assert.match(await page.textContent('#notice'), /market\.spot: must be > 0, got -1/);
  assert.equal(await page.inputValue('[data-path="option.strike"]'), '50');

  await page.setInputFiles('#import-file', {
    name: 'back.json',
    mimeType: 'application/json',
    buffer: Buffer.from(saved),
  });
  await until(page, (p) => Number(document.querySelector('[data-result="premium"]').dataset.value) === p, premium);
  assert.equal(await page.inputValue('[data-path="option.strike"]'), '46');
  await page.close();
});

test('the print view is the client sheet, with the cautions; client text stays text', async () => {
  const trade = JSON.parse(exampleText);
  trade.quote = {
    client: '<b>Orchard</b> & Lane',
    notes: '<img src=x>',
    currency: 'EUR',
    margin_type: 'fraction_of_premium',
    margin: 0.02,
    tick: 0.01,
    prepared_by: 'Mara Lindqvist',
    contact: '+44 20 7946 0321',
    indicative_until: '2026-12-02T17:00Z',
  };
  const page = await open(linkTo(JSON.stringify(trade)));
  await page.emulateMedia({ media: 'print' });
  const sheet = page.locator('#quote-sheet');
  assert.ok(await sheet.isVisible());
  assert.ok(!(await page.locator('#terms').isVisible()));
  const text = (await sheet.innerText()).replace(/\s+/g, ' '); // cells and lines as single spaces
  // the date in the browser's own order (no format picked here), the time of day as typed
  const language = await page.evaluate(() => navigator.language);
  const day = new Intl.DateTimeFormat(language, { day: '2-digit', month: '2-digit', year: 'numeric', timeZone: 'UTC' });
  for (const phrase of [
    'Indicative only',
    'not an offer',
    'not investment advice',
    'constant volatility',
    'without frictions',
    'sales rules',
    'Input fingerprint',
    'Valued at',
    `Indicative until ${day.format(Date.UTC(2026, 11, 2))} 17:00Z`,
    'Prepared by Mara Lindqvist',
    'Desk contact +44 20 7946 0321',
    'The trade, leg by leg',
    'Client buys Put 46.00 (95.4 % of spot)',
    'Break-even at expiry',
  ]) {
    assert.ok(text.includes(phrase), `the sheet lacks "${phrase}"`);
  }
  assert.match(text, /Input fingerprint\s+[0-9a-f]{12}/);
  // the client sheet never shows the desk's model value, margin, Greeks or lattice
  for (const deskOnly of ['Model value', 'Premium per unit', 'Desk margin', 'delta', 'Vega', 'Lattice', 'INTERNAL'])
    assert.ok(!text.includes(deskOnly), `the client sheet shows "${deskOnly}"`);
  // the client price is the engine's (3.0822 + 2 %, up to the 0.01 tick); an engine without quotes shows none
  const clientPrice = (await cliResult(JSON.stringify(trade))).client_price;
  assert.match(
    text,
    new RegExp(`Client price per unit \\(buys at the offer\\)\\s+${clientPrice.per_unit.toFixed(4)} EUR`),
  );
  // the break-even is at the client price: strike - offer (46 - client price), not strike - model value
  assert.ok(text.includes(`Break-even at expiry ${(46 - clientPrice.per_unit).toFixed(2)}`), 'break-even at the offer');
  assert.ok(text.includes('<b>Orchard</b> & Lane') && text.includes('<img src=x>'), 'client text shown as typed');
  assert.equal(
    await page.locator('#quote-sheet b, #quote-sheet img, .workbench b').count(),
    0,
    'client text never becomes HTML',
  );
  // one A4 page, the caution at its head and the full notes at its foot (printed scrolled down,
  // as from the button at the foot of a long page)
  await page.evaluate(() => window.scrollTo(0, 400));
  const pdf = await page.pdf({ format: 'A4' });
  assert.ok(pdf.length > 10000);
  const pages = pdf.toString('latin1').match(/\/Type\s*\/Page(?!s)/g) ?? [];
  assert.equal(pages.length, 1, 'the quote sheet prints on one A4 page');
  assert.ok(text.indexOf('Indicative only') < text.indexOf('Terms'), 'the caution heads the sheet');

  // The internal sheet adds the desk's figures, says so at its head, and the switch is remembered.
  await page.emulateMedia({ media: 'screen' });
  await page.check('#sheet-internal');
  await page.emulateMedia({ media: 'print' });
  await until(page, () => document.getElementById('sheet-title').textContent.startsWith('INTERNAL'));
  const internal = (await sheet.innerText()).replace(/\s+/g, ' ');
  for (const phrase of ['INTERNAL', 'Model value per unit', 'Desk margin in total', 'Position delta', 'Engine'])
    assert.ok(internal.includes(phrase), `the internal sheet lacks "${phrase}"`);
  const internalPdf = await page.pdf({ format: 'A4' });
  assert.equal((internalPdf.toString('latin1').match(/\/Type\s*\/Page(?!s)/g) ?? []).length, 1, 'one A4 page');
  await page.emulateMedia({ media: 'screen' });
  await page.reload();
  await until(page, () => document.getElementById('sheet-internal').checked);
  await page.uncheck('#sheet-internal');
  await page.close();
});

test('a two-way quote shows the bid and the offer; shares held never change the client price', async () => {
  const trade = JSON.parse(exampleText);
  trade.quote = { currency: 'EUR', margin: 0.1, tick: 0.01, two_way: true, holding: { shares: 25000 } };
  const cli = (await cliResult(JSON.stringify(trade))).client_price;
  const page = await open(linkTo(JSON.stringify(trade)));
  const shown = await until(page, () => {
    const node = document.querySelector('[data-result="bid-offer"]');
    return node && !node.closest('[hidden]') && node.textContent !== '–' && node.textContent;
  });
  assert.equal(shown, `${cli.bid.per_unit.toFixed(4)} / ${cli.offer.per_unit.toFixed(4)}`);
  const price = await page.getAttribute('[data-result="client-price"]', 'data-value');
  assert.equal(Number(price), cli.offer.per_unit, 'the client buys at the offer');
  delete trade.quote.holding;
  assert.equal(
    (await cliResult(JSON.stringify(trade))).client_price.per_unit,
    cli.per_unit,
    'the holding is not priced',
  );
  // the break-even on screen is the client's: strike - offer (the engine's, at the client price)
  const evens = await until(page, () => document.querySelector('[data-result="break-even"]')?.dataset.values);
  assert.ok(Math.abs(JSON.parse(evens)[0] - (46 - cli.offer.per_unit)) < 1e-9, `break-even ${evens}`);
  await page.close();
});

test('Show to client: larger type, the client price first, the desk figures hidden, remembered', async () => {
  const trade = JSON.parse(exampleText);
  trade.quote = { currency: 'EUR', margin: 0.1, tick: 0.01 };
  const cli = (await cliResult(JSON.stringify(trade))).client_price;
  const page = await open(linkTo(JSON.stringify(trade)));
  const visible = (selector) => page.locator(selector).first().isVisible();
  assert.ok(await visible('[data-result="premium"]'), 'the desk sees the model value');
  const fontBefore = await page.evaluate(() => parseFloat(getComputedStyle(document.body).fontSize));
  await page.check('#present-view');
  for (const deskOnly of ['[data-result="premium"]', '[data-result="desk-margin-total"]', '[data-result="delta"]'])
    assert.ok(!(await visible(deskOnly)), `${deskOnly} is hidden on the shared screen`);
  const headline = page.locator('.headline-client [data-result="client-price"]');
  assert.ok(await headline.isVisible());
  assert.equal((await headline.textContent()).trim(), `${cli.per_unit.toFixed(4)} EUR`);
  assert.ok(await visible('#profile-chart'), 'the chart stays');
  const fontAfter = await page.evaluate(() => parseFloat(getComputedStyle(document.body).fontSize));
  assert.ok(fontAfter > fontBefore * 1.2, `larger type: ${fontBefore} -> ${fontAfter}`);
  // the chart comes before the terms
  const [chartTop, termsTop] = await page.evaluate(() =>
    ['profile-chart', 'terms'].map((id) => document.getElementById(id).getBoundingClientRect().top),
  );
  assert.ok(chartTop < termsTop, 'the chart first');
  await page.reload();
  await until(page, () => document.body.classList.contains('presenting'));
  await page.uncheck('#present-view');
  assert.ok(await visible('[data-result="premium"]'));
  await page.close();
});

test('a hedge along a path picked on the tree; a long simulation cancels, a short one reports', async () => {
  const page = await open();
  await page.check('input[name="hedge-kind"][value="lattice"]');
  await page.locator('#hedge-tree .node').first().waitFor();
  const spotAfterStep1 = () =>
    page.evaluate(
      () => document.querySelector('[data-result="hedge-schedule"] tbody tr:nth-child(2) td:nth-child(3)')?.textContent,
    );
  await until(page, () => document.querySelectorAll('#hedge-tree .node.on-path').length === 7);
  const up = await spotAfterStep1();
  await page.click('.path-buttons .move >> nth=0'); // the first step turns from up to down
  await until(
    page,
    (before) =>
      document.querySelector('[data-result="hedge-schedule"] tbody tr:nth-child(2) td:nth-child(3)')?.textContent !==
      before,
    up,
  );
  assert.ok(Number((await spotAfterStep1()).replace(/,/g, '')) < 48.2, 'after a down move spot is below 48.20');
  assert.equal(await page.getAttribute('.path-buttons .move >> nth=0', 'aria-pressed'), 'false');

  await page.fill('[data-path="simulate.paths"]', '200,000');
  await page.click('#simulate-run');
  await page.locator('#simulate-status').filter({ hasText: 'Simulating' }).waitFor();
  await page.click('#simulate-cancel');
  await page.locator('#simulate-status').filter({ hasText: 'Cancelled' }).waitFor({ timeout: 2000 });
  await page.fill('[data-path="simulate.paths"]', '2000');
  await page.click('#simulate-run');
  await page.locator('[data-result="simulation"] tbody tr').first().waitFor({ timeout: 20000 });
  assert.equal(await page.locator('[data-result="simulation"] tbody tr').count(), 3);
  await page.close();
});

test('scenario ladder and solver: cards open, recompute with the trade, and the solution can be used', async () => {
  const page = await open();
  const rows = () => document.querySelectorAll('table[data-result="ladder"] tbody tr').length;
  await page.click('#ladder-card summary');
  assert.equal(await until(page, rows), 21); // spot -20 % .. +20 % in steps of 2 %
  const today = await page.evaluate(() =>
    [...document.querySelectorAll('table[data-result="ladder"] tbody tr')]
      .map((tr) => [...tr.cells].map((c) => c.textContent))
      .find((cells) => cells[1] === '+0.0 %'),
  );
  assert.equal(today[0], '48.20');
  assert.equal(today[3], '0.0000'); // P&L against today's value on the same lattice
  // an edit refreshes the open ladder in place
  await page.fill('[data-path="market.spot"]', '50');
  await until(
    page,
    () => document.querySelector('table[data-result="ladder"] tbody tr:nth-child(11) th')?.textContent === '50.00',
  );
  await page.selectOption('[data-path="ladder.kind"]', 'volatility');
  await until(page, () => document.querySelector('table[data-result="ladder"] thead th')?.textContent === 'Volatility');

  await page.click('#solve-card summary');
  await page.selectOption('#solve-for', 'volatility');
  await page.fill('[data-path="solve.target_premium"]', '3.5');
  const vol = Number(
    await until(
      page,
      () =>
        !('computing' in document.body.dataset) &&
        document.querySelector('[data-result="solve-solution"]')?.dataset.value,
    ),
  );
  assert.ok(vol > 0.31 && vol < 0.6, `solved volatility ${vol}`); // a dearer put needs a higher volatility
  await page.click('#solve-output button');
  await until(
    page,
    () =>
      !('computing' in document.body.dataset) &&
      document.querySelector('[data-path="market.volatility"]').value !== '31',
  );
  const premium = await premiumShown(page);
  assert.ok(Math.abs(premium - 3.5) < 1e-4, `premium after using the solved volatility: ${premium}`);
  await page.close();
});

test('on a phone and a tablet no card cuts off its figures (wide tables scroll inside the card)', async () => {
  const page = await open();
  await page.evaluate(() => {
    for (const d of document.querySelectorAll('details.card')) d.open = true;
  });
  for (const width of [360, 768]) {
    await page.setViewportSize({ width, height: 800 });
    await until(
      page,
      () => document.querySelector('table[data-result="ladder"] tbody tr') && !('computing' in document.body.dataset),
    );
    const cut = await page.evaluate(() => {
      const out = [];
      for (const card of document.querySelectorAll('.card:not([hidden])')) {
        card.scrollIntoView(); // cards off screen may skip layout (content-visibility)
        const edge = card.getBoundingClientRect().right;
        for (const el of card.querySelectorAll('*')) {
          const box = el.getBoundingClientRect();
          if (box.width === 0 || box.right <= edge + 1) continue;
          let scrolls = false;
          for (let p = el.parentElement; p && p !== card && !scrolls; p = p.parentElement)
            scrolls = ['auto', 'scroll'].includes(getComputedStyle(p).overflowX);
          if (!scrolls)
            out.push(
              `${card.dataset.panel}: <${el.tagName.toLowerCase()}> ends at ${Math.round(box.right)}, card at ${Math.round(edge)}`,
            );
        }
      }
      return out.slice(0, 5);
    });
    assert.deepEqual(cut, [], `at ${width} px wide`);
    assert.equal(
      await page.evaluate(() => document.documentElement.scrollWidth),
      width,
      `the page scrolls sideways at ${width} px`,
    );
  }
  await page.close();
});

test('after an edit, cards out of the window are asked for once the price is drawn, cards in it at once; all update', async () => {
  // Four legs on a smile with three curves: at 1280 x 900 every card is below the terms form.
  const page = await context.newPage();
  await page.addInitScript(() => {
    window.__order = []; // in the order they happened: ['premium'] when it changed, ['post', command]
    const Base = window.Worker;
    window.Worker = class extends Base {
      postMessage(message, ...rest) {
        if (message?.command) window.__order.push(['post', message.command]);
        return super.postMessage(message, ...rest);
      }
    };
    new MutationObserver((records) => {
      if (records.some((r) => r.target.dataset?.result === 'premium')) window.__order.push(['premium']);
    }).observe(document, {
      subtree: true,
      attributes: true,
      attributeFilter: ['data-value'],
    });
  });
  await page.goto(linkTo(readFileSync(join(root, 'bench/trades/four-legs-smile.json'), 'utf8')));
  await premiumShown(page);
  await until(page, () => document.body.classList.contains('ready') && !('computing' in document.body.dataset));
  const cardText = () =>
    page.evaluate(() =>
      ['profile', 'hedge'].map((p) => document.querySelector(`.card[data-panel="${p}"]`).textContent),
    );
  const edit = async (spot) => {
    await page.evaluate(() => (window.__order = []));
    const before = await cardText();
    await page.fill('[data-path="market.spot"]', spot);
    await until(page, () => !('computing' in document.body.dataset) && window.__order.some(([e]) => e === 'premium'));
    const after = await cardText();
    assert.notEqual(after[0], before[0], 'the profile card was not drawn again');
    assert.notEqual(after[1], before[1], 'the hedge card was not drawn again');
    return page.evaluate(() => window.__order.map((e) => e.join(' ')));
  };
  const below = await page.evaluate(
    () => document.querySelector('.card[data-panel="profile"]').getBoundingClientRect().top,
  );
  assert.ok(below > 900, `the profile card is at ${below} px, in the window`);
  let order = await edit('101');
  assert.equal(order[0], 'post price');
  const shown = order.indexOf('premium');
  for (const command of ['profile', 'hedge'])
    assert.ok(order.indexOf(`post ${command}`) > shown, `${command} asked for before the price was drawn: ${order}`);
  // the profile card in the window: its call goes out with the price's
  // (once an observer of the test's own has seen it in the window, a turn later: the page's
  // observer, made first, is told in the same rendering step)
  await page.evaluate(
    () =>
      new Promise((resolve) => {
        const card = document.querySelector('.card[data-panel="profile"]');
        const observer = new IntersectionObserver((entries) => {
          if (!entries.some((e) => e.isIntersecting)) return;
          observer.disconnect();
          setTimeout(resolve, 0);
        });
        observer.observe(card);
        card.scrollIntoView();
      }),
  );
  order = await edit('102');
  assert.ok(order.indexOf('post profile') < order.indexOf('premium'), `profile waited for the price: ${order}`);
  await page.close();
});

test('nothing but the page was requested and the console stayed clean', () => {
  assert.ok(requests.some((url) => url.startsWith(pageUrl)));
  assert.deepEqual(problems, []);
});
