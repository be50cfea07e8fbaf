// Browser tests: the terms and the cards behave as a salesperson expects (the built page from
// file://, Chromium, offline). The scenario panel never keeps a range the engine refuses; a greyed
// solve result cannot be applied; switching the expiry between a date and a tenor keeps it; fixing
// a structure ungreys every card; New and the shapes start from sensible defaults; the spots typed
// per date carry their own dates; legs are numbered from 1 on screen.
import assert from 'node:assert/strict';
import { after, before, test } from 'node:test';

import { chromiumForFile, offlineContext, openPage, settled, until } from './harness.mjs';
import { exampleTrade, linkToPage, savedTrade } from './harness.mjs'; // trades to open, and the file saved

const run = chromiumForFile(before, after);
let context;
const problems = [];
before(async () => {
  context = await offlineContext(await run.ready());
});

const staleCards = (page) =>
  page.evaluate(() =>
    [...document.querySelectorAll('.card.stale')].filter((c) => !c.closest('[hidden]')).map((c) => c.id || c.className),
  );
const shownErrors = (page) =>
  page.evaluate(() =>
    [...document.querySelectorAll('[data-error]')].filter((n) => n.textContent).map((n) => n.textContent),
  );

async function fill(page, selector, value) {
  await page.fill(selector, value);
  await settled(page);
}

test('changing the scenario move after a custom range leaves settings the engine takes', async () => {
  const page = await openPage(context, linkToPage(), problems);
  await page.click('#ladder-card summary');
  await until(page, () => document.querySelector('table[data-result="ladder"] tbody tr'));
  await fill(page, '[data-path="ladder.spot_from"]', '-10');
  await fill(page, '[data-path="ladder.spot_step"]', '5');
  for (const kind of ['volatility', 'time', 'grid', 'spot']) {
    await page.selectOption('[data-path="ladder.kind"]', kind);
    await settled(page);
    assert.deepEqual(await shownErrors(page), [], `after choosing ${kind}`);
    assert.deepEqual(await staleCards(page), [], `after choosing ${kind}`);
  }
  const { trade } = await savedTrade(page);
  assert.deepEqual(Object.keys(trade.ladder ?? {}).sort(), ['kind'], 'only what the move uses is kept');
  await page.close();
});

test('a quiet market’s volatility ladder names the ends the engine used in its empty fields', async () => {
  // The default volatility axis is ±5 points, stopped on its step's grid where the volatility's
  // lower limit comes first (common practice: a volatility cannot go below the engine's floor):
  // at 4 % the axis starts 3 points down, and the empty "from" field says so.
  const quiet = exampleTrade();
  quiet.market.volatility = 0.04;
  quiet.ladder = { kind: 'volatility' };
  const page = await openPage(context, linkToPage(JSON.stringify(quiet)), problems);
  await page.click('#ladder-card summary');
  await until(page, () => document.querySelector('table[data-result="ladder"] tbody tr'));
  const placeholders = () =>
    page.evaluate(() =>
      ['ladder.vol_from', 'ladder.vol_to'].map((p) => document.querySelector(`[data-path="${p}"]`).placeholder),
    );
  assert.deepEqual(await placeholders(), ['−3', '5']);
  const first = await page.evaluate(
    () => document.querySelector('table[data-result="ladder"] tbody tr > :first-child').textContent,
  );
  assert.match(first, /^1(\.0)? ?%$/, 'the first row is the 1 % the placeholder names');
  await fill(page, '[data-path="market.volatility"]', '30');
  await until(page, () => document.querySelector('[data-path="ladder.vol_from"]').placeholder === '−5');
  assert.deepEqual(await placeholders(), ['−5', '5']);
  await page.close();
});

test('a greyed solve result cannot be applied to the trade', async () => {
  const page = await openPage(context, linkToPage(), problems);
  await page.click('#solve-card summary');
  await page.selectOption('#solve-for', 'volatility');
  await fill(page, '[data-path="solve.target_premium"]', '3.5');
  const use = page.locator('#solve-output button');
  assert.equal(await use.isEnabled(), true);
  await fill(page, '[data-path="market.spot"]', '-1'); // the trade is refused: every card greys
  await until(page, () => document.getElementById('solve-card').classList.contains('stale'));
  assert.equal(await use.isEnabled(), false, 'the greyed result offers no button');
  await use.click({ force: true });
  await settled(page);
  assert.equal(await page.inputValue('[data-path="market.volatility"]'), '31', 'nothing applied');
  await page.close();
});

test('switching the expiry between a date and a tenor keeps it, and either can be chosen again', async () => {
  const page = await openPage(context, undefined, problems);
  await page.click('#action-new');
  await settled(page);
  const mode = (m) => page.check(`input[name="expiry-mode"][value="${m}"]`).then(() => settled(page));
  const date = await page.inputValue('[data-role="expiry-date"]');
  assert.match(date, /^\d{4}-\d\d-\d\d$/);
  await mode('tenor');
  assert.match(await page.inputValue('[data-role="expiry-tenor"]'), /^0[.,]5/);
  await mode('date');
  assert.equal(await page.inputValue('[data-role="expiry-date"]'), date);
  // with no expiry at all, either way of giving it can still be chosen
  await fill(page, '[data-role="expiry-date"]', '');
  await mode('tenor');
  assert.equal(await page.isChecked('input[name="expiry-mode"][value="tenor"]'), true);
  assert.ok(await page.isVisible('[data-role="expiry-tenor"]'));
  await fill(page, '[data-role="expiry-tenor"]', '3m');
  assert.deepEqual(await shownErrors(page), []);
  // a tenor the page cannot turn into a date is kept for when tenor is chosen again
  await fill(page, '[data-role="expiry-tenor"]', 'soon');
  await mode('date');
  await mode('tenor');
  assert.equal(await page.inputValue('[data-role="expiry-tenor"]'), 'soon');
  await page.close();
  // a trade in years without a valuation date gets a date counted from today
  const inYears = exampleTrade();
  delete inYears.valuation_date;
  delete inYears.market.dividends;
  inYears.option = { type: 'put', strike: 46, expiry_years: 0.5, exercise: 'american' };
  const linked = await openPage(context, linkToPage(JSON.stringify(inYears)), problems);
  await linked.check('input[name="expiry-mode"][value="date"]');
  await settled(linked);
  assert.match(await linked.inputValue('[data-role="expiry-date"]'), /^\d{4}-\d\d-\d\d$/);
  assert.deepEqual(await shownErrors(linked), []);
  await linked.close();
});

test('New, then a collar with a bad lower strike fixed by the upper one: no card stays greyed', async () => {
  const page = await openPage(context, linkToPage(), problems);
  await page.click('#action-new');
  await settled(page);
  await page.selectOption('#shape', 'collar');
  await settled(page);
  const [lower, upper] = ['[data-path="structure.strikes[0]"]', '[data-path="structure.strikes[1]"]'];
  await fill(page, lower, '60');
  assert.ok((await shownErrors(page)).length > 0, 'the strikes out of order are refused');
  assert.ok((await staleCards(page)).length > 0);
  await fill(page, upper, '65');
  assert.deepEqual(await shownErrors(page), []);
  assert.deepEqual(await staleCards(page), [], 'nothing says "last good result" with nothing marked');
  await page.close();
});

test('defaults that do not surprise: New is European, shapes start from spot and keep a typed strike', async () => {
  const page = await openPage(context, linkToPage(), problems);
  await page.click('#action-new');
  await settled(page);
  assert.equal(await page.inputValue('[data-role="exercise"]'), 'european');
  assert.match(await page.textContent('#trade-summary'), /European/);
  await page.selectOption('#shape', 'collar');
  await settled(page);
  assert.equal(await page.inputValue('[data-role="exercise"]'), 'european', 'a structure starts European');
  await page.close();

  // From the example (an American put at 46, spot 48.20): a strangle keeps the put's 46 as its
  // lower strike and takes its call strike from spot, above it.
  const example = await openPage(context, linkToPage(), problems);
  await example.selectOption('#shape', 'strangle');
  await settled(example);
  assert.equal(await example.inputValue('[data-path="structure.strikes[0]"]'), '46');
  const call = Number(await example.inputValue('[data-path="structure.strikes[1]"]'));
  assert.ok(call > 48.2 && call < 55, `call strike ${call} from spot 48.20`);
  assert.equal(await example.inputValue('[data-role="exercise"]'), 'european');
  // single put at a typed 50 -> put spread: 50 stays, as the higher strike (the put bought)
  await example.selectOption('#shape', 'option');
  await settled(example);
  await fill(example, '[data-path="option.strike"]', '50');
  await example.selectOption('#shape', 'put-spread');
  await settled(example);
  const strikes = await example.evaluate(() =>
    [...document.querySelectorAll('#structure-strikes input')].map((i) => i.value),
  );
  assert.ok(strikes.includes('50'), `the typed strike is kept: ${strikes}`);
  assert.deepEqual(await shownErrors(example), []);
  await example.close();
});

test('legs are numbered from 1 on screen: the solver, its answer and refusals', async () => {
  const collar = exampleTrade();
  delete collar.option;
  collar.structure = { shape: 'collar', strikes: [44, 52], expiry_date: '2027-06-18' };
  const page = await openPage(context, linkToPage(JSON.stringify(collar)), problems);
  await page.click('#solve-card summary');
  await page.selectOption('#solve-for', 'strike');
  await settled(page);
  const label = await page.evaluate(
    () => document.querySelector('[data-path="solve.leg"]').closest('label').querySelector('span').textContent,
  );
  assert.doesNotMatch(label, /0/);
  assert.match(label, /^Leg/);
  assert.equal(await page.inputValue('[data-path="solve.leg"]'), '2', 'the second leg (the call sold)');
  const answer = await until(page, () => document.querySelector('[data-result="solve-solution"]')?.textContent);
  assert.match(answer, /leg 2\b/);
  assert.equal((await savedTrade(page)).trade.solve.leg, 1, 'the file counts from 0');
  await fill(page, '[data-path="solve.leg"]', '7');
  const refusal = await page.textContent('[data-error="solve.leg"]');
  assert.match(refusal, /\b2\b/, refusal);
  assert.doesNotMatch(refusal, /\b0\b/, refusal);
  await page.close();
  // own legs: a refused strike names "Leg 2", as the row is labelled
  const legs = exampleTrade();
  delete legs.option;
  legs.legs = [
    { type: 'put', strike: 46, expiry_date: '2027-06-18', quantity: 1 },
    { type: 'call', strike: 52, expiry_date: '2027-06-18', quantity: -1 },
  ];
  const own = await openPage(context, linkToPage(JSON.stringify(legs)), problems);
  await fill(own, '[data-path="legs[1].strike"]', '-5');
  const message = await own.textContent('[data-error="legs[1].strike"]');
  assert.match(message, /^Leg 2 strike/, message);
  assert.doesNotMatch(message, /legs\[1\]/);
  await own.close();
});

test('the spots typed per date are labelled with their own dates', async () => {
  const page = await openPage(context, linkToPage(), problems);
  await page.check('input[name="hedge-kind"][value="spots"]');
  await settled(page);
  const pairs = await page.evaluate(() => {
    const labels = [...document.querySelectorAll('.spot-list label')].map((l) => l.querySelector('span').textContent);
    const dates = [...document.querySelectorAll('[data-result="hedge-schedule"] tbody tr')].map(
      (tr) => tr.cells[0].textContent,
    );
    return { labels, dates };
  });
  assert.ok(pairs.labels.length > 5);
  assert.deepEqual(pairs.labels, pairs.dates.slice(1, pairs.labels.length + 1), 'spot i is on rebalancing date i');
  const errorLines = await page.evaluate(() =>
    [...document.querySelectorAll('.spot-list .field-error')].map((n) => n.textContent),
  );
  assert.ok(
    errorLines.every((t) => t === ''),
    'the error lines hold no dates',
  );
  await page.close();
});

test('no console errors in these tests', () => {
  assert.deepEqual(problems, []);
});
