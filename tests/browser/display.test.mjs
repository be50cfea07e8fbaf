// Browser tests: what the page shows is right (the built page from file://, Chromium, offline).
// Prices carry the decimals of the market (an exchange rate at 1.0850 shows four); the replication
// line adds up as printed; the payoff chart covers the strikes and break-evens, turns exactly at
// them and takes a range the user sets; tick labels keep the step's decimals; lattice methods are
// named properly; a client name keeps its accents in the saved file's name; every card is drawn
// without scrolling to it and none holds a large blank.
import assert from 'node:assert/strict';
import { after, before, test } from 'node:test';

import { chromiumForFile, linkToPage, offlineContext, openPage, savedTrade, settled, until } from './harness.mjs';

// An invented currency trade: a put on an exchange rate quoted to four decimals.
const fxPut = {
  valuation_date: '2026-12-02',
  market: { spot: 1.085, volatility: 0.07, rate: 0.03, carry_yield: 0.02 },
  option: { type: 'put', strike: 1.07, expiry_date: '2027-06-02' },
  quantity: 1000000,
  side: 'buy',
};
const fxCollar = {
  ...fxPut,
  option: undefined,
  structure: { shape: 'collar', strikes: [1.05, 1.12], expiry_date: '2027-06-02' },
};
const equityPut = {
  valuation_date: '2026-12-02',
  market: { spot: 48.2, volatility: 0.31, rate: 0.035 },
  option: { type: 'put', strike: 46, expiry_date: '2027-06-18', exercise: 'american' },
  quantity: 25000,
  side: 'buy',
};

const run = chromiumForFile(before, after);
let context;
const problems = [];
before(async () => {
  context = await offlineContext(await run.ready(), { width: 1440 });
});

const open = (trade) => openPage(context, linkToPage(JSON.stringify(trade)), problems);
/** "−1,234.5" -> -1234.5 (the page writes a real minus and groups thousands in en-US). */
const numberOf = (text) => Number(text.replace(/−/g, '-').replace(/,/g, ''));
const decimals = (text) => (text.split('.')[1] ?? '').length;

/**
 * The chart in `selector`: its x and y scales (from the tick labels and where they sit) and the
 * vertices of each series' line, in chart units.
 */
function readChart(page, selector) {
  return page.evaluate((sel) => {
    const svg = document.querySelector(`${sel} svg`);
    const num = (t) => Number(t.replace(/−/g, '-').replace(/,/g, ''));
    const texts = [...svg.querySelectorAll('.chart-grid text:not(.axis-label)')];
    const xTicks = texts.filter((t) => t.getAttribute('text-anchor') === 'middle');
    const yTicks = texts.filter((t) => t.getAttribute('text-anchor') === 'end');
    const scale = (ticks, attr) => {
      const [a, b] = [ticks[0], ticks[ticks.length - 1]];
      const [pa, pb] = [Number(a.getAttribute(attr)), Number(b.getAttribute(attr))];
      const [va, vb] = [num(a.textContent), num(b.textContent)];
      return { toValue: (p) => va + ((p - pa) * (vb - va)) / (pb - pa), perUnit: (pb - pa) / (vb - va) };
    };
    const xs = scale(xTicks, 'x');
    const ys = yTicks.map((t) => ({ label: t.textContent, p: Number(t.getAttribute('y')) - 4 }));
    const yScale = scale(yTicks, 'y');
    const series = {};
    for (const g of svg.querySelectorAll('.chart-series')) {
      const d = g.querySelector('path').getAttribute('d');
      const kind = [...g.classList].find((c) => c !== 'chart-series');
      series[kind] = [...d.matchAll(/[ML](-?[\d.]+),(-?[\d.]+)/g)].map((m) => ({ px: Number(m[1]), py: Number(m[2]) }));
      for (const v of series[kind]) v.x = xs.toValue(v.px);
    }
    const zero = svg.querySelector('.chart-grid line.zero');
    return {
      series,
      xLabels: xTicks.map((t) => t.textContent),
      yLabels: ys.map((t) => t.label),
      xPerUnit: xs.perUnit,
      yPerUnit: yScale.perUnit,
      zeroY: zero ? Number(zero.getAttribute('y1')) : null,
    };
  }, selector);
}

test('an exchange rate at 1.0850 shows four decimals wherever a price is shown', async () => {
  const page = await open(fxPut);
  assert.match(await page.textContent('#trade-summary'), /spot 1\.0850\b/);
  const evens = await page.textContent('[data-result="break-even"]');
  assert.match(evens, /^\d\.\d{4}$/, `break-even "${evens}"`);
  const spots = await page.evaluate(() =>
    [...document.querySelectorAll('[data-result="hedge-schedule"] tbody tr')].map((tr) => tr.cells[2].textContent),
  );
  for (const s of spots) assert.equal(decimals(s), 4, `hedge spot "${s}"`);
  await page.click('#ladder-card summary');
  const rows = await until(page, () =>
    [...document.querySelectorAll('table[data-result="ladder"] tbody tr')].map((tr) => tr.cells[0].textContent),
  );
  for (const s of rows) assert.equal(decimals(s), 4, `scenario spot "${s}"`);
  assert.equal(new Set(rows).size, rows.length, 'every scenario row shows its own spot');
  // a share at 48.20 keeps two
  const equity = await open(equityPut);
  assert.match(await equity.textContent('#trade-summary'), /spot 48\.20\b/);
  assert.match(await equity.textContent('[data-result="break-even"]'), /^\d+\.\d\d$/);
  await page.close();
  await equity.close();
});

test('the replication line adds up as printed', async () => {
  for (const trade of [fxPut, equityPut, fxCollar]) {
    const page = await open(trade);
    const line = await page.textContent('[data-result="replication-check"]');
    const m = /=\s*([−\d.,]+)\s*×\s*([\d.,]+)\s*\+\s*([−\d.,]+)\s*=\s*([−\d.,]+)/.exec(line);
    assert.ok(m, line);
    const [a, b, c, d] = m.slice(1).map(numberOf);
    const sum = a * b + c;
    assert.ok(Math.abs(sum - d) <= 0.5 * 10 ** -decimals(m[4]) + 1e-12, `${line}: ${a} × ${b} + ${c} = ${sum}`);
    assert.equal(
      m[2],
      await page.evaluate(() => document.getElementById('trade-summary').textContent.split('spot ')[1]),
    );
    const premium = await page.getAttribute('[data-result="premium"]', 'data-value');
    assert.ok(Math.abs(d - Number(premium)) < 1e-3 * Math.max(1, Number(premium)), `${line} against ${premium}`);
    await page.close();
  }
});

test('the payoff chart covers strikes and break-evens, turns exactly at them, and takes a range', async () => {
  // a currency collar: strikes 3 % either side of spot, not a straight line over ±50 %
  const page = await open(fxCollar);
  let chart = await readChart(page, '#profile-chart');
  let line = chart.series.payoff;
  const [lo, hi] = [line[0].x, line[line.length - 1].x];
  assert.ok(lo < 1.05 && hi > 1.12, `range ${lo}..${hi} covers the strikes`);
  assert.ok(hi - lo < 0.5 * 1.085, `range ${lo}..${hi} is not ±50 % of spot`);
  const evens = JSON.parse(await page.getAttribute('[data-result="break-even"]', 'data-values'));
  for (const x of evens) assert.ok(x > lo && x < hi, `break-even ${x} inside ${lo}..${hi}`);
  for (const k of [1.05, 1.12, ...evens]) {
    assert.ok(
      line.some((v) => Math.abs(v.x - k) * chart.xPerUnit < 0.2),
      `a corner of the line sits at ${k}`,
    );
  }
  // the user's own range
  await page.fill('[data-path="profile.spot_low"]', '1');
  await page.fill('[data-path="profile.spot_high"]', '1.2');
  await settled(page);
  chart = await readChart(page, '#profile-chart');
  line = chart.series.payoff;
  assert.ok(Math.abs(line[0].x - 1) < 2e-3 && Math.abs(line[line.length - 1].x - 1.2) < 2e-3);
  assert.equal((await savedTrade(page)).trade.profile.spot_high, 1.2, 'kept in the trade file');
  await page.close();

  // a put at 46: the corner is at 46 and the line crosses zero exactly at the break-even
  const put = await open(equityPut);
  chart = await readChart(put, '#profile-chart');
  line = chart.series.payoff;
  const corner = line.find((v) => Math.abs(v.x - 46) * chart.xPerUnit < 0.2);
  assert.ok(corner, 'a vertex at the strike');
  const i = line.indexOf(corner);
  // the payoff is flat above the strike for a put bought: the corner's height is the flat part's
  assert.ok(Math.abs(corner.py - line[i + 1].py) < 0.2, 'the corner is where the flat part starts');
  const [even] = JSON.parse(await put.getAttribute('[data-result="break-even"]', 'data-values'));
  const crossing = line.find((v) => Math.abs(v.x - even) * chart.xPerUnit < 0.2);
  assert.ok(crossing && Math.abs(crossing.py - chart.zeroY) < 0.2, 'the line crosses zero at the break-even');
  await put.close();
});

test('chart tick labels keep the step’s decimals (steps of 2.5 and 0.25)', async () => {
  // a call spread 95/105 on 100: profit from about −5 to +5, ticks every 2.5
  const spread = {
    valuation_date: '2026-12-02',
    market: { spot: 100, volatility: 0.2, rate: 0.03 },
    structure: { shape: 'call-spread', strikes: [95, 105], expiry_date: '2027-06-02' },
    quantity: 100,
    side: 'buy',
  };
  const page = await open(spread);
  let checked = 0;
  for (const selector of ['#profile-chart', '#hedge-chart']) {
    const chart = await readChart(page, selector);
    for (const labels of [chart.xLabels, chart.yLabels]) {
      const values = labels.map(numberOf);
      const steps = values.slice(1).map((v, i) => v - values[i]);
      for (const s of steps) assert.ok(Math.abs(s - steps[0]) < 1e-9, `${selector}: ${labels.join(' ')}`);
      if (steps.some((s) => Math.abs(s) % 1 !== 0)) checked += 1;
    }
  }
  const y = (await readChart(page, '#profile-chart')).yLabels;
  assert.ok(y.includes('2.5') || y.includes('−2.5'), `a step of 2.5 in ${y.join(' ')}`);
  assert.ok(checked > 0);
  await page.close();
});

test('lattice methods are named properly wherever they are shown', async () => {
  const page = await open(equityPut);
  assert.match(await page.textContent('[data-result="lattice"]'), /^Leisen–Reimer,/);
  await page.click('#ladder-card summary');
  const notes = await until(page, () => document.querySelector('#ladder-output p:last-child')?.textContent);
  assert.match(notes, /Lattice: Leisen–Reimer/);
  await page.check('#sheet-internal'); // the lattice is on the desk's (internal) sheet only
  await page.emulateMedia({ media: 'print' });
  assert.match(await until(page, () => document.getElementById('sheet-desk').innerText), /Leisen–Reimer lattice/);
  await page.emulateMedia({ media: 'screen' });
  await page.uncheck('#sheet-internal');
  await page.click('.advanced summary');
  await page.selectOption('[data-path="lattice.method"]', 'crr');
  await settled(page);
  assert.match(await page.textContent('[data-result="lattice"]'), /CRR/);
  assert.doesNotMatch(await page.textContent('#ladder-output'), /\b(crr|leisen-reimer|jarrow-rudd|tian)\b/);
  await page.close();
});

test('a client name with accents keeps them in the saved file’s name', async () => {
  const page = await open(equityPut);
  await page.fill('[data-path="quote.client"]', 'Société Générale d’Étude');
  await settled(page);
  const { name } = await savedTrade(page);
  assert.match(name.normalize('NFC'), /^société-générale-d-étude-/);
  await page.close();
});

test('every card is drawn without scrolling to it, and none is a large blank', async () => {
  const page = await open(equityPut);
  await new Promise((r) => setTimeout(r, 500));
  const cards = await page.evaluate(() =>
    [...document.querySelectorAll('.card')]
      .filter((card) => !card.closest('[hidden]'))
      .map((card) => {
        const box = card.getBoundingClientRect();
        // (a folded card shows its summary only; parts a card hides on purpose do not count)
        const shown = [...card.children].filter((c) => !c.hidden && (card.open !== false || c.tagName === 'SUMMARY'));
        const kids = shown.filter((c) => c.getBoundingClientRect().height > 0);
        const top = Math.min(...kids.map((c) => c.getBoundingClientRect().top));
        const bottom = Math.max(...kids.map((c) => c.getBoundingClientRect().bottom));
        return {
          name: card.id || card.dataset.panel,
          drawn: shown.every((c) => c.checkVisibility({ contentVisibilityAuto: true })),
          blank: Math.round(box.height - (bottom - top)),
          text: card.innerText.trim().length,
        };
      }),
  );
  for (const card of cards) {
    assert.ok(card.drawn, `${card.name} is drawn before it is scrolled to`);
    assert.ok(card.blank < 60, `${card.name} has ${card.blank} px with nothing in them`);
    assert.ok(card.text > 0, `${card.name} says something`);
  }
  const status = await page.textContent('#simulate-card');
  assert.match(status, /Run simulation/);
  assert.match(await page.textContent('#simulate-output, #simulate-status'), /\S/, 'says what will appear');
  await page.close();
});

test('no console errors in these tests', () => {
  assert.deepEqual(problems, []);
});
