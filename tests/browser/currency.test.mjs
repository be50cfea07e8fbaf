// Browser test: a currency pair on the page (the built page from file://, Chromium, offline):
// examples/currency-receivable-put.json opens with the pair's fields and words, shows the
// forward points and the premium in the chosen convention, prints them with the pair's dates on
// the client sheet (and no word of shares or dividends), and keeps every convention through
// Save file and a link; axe-core finds nothing serious with the pair's fields open.
import assert from 'node:assert/strict';
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { after, before, test } from 'node:test';
import { fileURLToPath } from 'node:url';

import { chromiumForFile, linkToPage, offlineContext, openPage, savedTrade, settled, until } from './harness.mjs';

const root = join(dirname(fileURLToPath(import.meta.url)), '../..');
const exampleText = readFileSync(join(root, 'examples/currency-receivable-put.json'), 'utf8');
const axeSource = readFileSync(join(root, 'web/node_modules/axe-core/axe.min.js'), 'utf8');
const run = chromiumForFile(before, after);

/** The client sheet as printed to PDF and read back by pdftotext (poppler-utils), spaces folded. */
async function printedSheet(page) {
  await page.emulateMedia({ media: 'print' });
  await page.evaluate(() => window.dispatchEvent(new Event('beforeprint')));
  const path = join(mkdtempSync(join(tmpdir(), 'hedgeleaf-pair-')), 'sheet.pdf');
  writeFileSync(path, await page.pdf({ format: 'A4' }));
  await page.emulateMedia({ media: 'screen' });
  return execFileSync('pdftotext', ['-layout', path, '-'], { encoding: 'utf8' }).replace(/[ \t]+/g, ' ');
}

// Covered interest parity with money-market deposits (common practice; docs/currency.md "Rates as
// quoted"): F = S (1 + r_d d/360) / (1 + r_f d/360) over the d = 274 days from the spot date
// 2026-12-07 (Thursday 3 December + 2 business days) to the delivery date 2027-09-07 (Friday
// 3 September + 2 business days); points = (F - S) / 0.0001.
const days = 274;
const forward = (1.085 * (1 + (0.03 * days) / 360)) / (1 + (0.015 * days) / 360);
const forwardPoints = (forward - 1.085) / 0.0001;
// the same with the domestic deposit quoted ACT/365 (the sheet is printed after that change)
const pointsAct365 = ((1.085 * (1 + (0.03 * days) / 365)) / (1 + (0.015 * days) / 360) - 1.085) / 0.0001;

test('a currency pair: its fields, forward points, premium as quoted, client sheet, saved and reopened', async () => {
  const context = await offlineContext(await run.ready());
  const problems = [];
  const page = await openPage(context, linkToPage(exampleText), problems);

  // The pair's fields, in the pair's words; the share's fields are not shown.
  assert.equal(await page.inputValue('#underlying-kind'), 'currency_pair');
  assert.equal(await page.inputValue('[data-path="underlying.base"]'), 'EUR');
  assert.equal(await page.inputValue('#domestic_rate-input'), '3');
  assert.equal(await page.inputValue('#foreign_rate-input'), '1.5');
  assert.equal(await page.inputValue('#domestic_rate-basis'), 'ACT/360 simple');
  assert.equal(await page.inputValue('#premium-convention'), 'domestic_pips');
  assert.equal(await page.inputValue('[data-path="notional.amount"]'), '5,000,000');
  for (const hidden of ['#carry_yield-field', '#rate-field', '#dividends', '[data-path="quantity"]'])
    assert.equal(await page.locator(hidden).isVisible(), false, `${hidden} is not shown for a pair`);
  const terms = await page.locator('#terms').innerText();
  assert.doesNotMatch(terms, /dividend|shares/i, 'the terms form speaks of the pair');
  assert.match(await page.locator('#results').innerText(), /Foreign, EUR \(Δ\)/);

  // The forward points (to the hundredth of a pip) and the premium in the chosen convention.
  assert.equal(await page.textContent('#pair-forward-points'), `${forwardPoints.toFixed(2)} pips (pip 0.0001)`);
  // the dates: Thursday 3 December 2026 + 2 business days; Friday 3 September 2027 + 2 (common practice)
  const dateLine = await page.textContent('#pair-date-line');
  for (const date of ['spot 12/07/2026', 'expiry 09/03/2027', 'delivery 09/07/2027', 'premium 12/07/2026'])
    assert.ok(dateLine.includes(date), `${date} in "${dateLine}" (the browser's en-US dates)`);
  assert.match(await page.locator('#pair-figures').innerText(), /Position delta \(EUR\)/);
  assert.match(await page.textContent('#pair-forward'), new RegExp(`^${forward.toFixed(6)} USD per EUR`));
  assert.match(await page.textContent('#pair-premium'), /^\d+\.\d\d USD pips per EUR$/);
  assert.match(await page.textContent('#pair-delta-position'), /^−1,46\d,\d{3} EUR$/);

  // Another convention, the forward delta and the domestic rate quoted ACT/365: written into the trade.
  await page.selectOption('#premium-convention', 'percent_of_foreign');
  await page.selectOption('#delta-convention', 'forward');
  await page.selectOption('#domestic_rate-basis', 'ACT/365 simple');
  await settled(page);
  assert.match(await page.textContent('#pair-premium'), /^1\.\d{4} % of the EUR notional$/);
  assert.match(await page.textContent('#pair-delta'), /\(forward delta\)$/);

  // axe-core with the pair's fields and its folded conventions open.
  await page.click('#pair-more summary');
  await page.evaluate(axeSource);
  const findings = await page.evaluate(async () => {
    const r = await window.axe.run(document, { resultTypes: ['violations'] });
    return r.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical').map((v) => v.id);
  });
  assert.deepEqual(findings, [], 'axe-core: no serious or critical violation with the pair open');

  // The client sheet: the pair, its dates and the price as quoted; no shares, no dividends.
  const sheet = await printedSheet(page);
  assert.match(sheet, /EUR\/USD/);
  assert.match(sheet, /\bEuropean\b/, 'the exercise style as a name (it was "european")');
  // the sensitivities' delta is the plain spot delta: said so beside the pair's own convention
  assert.equal(await page.textContent('th:has(+ [data-result="delta"])'), 'Delta (spot, not premium-adjusted)');
  for (const date of ['Spot date 12/07/2026', 'Expiry date 09/03/2027', 'Delivery date 09/07/2027'])
    assert.match(sheet, new RegExp(date), `${date} on the sheet`);
  assert.match(sheet, /Client price, as quoted 1\.\d{4} % of the EUR/);
  assert.match(sheet, new RegExp(`Forward points ${pointsAct365.toFixed(2)}`));
  assert.match(sheet, /Indicative only/);
  assert.doesNotMatch(sheet, /shares|dividend/i);

  // Save file keeps every convention as the engine reads it; a link to the saved trade reopens it.
  const { trade } = await savedTrade(page);
  assert.deepEqual(trade.conventions, { premium: 'percent_of_foreign', premium_currency: 'USD', delta: 'forward' });
  assert.deepEqual(trade.market.domestic_rate, { rate: 0.03, day_count: 'ACT/365', compounding: 'simple' });
  assert.deepEqual(trade.market.foreign_rate, { rate: 0.015, day_count: 'ACT/360', compounding: 'simple' });
  assert.deepEqual(trade.notional, { amount: 5000000, currency: 'EUR' });
  assert.deepEqual(trade.underlying, { kind: 'currency_pair', base: 'EUR', quote: 'USD' });
  const again = await openPage(context, linkToPage(JSON.stringify(trade)), problems);
  assert.equal(await again.inputValue('#premium-convention'), 'percent_of_foreign');
  assert.equal(await again.inputValue('#delta-convention'), 'forward');
  assert.equal(await again.inputValue('#domestic_rate-basis'), 'ACT/365 simple');
  assert.match(await again.textContent('#pair-premium'), /% of the EUR notional$/);

  // To a share and back: the pair's conventions and quotes come back as they were.
  await again.selectOption('#underlying-kind', 'equity');
  await settled(again);
  assert.equal(await again.locator('#carry_yield-field').isVisible(), true);
  await again.selectOption('#underlying-kind', 'currency_pair');
  await settled(again);
  await until(again, () => document.querySelector('#premium-convention').value === 'percent_of_foreign');
  const back = (await savedTrade(again)).trade;
  assert.deepEqual(back.conventions, trade.conventions);
  assert.deepEqual(back.notional, trade.notional);
  assert.deepEqual(back.market.domestic_rate, trade.market.domestic_rate, 'the quote comes back with its day count');
  assert.deepEqual(problems, []);
  await context.close();
});

/** The engine's (CLI's) premium per unit for a trade document, the reference the page must show. */
function cliPremium(doc) {
  const out = execFileSync(join(root, 'build/native/hedgeleaf'), ['price', '-'], { input: JSON.stringify(doc) });
  return JSON.parse(out).premium;
}

test('strikes written as a delta or a percent open as written, price as the CLI, and are typed back', async () => {
  // A risk reversal struck by 25 delta (docs/currency.md): the strike fields showed
  // "[object Object]" and the trade could not be priced again after an edit.
  const context = await offlineContext(await run.ready());
  const problems = [];
  const rr = JSON.parse(exampleText);
  delete rr.option;
  rr.structure = { shape: 'risk-reversal', strikes: [{ delta: -0.25 }, { delta: 0.25 }], expiry_date: '2027-09-03' };
  rr.conventions = { premium: 'domestic_pips', delta: 'spot' };
  const page = await openPage(context, linkToPage(JSON.stringify(rr)), problems);
  const strikes = '[data-path^="structure.strikes["]';
  assert.deepEqual(await page.locator(strikes).evaluateAll((nodes) => nodes.map((n) => n.value)), [
    '-25 delta',
    '25 delta',
  ]);
  const premium = () => page.getAttribute('[data-result="premium"]', 'data-value').then(Number);
  assert.ok(Math.abs((await premium()) - cliPremium(rr)) < 1e-12, 'the page prices the deltas as the CLI');
  // an edit elsewhere prices again, the deltas kept
  await page.fill('[data-path="market.spot"]', '1.09');
  await settled(page);
  rr.market.spot = 1.09;
  assert.ok(Math.abs((await premium()) - cliPremium(rr)) < 1e-12, 'priced again after an edit');
  // typed forms: a percent of the forward and of spot, a delta; a word is refused beside the field
  await page.fill('[data-path="structure.strikes[0]"]', '97 % fwd');
  await page.fill('[data-path="structure.strikes[1]"]', '10 delta');
  await settled(page);
  const { trade } = await savedTrade(page);
  assert.deepEqual(trade.structure.strikes, [{ percent_of_forward: 97 }, { delta: 0.1 }]);
  assert.ok(Math.abs((await premium()) - cliPremium(trade)) < 1e-12);
  await page.fill('[data-path="structure.strikes[0]"]', 'atm');
  await settled(page);
  const error = await page.textContent('[data-error="structure.strikes[0]"]');
  assert.match(error, /is not a strike: write a price \(105\), a percent of spot \(95 % spot\)/);
  // a single option's strike too (an equity trade, 95 % of spot)
  const put = JSON.parse(readFileSync(join(root, 'examples/american-put.json'), 'utf8'));
  put.option.strike = { percent_of_spot: 95 };
  const single = await openPage(context, linkToPage(JSON.stringify(put)), problems);
  assert.equal(await single.inputValue('[data-path="option.strike"]'), '95 % spot');
  const singlePremium = Number(await single.getAttribute('[data-result="premium"]', 'data-value'));
  assert.ok(Math.abs(singlePremium - cliPremium(put)) < 1e-12);
  assert.deepEqual(problems, []);
  await context.close();
});

test('the notional a budget buys, put into a pair trade, goes into the notional', async () => {
  // (it was written as a quantity, which a pair refuses beside a field the pair does not show)
  const context = await offlineContext(await run.ready());
  const problems = [];
  const page = await openPage(context, linkToPage(exampleText), problems);
  await page.click('#solve-card summary');
  await page.selectOption('#solve-for', 'quantity');
  await settled(page);
  const answer = await until(page, () => document.querySelector('[data-result="solve-solution"]')?.textContent);
  assert.match(answer, /^Notional, EUR, /);
  await page.click('#solve-card button[data-uses-result]');
  await settled(page);
  const { trade } = await savedTrade(page);
  assert.equal(trade.quantity, undefined);
  assert.equal(trade.notional.currency, 'EUR');
  assert.ok(trade.notional.amount > 0 && trade.notional.amount !== 5000000, `${trade.notional.amount}`);
  assert.equal(await page.locator('.headline.stale').count(), 0, 'priced, not greyed');
  assert.ok(
    Math.abs(Number(await page.getAttribute('[data-result="premium"]', 'data-value')) - cliPremium(trade)) < 1e-12,
  );
  assert.deepEqual(problems, []);
  await context.close();
});

test('a pair without a client-price currency labels its amounts in its quote currency', async () => {
  const context = await offlineContext(await run.ready());
  const problems = [];
  const unlabelled = JSON.parse(exampleText);
  delete unlabelled.quote.currency;
  const page = await openPage(context, linkToPage(JSON.stringify(unlabelled)), problems);
  const labels = await page.locator('.ccy').evaluateAll((nodes) => [...new Set(nodes.map((n) => n.textContent))]);
  assert.deepEqual(labels, ['USD'], 'the totals are USD amounts (docs/currency.md)');
  assert.deepEqual(problems, []);
  await context.close();
});

test('a trade switched to a pair before it is priced shows no other pair’s figures', async () => {
  // (after a EUR/USD trade in the tab, New and "a currency pair" showed the old pair's premium)
  const context = await offlineContext(await run.ready());
  const problems = [];
  const page = await openPage(context, linkToPage(exampleText), problems);
  assert.match(await page.textContent('#pair-premium'), /pips/);
  await page.click('#action-new');
  await settled(page);
  await page.selectOption('#underlying-kind', 'currency_pair');
  await settled(page);
  assert.equal(await page.textContent('#pair-premium'), '–');
  assert.equal(await page.textContent('#pair-name'), '–');
  await context.close();
});

test('a client who sells sees the premium with one sign on the pair’s figures and the totals', async () => {
  const context = await offlineContext(await run.ready());
  const problems = [];
  const sold = JSON.parse(exampleText);
  sold.side = 'sell';
  const page = await openPage(context, linkToPage(JSON.stringify(sold)), problems);
  const amount = await page.textContent('#pair-premium-amount');
  const total = await page.textContent('[data-result="premium-total"]');
  assert.doesNotMatch(amount, /[−-]/, amount);
  assert.doesNotMatch(total, /[−-]/, total);
  assert.deepEqual(problems, []);
  await context.close();
});

test('switching between a share and a pair keeps what was typed, through a reload and a new quantity', async () => {
  const context = await offlineContext(await run.ready());
  const problems = [];
  const share = JSON.parse(readFileSync(join(root, 'examples/american-put.json'), 'utf8'));
  const page = await openPage(context, linkToPage(JSON.stringify(share)), problems);
  await page.selectOption('#underlying-kind', 'currency_pair');
  await settled(page);
  await page.reload();
  await settled(page);
  await page.selectOption('#underlying-kind', 'equity');
  await settled(page);
  const back = (await savedTrade(page)).trade;
  assert.deepEqual(back.market.dividends, share.market.dividends, 'the dividends come back after a reload');
  // a quantity typed while a share's becomes the notional when the pair comes back
  await page.fill('[data-path="quantity"]', '2000000');
  await settled(page);
  await page.selectOption('#underlying-kind', 'currency_pair');
  await settled(page);
  assert.equal((await savedTrade(page)).trade.notional.amount, 2000000);
  await context.close();
});

test('an engine refusal that names another field says it by its name on screen', async () => {
  // (beside the expiry: "must be after valuation_date ..." where the pair's field is "Trade date")
  const context = await offlineContext(await run.ready());
  const problems = [];
  const page = await openPage(context, linkToPage(exampleText), problems);
  await page.fill('[data-path="valuation_date"] >> visible=true', '2027-12-01');
  await settled(page);
  const errors = await page.evaluate(() =>
    [...document.querySelectorAll('[data-error]')].map((n) => n.textContent).filter(Boolean),
  );
  assert.equal(errors.length, 1, errors.join(' | '));
  assert.match(errors[0], /Trade date/);
  assert.doesNotMatch(errors[0], /valuation_date/);
  await context.close();
});

test('a pair’s premium per unit is shown to a hundredth of a pip, as its pips are, on screen and on the sheet', async () => {
  // 0.014491 USD per EUR is 144.91 pips (pip 0.0001): four decimals (0.0145) would be half a pip
  // off the pips printed beside it (common practice: premiums quoted to a hundredth of a pip).
  const context = await offlineContext(await run.ready());
  const page = await openPage(context, linkToPage(exampleText));
  const premium = cliPremium(JSON.parse(exampleText));
  const text = premium.toFixed(6);
  assert.equal(await page.textContent('[data-result="premium"]'), text);
  assert.equal(await page.textContent('#pair-premium'), `${(premium / 0.0001).toFixed(2)} USD pips per EUR`);
  const cp = Number(await page.getAttribute('[data-result="client-price"]', 'data-value'));
  assert.equal(await page.textContent('[data-result="client-price"]'), `${cp.toFixed(6)} USD`);
  await page.check('#sheet-internal');
  const sheet = await printedSheet(page);
  // (the sheet's two columns wrap in the text pdftotext reads: the figures, not their lines)
  assert.match(sheet, /Model value per unit/);
  assert.ok(sheet.includes(`${text} USD`), `the model value per unit ${text} USD on the sheet`);
  assert.ok(sheet.includes(`${cp.toFixed(6)} USD`), `the client price per unit ${cp.toFixed(6)} USD on the sheet`);
  assert.ok(!sheet.includes(`${premium.toFixed(4)} USD`), 'no per-unit figure to four decimals');

  // A comparison of two such puts: per unit to a hundredth of a pip too, and its delta named as
  // the spot delta, not premium-adjusted (the pair's own convention is on the pair card).
  const lower = { ...JSON.parse(exampleText), option: { ...JSON.parse(exampleText).option, strike: 1.04 } };
  const comparison = { comparison: { title: 'Two floors', alternatives: [JSON.parse(exampleText), lower] } };
  await page.setInputFiles('#import-file', {
    name: 'floors.json',
    mimeType: 'application/json',
    buffer: Buffer.from(JSON.stringify(comparison)),
  });
  const rows = await until(page, () => {
    const t = document.getElementById('compare-figures');
    if (!t?.tHead || t.tHead.rows[0].cells.length !== 3 || t.closest('.stale')) return null;
    return [...t.tBodies[0].rows].map((r) => [...r.cells].map((c) => c.textContent));
  });
  assert.ok(
    rows.some((r) => r[0] === 'Delta per unit (spot, not premium-adjusted)'),
    rows.map((r) => r[0]).join('; '),
  );
  assert.match(rows.find((r) => r[0].startsWith('Client price per unit'))[1], /^0\.\d{6}$/);
  // the totals in the pair's quote currency, as on the price card (no quote section names one)
  assert.ok(
    rows.some((r) => r[0] === 'Client price in total USD'),
    rows.map((r) => r[0]).join('; '),
  );
  await context.close();
});
