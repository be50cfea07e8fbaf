// Browser tests: work on the page is never lost (the built page from file://, Chromium, offline).
// Tabs and saved copies keep their own work and a list of recent work brings any of it back; a
// #trade= link stays in the address until the trade is edited; a damaged link changes nothing;
// the last good figures survive a reload, marked; the storage warning names the real button; a
// linked trade without a side shows the client buying; the notice line can be dismissed.
import assert from 'node:assert/strict';
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { after, before, test } from 'node:test';
import { fileURLToPath, pathToFileURL } from 'node:url';

import {
  chromiumForFile,
  exampleTrade,
  linkToPage,
  offlineContext,
  openPage,
  pasteInPage,
  savedTrade,
  settled,
  until,
} from './harness.mjs';

const example = exampleTrade();
const withStrike = (strike, extra = {}) =>
  JSON.stringify({ ...example, option: { ...example.option, strike }, ...extra });
const strikeOf = (page) => page.inputValue('[data-path="option.strike"]');

const run = chromiumForFile(before, after);

/** A fresh browser profile (its own storage), offline. */
const freshContext = async () => offlineContext(await run.ready());

async function typeStrike(page, value) {
  await page.fill('[data-path="option.strike"]', value);
  await settled(page);
}

test('two tabs and a saved page copy each keep their own trade; recent work brings any back', async () => {
  const context = await freshContext();
  const problems = [];
  const first = await openPage(context, undefined, problems);
  await typeStrike(first, '44');

  // A second tab opens a link and edits it; a third opens a saved copy of the page and edits that.
  const second = await openPage(context, linkToPage(withStrike(47)), problems);
  await second.fill('[data-path="quote.client"]', 'Fernhill Orchards');
  await settled(second);
  const [download] = await Promise.all([second.waitForEvent('download'), second.click('#action-copy-page')]);
  const copyPath = join(mkdtempSync(join(tmpdir(), 'hedgeleaf-')), 'copy.html'); // a page file needs its .html
  await download.saveAs(copyPath);
  const third = await openPage(context, pathToFileURL(copyPath).href, problems);
  assert.equal(await strikeOf(third), '47', 'the copy opens with its own trade');
  await typeStrike(third, '49');

  await first.reload();
  await settled(first);
  assert.equal(await strikeOf(first), '44', 'the first tab gets its own trade back');
  await second.reload();
  await settled(second);
  assert.equal(await strikeOf(second), '47');
  assert.equal(await second.inputValue('[data-path="quote.client"]'), 'Fernhill Orchards');
  await third.reload();
  await settled(third);
  assert.equal(await strikeOf(third), '49');

  // A new tab lists all three under Recent work, newest first, each with a time and a description.
  const fourth = await openPage(context, undefined, problems);
  const entries = await fourth.evaluate(() =>
    [...document.querySelectorAll('#recent-work option')].filter((o) => o.value).map((o) => [o.value, o.text]),
  );
  assert.ok(entries.length >= 3, JSON.stringify(entries));
  assert.match(entries[0][1], /49/, 'newest first');
  for (const [, text] of entries) assert.match(text, /\d\d:\d\d/, `a time in "${text}"`);
  const mine = entries.find(([, text]) => /strike 44\b/.test(text));
  assert.ok(mine, `the first tab's trade is listed: ${JSON.stringify(entries)}`);
  await fourth.selectOption('#recent-work', mine[0]);
  await until(fourth, () => document.querySelector('[data-path="option.strike"]').value === '44');
  await settled(fourth);
  assert.deepEqual(problems, []);
  await context.close();
});

test('a trade opened from a link stays in the address, and on reload, until it is edited', async () => {
  const context = await freshContext();
  const page = await openPage(context, linkToPage(withStrike(44)));
  assert.match(page.url(), /#trade=/, 'the address keeps the link');
  await page.reload();
  await settled(page);
  assert.equal(await strikeOf(page), '44');
  assert.match(page.url(), /#trade=/);
  await typeStrike(page, '45');
  assert.doesNotMatch(page.url(), /#trade=/, 'an edited trade is no longer the link');
  await page.reload();
  await settled(page);
  assert.equal(await strikeOf(page), '45', 'the edit is kept');
  await context.close();
});

test('a half-typed trade sent by link or saved to a file reopens as typed, the engine’s message beside the field', async () => {
  // Nothing typed is lost in any link or saved copy: a trade with one input still to mend (a
  // quantity of -3, a spot typed as text) opens with that input as typed and its message beside
  // it, not as another trade. A document that is no trade, or a choice no list holds, is still refused.
  const context = await freshContext();
  const problems = [];
  const draft = JSON.parse(withStrike(44));
  draft.quantity = -3;
  const page = await openPage(context, linkToPage(JSON.stringify(draft)), problems);
  assert.equal(await page.inputValue('[data-path="quantity"]'), '-3');
  assert.equal(await strikeOf(page), '44');
  await until(page, () => document.querySelector('[data-error="quantity"].shown')?.textContent);
  assert.equal(await page.textContent('[data-error="quantity"].shown'), 'Quantity must be above 0, got −3');
  assert.match(await page.textContent('#notice'), /Opened the trade from the link; it still has an input to mend/);

  // Text in two number fields, opened from a link: the page's own words beside each (the first
  // price is asked for before the form holds them, and the engine names only its first refusal).
  const texts = JSON.parse(withStrike(45));
  texts.market.spot = 'abc';
  texts.market.dividends[0].amount = 'x1';
  const second = await openPage(context, linkToPage(JSON.stringify(texts)), problems);
  await until(second, () => document.querySelectorAll('.field-error.shown').length === 2);
  assert.deepEqual(
    await second.evaluate(() => [...document.querySelectorAll('.field-error.shown')].map((n) => n.textContent)),
    ['Spot is not a number (“abc”)', 'Dividend 1 cash per share is not a number (“x1”)'],
  );
  await second.close();

  const typed = JSON.parse(withStrike(46));
  typed.market.spot = 'abc';
  await page.setInputFiles('#import-file', {
    name: 'half-typed.json',
    mimeType: 'application/json',
    buffer: Buffer.from(JSON.stringify(typed)),
  });
  await until(page, () => document.querySelector('[data-path="market.spot"]').value === 'abc');
  assert.equal(await strikeOf(page), '46');
  await until(page, () => document.querySelector('[data-error="market.spot"].shown')?.textContent);
  assert.match(await page.textContent('#notice'), /Opened “half-typed\.json”; it still has an input to mend/);

  const foreign = JSON.parse(withStrike(47));
  foreign.option.type = 'straddle'; // a choice the form's list does not hold: refused as before
  await page.setInputFiles('#import-file', {
    name: 'foreign.json',
    mimeType: 'application/json',
    buffer: Buffer.from(JSON.stringify(foreign)),
  });
  await page.locator('#notice').filter({ hasText: 'was not opened' }).waitFor();
  assert.equal(await strikeOf(page), '46', 'the current trade is unchanged');
  assert.deepEqual(problems, []);
  await context.close();
});

test('a damaged #trade= typed into the address of the open page changes nothing and saves nothing', async () => {
  const context = await freshContext();
  const problems = [];
  const page = await openPage(context, linkToPage(withStrike(44)), problems);
  await typeStrike(page, '45');
  const premium = await page.getAttribute('[data-result="premium"]', 'data-value');
  const damaged = ['null', '"a string"', '[1, 2]', '{"market": {"spot": -1}}', '{"market": '];
  for (const text of damaged) {
    await page.evaluate(() => {
      document.getElementById('notice').hidden = true;
    });
    await page.evaluate(
      (hash) => {
        location.hash = hash;
      },
      `trade=${Buffer.from(text).toString('base64url')}`,
    );
    await until(page, () => !document.getElementById('notice').hidden);
    assert.match(await page.textContent('#notice'), /link.*(not opened|could not be read)/i, text);
    assert.match(await page.textContent('#notice'), /current trade is unchanged/i, text);
    assert.equal(await strikeOf(page), '45', text);
    await typeStrike(page, '45.5'); // typing still works
    await typeStrike(page, '45');
    assert.equal(await page.getAttribute('[data-result="premium"]', 'data-value'), premium, text);
  }
  await page.reload();
  await settled(page);
  assert.equal(await strikeOf(page), '45', 'the good trade survives a reload');
  assert.deepEqual(problems, []);
  await context.close();
});

test('after a reload with a refused field the last good figures are back, marked as such', async () => {
  const context = await freshContext();
  const page = await openPage(context, linkToPage());
  const premium = await page.textContent('[data-result="premium"]');
  const evens = await page.textContent('[data-result="break-even"]');
  await page.fill('[data-path="market.volatility"]', '-20');
  await settled(page);
  await page.reload();
  await settled(page);
  assert.equal(await page.inputValue('[data-path="market.volatility"]'), '-20');
  assert.match(await page.textContent('[data-error="market.volatility"]'), /\S/, 'the refusal is shown');
  assert.equal(await page.textContent('[data-result="premium"]'), premium, 'the last good premium is back');
  assert.equal(await page.textContent('[data-result="break-even"]'), evens);
  const headline = await page.evaluate(() => {
    const card = document.querySelector('.headline');
    return { classes: card.className, note: getComputedStyle(card, '::before').content };
  });
  assert.match(headline.classes, /\bstale\b/);
  assert.match(headline.note, /last good/i);
  assert.match(headline.note, /reload/i, 'marked as kept from before the reload');
  await context.close();
});

test('a full store: the warning names the Save file button', async () => {
  const context = await freshContext();
  const page = await openPage(context);
  await page.evaluate(() => {
    for (const store of [localStorage, sessionStorage]) {
      let chunk = 'x'.repeat(1 << 20);
      for (let n = 0; chunk.length > 0;) {
        try {
          store.setItem(`filler-${n}`, chunk);
          n += 1;
        } catch {
          chunk = chunk.slice(0, chunk.length >> 1);
        }
      }
    }
  });
  await page.fill('[data-path="quote.client"]', 'Larkspur Ceramics');
  await until(page, () => document.getElementById('notice').dataset.kind === 'warning');
  const text = await page.textContent('#notice');
  assert.match(text, /full/);
  assert.match(text, /Save file/);
  assert.doesNotMatch(text, /Export/);
  assert.equal(await page.textContent('#action-export'), 'Save file', 'the button it names is there');
  await context.close();
});

test('a linked trade without a side shows the client buying', async () => {
  const context = await freshContext();
  const { side, ...noSide } = example;
  assert.equal(side, 'buy');
  const page = await openPage(context, linkToPage(JSON.stringify(noSide)));
  assert.equal(await page.isChecked('input[name="side"][value="buy"]'), true);
  assert.equal(await page.isChecked('input[name="side"][value="sell"]'), false);
  await context.close();
});

test('the notice line can be dismissed, and the link notice goes once the trade is edited', async () => {
  const context = await freshContext();
  const page = await openPage(context, linkToPage());
  const notice = page.locator('#notice');
  assert.ok(await notice.isVisible());
  assert.match(await notice.textContent(), /link/);
  await page.click('#notice button[aria-label="Dismiss"]');
  assert.equal(await notice.isVisible(), false);
  await page.reload();
  await settled(page);
  assert.ok(await notice.isVisible());
  await typeStrike(page, '45');
  assert.equal(await notice.isVisible(), false, 'gone after an edit');
  await context.close();
});

// ---- The market editor (issue 14): a smile grid and curves typed, pasted and kept; a snapshot.
const axeSource = readFileSync(
  join(dirname(fileURLToPath(import.meta.url)), '../../web/node_modules/axe-core/axe.min.js'),
  'utf8',
);
// A collar on 100 for six months: put 90, call 110, valued 2026-12-01 (one volatility and one rate).
const collar = { valuation_date: '2026-12-01', market: { spot: 100, volatility: 0.25, rate: 0.03 } };
Object.assign(collar, {
  structure: { shape: 'collar', strikes: [90, 110], expiry_date: '2027-06-01' },
  quantity: 1000,
});
// Copied from a spreadsheet in a decimal-comma locale: tabs between cells, "30,5" for 30.5 %.
const pastedGrid = [
  'expiry\t80\t90\t100\t110\t120',
  '3m\t30,5\t27,2\t24\t22,1\t21,5',
  '6m\t29,8\t26,9\t24,2\t22,6\t22',
  '1y\t29\t26,5\t24,5\t23\t22,6',
].join('\n');

/** Paste `text` into the input at `selector` as a spreadsheet's copy arrives (a paste event with text/plain). */
function paste(page, selector, text) {
  return page.evaluate(pasteInPage, [selector, text]);
}

const legMarket = (page) =>
  page.$$eval('#leg-market-table tbody tr', (rows) => rows.map((r) => [...r.cells].map((c) => c.textContent)));
const cell = (i, j) => `[data-path="market.volatility.vols[${i}][${j}]"]`;

test('market editor: a pasted grid with decimal commas prices each leg at its own volatility, errors sit beside the cell, and the whole market is saved, linked and reopened', async () => {
  const context = await freshContext();
  const page = await openPage(context, linkToPage(JSON.stringify(collar)));
  assert.equal(await page.isVisible('.vol-grid'), false, 'one volatility until the grid is opened');
  await page.click('#smile-open');
  await settled(page);
  assert.equal(await page.inputValue(cell(0, 0)), '25', 'the grid starts flat at the volatility typed, in percent');
  await paste(page, cell(0, 0), pastedGrid);
  await settled(page);
  assert.equal(await page.inputValue(cell(0, 0)), '30.5');
  assert.equal(await page.inputValue('[data-path="market.volatility.expiries[2]"]'), '1y');
  assert.equal(await page.inputValue('[data-path="market.volatility.strikes[4]"]'), '120');
  // The collar's legs expire on the 6m row's date (2027-06-01: six calendar months on, a business
  // day), at the grid's strikes 90 and 110: each leg takes that cell's volatility exactly (a grid
  // point is its own quote; docs/market.md).
  const legs = await legMarket(page);
  assert.equal(legs.length, 2);
  assert.equal(legs[0][3], '26.90 %', 'the put at 90 % of spot: row 2, column 2');
  assert.equal(legs[1][3], '22.60 %', 'the call at 110 % of spot: row 2, column 4');
  assert.match(await page.textContent('#smile-chart .chart-legend'), /3m.*6m.*1y/);
  assert.match(
    await page.textContent('#cautions-screen'),
    /volatility smile and the rate, yield and borrow curves given/,
  );

  // A 6m volatility of 10 % at 100 between 26.9 % at 90 and 22.6 % at 110: the call at 100 would be
  // worth less than the call at 90 less the discounted strike gap (butterfly arbitrage).
  await page.fill(cell(1, 2), '10');
  await settled(page);
  const beside = await page.textContent(`[data-error="market.volatility.vols[1][2]"]`);
  assert.match(beside, /^Volatility, row 2, column 3: /);
  assert.match(beside, /butterfly arbitrage/);
  assert.match(beside, /\(row 2, column 2\)/, 'the other cell named from 1 as on screen');
  assert.match(beside, /raise this volatility to at least [\d.]+ %/, 'the fix in percent, as the grid shows it');
  assert.equal(await page.getAttribute(cell(1, 2), 'aria-invalid'), 'true');
  await page.reload();
  await settled(page);
  assert.equal(await page.inputValue(cell(1, 2)), '10', 'the refused cell survives a reload');
  assert.match(await page.textContent(`[data-error="market.volatility.vols[1][2]"]`), /row 2, column 3/);
  await page.fill(cell(1, 2), '24.2');
  await page.fill(cell(0, 0), '600'); // an absurd volatility: the engine's bound, in percent on screen
  await settled(page);
  assert.equal(
    await page.textContent(`[data-error="market.volatility.vols[0][0]"]`),
    'Volatility, row 1, column 1 must be at most 500 %, got 600 %',
  );
  await page.fill(cell(0, 0), '30.5');
  await settled(page);

  // The rate as a curve, pasted as tenor and rate.
  await page.click('#rate-curve-open');
  await paste(page, '[data-curve="rate"] input', 'tenor\trate\n3m\t2,9\n1y\t3,1\n2y\t3,3');
  await settled(page);
  assert.equal(await page.inputValue('[data-base="market.rate.points[1]"]'), '1y');
  assert.equal(await page.inputValue('[data-path="market.rate.points[1].rate"]'), '3.1');
  // r(t)·t linear between points (flat forwards, docs/market.md): 3m = 2027-03-01 is 90 days,
  // 1y = 2027-12-01 is 365 days, the legs' expiry 182 days (ACT/365F); the average rate to it is
  // (0.029·90/365 + 0.0311... ) worked here: [0.029·90 + (0.031·365 − 0.029·90)·(182 − 90)/(365 − 90)] / 182.
  const average = (0.029 * 90 + (0.031 * 365 - 0.029 * 90) * ((182 - 90) / (365 - 90))) / 182;
  assert.equal((await legMarket(page))[0][4], `${(100 * average).toFixed(2)} %`);

  const { trade } = await savedTrade(page);
  assert.deepEqual(trade.market.volatility.expiries, ['3m', '6m', '1y']);
  assert.deepEqual(trade.market.volatility.strikes, [80, 90, 100, 110, 120]);
  assert.deepEqual(trade.market.volatility.vols[0], [0.305, 0.272, 0.24, 0.221, 0.215], 'decimals in the file');
  assert.deepEqual(trade.market.rate, {
    points: [
      { tenor: '3m', rate: 0.029 },
      { tenor: '1y', rate: 0.031 },
      { tenor: '2y', rate: 0.033 },
    ],
  });
  const [copy] = await Promise.all([page.waitForEvent('download'), page.click('#action-copy-page')]);
  const embedded = /<script type="application\/json" id="embedded-trade">([\s\S]*?)<\/script>/.exec(
    readFileSync(await copy.path(), 'utf8'),
  );
  assert.deepEqual(JSON.parse(embedded[1]).market, trade.market, 'the page copy carries the whole market');
  await page.evaluate(() => {
    // keep what Copy link puts on the clipboard (or, where the clipboard is refused, in the address)
    if (navigator.clipboard) navigator.clipboard.writeText = async (text) => void (window.__copied = text);
  });
  await page.click('#action-link');
  const link = await until(page, () => window.__copied ?? (location.hash.startsWith('#trade=') ? location.href : null));
  const reopened = await openPage(await freshContext(), link);
  assert.equal(await reopened.inputValue(cell(2, 4)), '22.6', 'the link carries the whole grid');
  assert.equal(await reopened.inputValue('[data-path="market.rate.points[2].rate"]'), '3.3');
  assert.equal((await legMarket(reopened))[0][3], '26.90 %');

  // Back to one volatility keeps the grid aside in this tab, through a reload, until it is opened again.
  await page.click('text=Back to one volatility');
  await settled(page);
  assert.equal(await page.isVisible('.vol-grid'), false);
  await page.reload();
  await settled(page);
  await page.click('#smile-open');
  await settled(page);
  assert.equal(await page.inputValue(cell(0, 0)), '30.5', 'the grid typed is back');

  // axe-core: no serious or critical finding with the grid and a curve open.
  await page.evaluate(axeSource);
  const findings = await page.evaluate(async () => {
    const result = await window.axe.run(document, { resultTypes: ['violations'] });
    return result.violations
      .filter((v) => v.impact === 'serious' || v.impact === 'critical')
      .map((v) => `${v.id}: ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`);
  });
  assert.deepEqual(findings, []);
  await context.close();
});

test('market snapshot: pasted once, priced in, its as_of on the result and the sheet, a warning past the age limit (remembered)', async () => {
  const context = await freshContext();
  const page = await openPage(context, linkToPage(JSON.stringify(collar)));
  const snapshot = {
    as_of: '2026-11-30T16:30:00Z',
    underlying: 'Quillmoor Textiles',
    spot: 102,
    volatility: 0.24,
    rate: { points: [{ tenor: '6m', rate: 0.031 }] },
    borrow: 0.004,
  };
  await page.click('#market-more summary');
  // a file without its as_of is not a snapshot: refused, the trade's own market stays
  const { as_of: _asOf, ...noTime } = snapshot;
  const file = { name: 'market.json', mimeType: 'application/json', buffer: Buffer.from(JSON.stringify(noTime)) };
  await page.setInputFiles('#snapshot-file', file);
  await until(page, () => /was not used/.test(document.getElementById('notice').textContent));
  assert.match(await page.textContent('#notice'), /market\.json was not used: .*as_of/);
  assert.equal(await page.inputValue('[data-path="market.spot"]'), '100');
  await page.fill('#snapshot-text', JSON.stringify(snapshot));
  await page.click('#snapshot-use');
  await until(page, () => document.querySelector('[data-path="market.spot"]').value === '102');
  await settled(page);
  assert.match(await page.textContent('#market-age-text'), /Market as of 2026-11-30T16:30:00Z \(Quillmoor Textiles\)/);
  assert.match(await page.textContent('#leg-market-as-of'), /2026-11-30T16:30:00Z/, 'the result states the as_of');
  assert.match(await page.textContent('[data-sheet="market-as-of"]'), /2026-11-30T16:30:00Z/, 'so does the sheet');
  assert.equal(await page.inputValue('[data-path="market.borrow"]'), '0.4');
  assert.equal((await legMarket(page))[0][6], '0.40 %');
  const stale = await page.textContent('#market-stale');
  assert.match(stale, /older than your limit of 24 h/, 'more than a day old (the test runs after 2026-12-01)');
  assert.equal(await page.getAttribute('#market-stale', 'aria-live'), 'polite');
  // a limit that is no number of hours is said beside the field; the last good one applies
  await page.fill('#market-age-limit', 'abc');
  assert.equal(
    await page.textContent('#market-age-limit-error.shown'),
    'The age limit must be a number of hours above 0, got “abc”; the last one, 24 h, applies.',
  );
  assert.equal(await page.getAttribute('#market-age-limit', 'aria-invalid'), 'true');
  assert.match(await page.textContent('#market-stale'), /older than your limit of 24 h/);
  await page.fill('#market-age-limit', '100000');
  assert.equal(await page.textContent('#market-stale'), '');
  assert.equal(await page.isVisible('#market-age-limit-error'), false);
  await page.reload();
  await settled(page);
  assert.equal(await page.inputValue('#market-age-limit'), '100,000', 'the limit is remembered');
  assert.equal(await page.textContent('#market-stale'), '');
  // Another trade with its own market keeps it, and is offered the snapshot kept in this browser.
  const other = await openPage(context, linkToPage(JSON.stringify(collar)));
  assert.equal(await other.inputValue('[data-path="market.spot"]'), '100', 'the trade’s own market wins');
  await other.click('#market-more summary');
  await other.click('#snapshot-again');
  await until(other, () => document.querySelector('[data-path="market.spot"]').value === '102');
  await other.close();
  // New starts in the snapshot: every trade on the page uses it.
  await page.click('#action-new');
  await settled(page);
  assert.equal(await page.inputValue('[data-path="market.spot"]'), '102');
  assert.match(await page.textContent('#market-age-text'), /2026-11-30T16:30:00Z/);
  await context.close();
});
