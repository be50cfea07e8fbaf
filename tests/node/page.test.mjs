// Page module tests: the plain JS the page runs, without a browser. Number
// entry and display, trade links, field paths, the form's date/year fields,
// routing a path on the tree, and the one-file build (bundler, CSP hashes).
import assert from 'node:assert/strict';
import { createHash } from 'node:crypto';
import { existsSync, readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { test } from 'node:test';
import { fileURLToPath } from 'node:url';

import {
  formatNumber,
  formatSmart,
  inputText,
  parseNumber,
  parsePercent,
  parseTenor,
  percentText,
} from '../../web/src/format.js';
import { fromBase64Url, toBase64Url, tradeFromHash, autosave, parseTradeText } from '../../web/src/share.js';
import { getPath, pathAncestors, setPath } from '../../web/src/paths.js';
import { changeShape, defaultExerciseSchedule, readDateList, readTime, readWhen } from '../../web/src/form.js';
import { gridWords, isMarketTablePath } from '../../web/src/grid-words.js';
import { cellNumber, readCurveBlock, readGridBlock, splitBlock } from '../../web/src/paste-block.js';
import { addMonths, addYears, yearsBetween } from '../../web/src/dates.js';
import { routeThrough } from '../../web/src/tree.js';

const root = join(dirname(fileURLToPath(import.meta.url)), '../..');

test('numbers typed with separators and percentages read as the file stores them', () => {
  assert.equal(parseNumber('25,000'), 25000);
  assert.equal(parseNumber(' 1 234.5 '), 1234.5);
  assert.equal(parseNumber('−3.5'), -3.5);
  assert.equal(parseNumber(''), null);
  assert.equal(parseNumber('12abc'), '12abc'); // handed to the engine, which names the field
  assert.equal(parseNumber('1e400'), '1e400'); // too large for a double: sent as typed, not as null
  assert.equal(parsePercent('31'), 0.31);
  assert.equal(parsePercent('3.5'), 0.035);
  assert.equal(parsePercent('0.1'), 0.001);
  assert.equal(percentText(0.035), '3.5');
  assert.equal(percentText(0.31), '31');
  assert.equal(parseTenor('6m'), 0.5);
  assert.equal(parseTenor('2y'), 2);
  assert.equal(parseTenor('73d'), 0.2);
  assert.equal(parseTenor('soon'), 'soon');
});

test('numbers on screen carry thousands separators and a real minus', () => {
  assert.equal(formatNumber(77053.9007, 2), '77,053.90');
  assert.equal(formatNumber(-9154.2223, 2), '−9,154.22');
  assert.equal(formatNumber(-0.0001, 2), '0.00');
  assert.equal(formatNumber(NaN), '–');
  assert.equal(formatSmart(0.035332, 4, 4), '0.03533');
  assert.equal(formatSmart(3e-16, 2, 4), '0.0000');
  assert.equal(inputText(25000), '25,000');
  assert.equal(inputText(1234567.25), '1,234,567.25');
});

test('a trade survives the #trade= link, unicode and all', () => {
  const doc = { quote: { client: 'Ødegård & Söhne <b>' }, market: { spot: 48.2 } };
  const code = toBase64Url(JSON.stringify(doc));
  assert.match(code, /^[A-Za-z0-9_-]+$/);
  assert.deepEqual(JSON.parse(tradeFromHash(`#trade=${code}`)), doc);
  assert.deepEqual(JSON.parse(fromBase64Url(code)), doc);
  assert.equal(tradeFromHash('#other'), null);
  assert.throws(() => fromBase64Url('a+b/'), /damaged/);
});

test('trade text from outside is refused when nested deeper than any trade (the engine limit, 64)', () => {
  assert.deepEqual(parseTradeText('{"a": [1, {"b": "[[[{{{"}]}'), { a: [1, { b: '[[[{{{' }] }); // brackets in text do not count
  assert.deepEqual(parseTradeText(`${'['.repeat(64)}${']'.repeat(64)}`).length, 1);
  assert.throws(() => parseTradeText(`${'['.repeat(65)}${']'.repeat(65)}`), /nested more than 64 levels deep/);
  assert.throws(() => parseTradeText('{"a": "\\"'), SyntaxError); // an escaped backslash then an unclosed object
});

test('autosave reports a full store instead of failing silently', () => {
  const full = {
    setItem() {
      const e = new Error('full');
      e.name = 'QuotaExceededError';
      throw e;
    },
  };
  assert.match(autosave(full, { trade: {} }), /storage is full/);
  const fine = {
    setItem(k, v) {
      this.saved = v;
    },
  };
  assert.equal(autosave(fine, { trade: { a: 1 } }), null);
});

test('field paths read, write and fall back the way the engine names fields', () => {
  const doc = {};
  setPath(doc, 'market.dividends[0].amount', 0.42);
  assert.deepEqual(doc, { market: { dividends: [{ amount: 0.42 }] } });
  assert.equal(getPath(doc, 'market.dividends[0].amount'), 0.42);
  setPath(doc, 'lattice.steps', 201);
  setPath(doc, 'lattice.steps', undefined);
  assert.equal(doc.lattice, undefined, 'an emptied section is dropped');
  assert.deepEqual(pathAncestors('legs[1].strike'), ['legs[1].strike', 'legs[1]', 'legs', '']);
});

test('date-or-years fields and exercise date lists pick the right key', () => {
  assert.deepEqual(readWhen('2027-03-15', 'date', 'time_years'), { key: 'date', value: '2027-03-15' });
  assert.deepEqual(readWhen('0.25', 'date', 'time_years'), { key: 'time_years', value: 0.25 });
  assert.deepEqual(readWhen('3m', 'date', 'time_years'), { key: 'time_years', value: 0.25 });
  assert.deepEqual(readWhen('next week', 'date', 'time_years'), { key: 'date', value: 'next week' });
  assert.deepEqual(readDateList('2027-01-15, 2027-03-15'), {
    key: 'exercise_dates',
    value: ['2027-01-15', '2027-03-15'],
  });
  assert.deepEqual(readDateList('0.25 0.5'), { key: 'exercise_years', value: [0.25, 0.5] });
  // ACT/365F as the engine counts (2026-12-02 to 2027-06-18 is 198 days)
  assert.equal(yearsBetween('2026-12-02', '2027-06-18'), 198 / 365);
  assert.equal(addYears('2026-12-02', 198 / 365), '2027-06-18');
});

test('a contract turning Bermudan gets monthly exercise dates before expiry (quarterly past two years)', () => {
  // calendar months, the day clamped to the month's end (common practice for monthly schedules)
  assert.equal(addMonths('2027-01-31', 1), '2027-02-28');
  assert.equal(addMonths('2028-01-31', 1), '2028-02-29');
  assert.equal(addMonths('2026-12-02', 13), '2028-01-02');
  const dated = { valuation_date: '2026-12-02', option: { expiry_date: '2027-06-18' } };
  assert.deepEqual(defaultExerciseSchedule(dated, 'option'), {
    key: 'exercise_dates',
    value: ['2027-01-02', '2027-02-02', '2027-03-02', '2027-04-02', '2027-05-02', '2027-06-02'],
  });
  const tenor = { structure: { expiry_years: 3 } };
  const quarterly = defaultExerciseSchedule(tenor, 'structure');
  assert.equal(quarterly.key, 'exercise_years');
  assert.deepEqual(quarterly.value.slice(0, 3), [0.25, 0.5, 0.75]);
  assert.equal(quarterly.value.at(-1), 2.75); // the expiry itself is always an exercise date
  assert.equal(defaultExerciseSchedule({ option: { expiry_years: 0.05 } }, 'option'), null); // under a month: expiry only
  assert.equal(defaultExerciseSchedule({ option: { expiry_date: '2027-06-18' } }, 'option'), null); // no valuation date
});

test('changing the shape keeps expiry and the file order; a structure starts European', () => {
  const doc = JSON.parse(readFileSync(join(root, 'examples/american-put.json'), 'utf8'));
  changeShape(doc, 'collar');
  assert.deepEqual(Object.keys(doc), ['valuation_date', 'market', 'structure', 'quantity', 'side']);
  assert.equal(doc.structure.shape, 'collar');
  assert.equal(doc.structure.strikes.length, 2);
  assert.ok(doc.structure.strikes[0] < doc.structure.strikes[1]);
  assert.equal(doc.structure.expiry_date, '2027-06-18');
  assert.equal(doc.structure.exercise, undefined, 'European, the default');
  assert.equal(doc.structure.strikes[0], 46, "the put's strike keeps its place (the collar's put)");
  changeShape(doc, 'option');
  assert.equal(doc.option.expiry_date, '2027-06-18');
  assert.equal(doc.structure, undefined);
});

test('picking a node on the tree routes the path through it, changing as little as possible', () => {
  assert.equal(routeThrough('UDUDUD', 3, 3), 'UUUDUD');
  assert.equal(routeThrough('UDUDUD', 2, 0), 'DDUDUD');
  assert.equal(routeThrough('UDUDUD', 4, 2), 'UDUDUD');
  for (let step = 1; step <= 6; step += 1) {
    for (let index = 0; index <= step; index += 1) {
      const moves = routeThrough('DUDUUD', step, index);
      assert.equal([...moves.slice(0, step)].filter((m) => m === 'U').length, index);
      assert.equal(moves.slice(step), 'DUDUUD'.slice(step));
    }
  }
});

test(
  'the built page allows exactly its own scripts and style by hash',
  { skip: !existsSync(join(root, 'dist/hedgeleaf.html')) && 'page not built' },
  () => {
    const html = readFileSync(join(root, 'dist/hedgeleaf.html'), 'utf8');
    const csp = /<meta http-equiv="Content-Security-Policy" content="([^"]+)">/.exec(html)[1];
    const hash = (text) => `'sha256-${createHash('sha256').update(text).digest('base64')}'`;
    const executable = [...html.matchAll(/<script id="[a-z-]+">([\s\S]*?)<\/script>/g)].map((m) => m[1]);
    assert.equal(executable.length, 3, 'the engine module, the boot script and the page script');
    for (const text of executable) assert.ok(csp.includes(hash(text)), 'a script is not allowed by hash');
    const style = /<style>([\s\S]*?)<\/style>/.exec(html)[1];
    assert.ok(csp.includes(`style-src ${hash(style)}`));
    assert.match(csp, /^default-src 'none'; /);
    assert.ok(!csp.includes("'unsafe-eval'") && !csp.includes("'unsafe-inline'") && !csp.includes('connect-src'));
    assert.ok(csp.includes("'wasm-unsafe-eval'") && csp.includes('worker-src blob:'));
    assert.ok(!/\sstyle="/.test(html), 'no inline style attributes (CSP would block them)');
    assert.ok(!/\son[a-z]+="/.test(html), 'no inline event handlers');
    assert.ok(!/(src|href)="(https?:)?\/\//.test(html), 'nothing loads from the network');
    assert.ok(Buffer.byteLength(html) < 1024 * 1024, 'under 1 MiB');
  },
);

// A spreadsheet copies a selection as text/plain lines of tab-separated cells, CRLF between lines
// (common practice: what Excel and LibreOffice Calc put on the clipboard); in a decimal-comma
// locale the cells read "30,5".
test('a block pasted from a spreadsheet fills the smile grid in file decimals, headings or not', () => {
  const block = 'expiry\t80\t100\r\n3M\t30,5\t24\r\n2027-06-01\t29,8 %\tabc\r\n0,5\t29\t24,5\r\n';
  const read = readGridBlock(block);
  assert.deepEqual(read.strikes, [80, 100]);
  assert.deepEqual(read.expiries, ['3m', '2027-06-01', 0.5]);
  assert.deepEqual(read.vols, [
    [0.305, 0.24],
    [0.298, 'abc'],
    [0.29, 0.245],
  ]);
  assert.equal(read.decimals, false, 'percent as on screen');
  // decimals as a spreadsheet holds them: every plain value at most 1
  const decimals = readGridBlock('0,25\t0,22\n0,24\t0,215');
  assert.equal(decimals.decimals, true);
  assert.equal(decimals.expiries, undefined, 'no headings: volatilities only');
  assert.deepEqual(decimals.vols, [
    [0.25, 0.22],
    [0.24, 0.215],
  ]);
  // an expiry in the corner: a first column of expiries, no row of strikes
  assert.deepEqual(readGridBlock('6m\t25\t24\n1y\t26\t25').expiries, ['6m', '1y']);
  // commas separate cells when there is no tab or semicolon: then they are not decimal commas
  assert.deepEqual(readGridBlock('expiry,90,110\n1y,25.5,22').vols, [[0.255, 0.22]]);
  assert.deepEqual(splitBlock('a;b\n\n c ;d').rows, [
    ['a', 'b'],
    ['c', 'd'],
  ]);
  assert.deepEqual(cellNumber('1.234,5', true), { value: 1234.5, percent: false });
  assert.equal(cellNumber('12x', true), null);
  assert.equal(readGridBlock(' \n ').why, 'the pasted text holds no cells');
});

test('a pasted curve block reads tenor, date or years and a rate; a header line is skipped', () => {
  assert.deepEqual(readCurveBlock('tenor\trate\n3m\t2,9\n2027-12-01\t3,1 %\n2\t3,3').points, [
    { time: '3m', rate: 0.029 },
    { time: '2027-12-01', rate: 0.031 },
    { time: 2, rate: 0.033 },
  ]);
  assert.equal(readCurveBlock('3m\t0,029\n1y\t0,031').decimals, true);
  assert.equal(readCurveBlock('3m\n1y').why, 'each line needs a time and a rate');
});

test('a grid or curve time typed in a cell keeps its kind; the engine speaks of cells in screen terms', () => {
  assert.deepEqual(readTime(' 6M '), { key: 'tenor', value: '6m' });
  assert.deepEqual(readTime('2027-06-30'), { key: 'date', value: '2027-06-30' });
  assert.deepEqual(readTime('1.5'), { key: 'years', value: 1.5 });
  assert.deepEqual(readTime('soon'), { key: 'tenor', value: 'soon' });
  assert.equal(readTime('').value, undefined);
  // the engine's calendar message (core/analytics/smile_checks.cpp): paths from 0, decimals
  const engine =
    'total variance 0.0128 (volatility 0.16 over 0.4986 years) is below 0.0142, that of vols[0][2] (0.24 over ' +
    '0.2466 years): total variance must not fall with maturity (calendar arbitrage); raise this volatility to at ' +
    'least 0.1688 or lower vols[0][2]';
  const words = gridWords(engine);
  assert.match(words, /\(volatility 16 % over 0\.4986 years\)/);
  assert.match(words, /that of row 1, column 3 \(0\.24 over/);
  assert.match(words, /raise this volatility to at least 16\.88 % or lower row 1, column 3$/);
  assert.ok(isMarketTablePath('market.volatility.vols[1][2]'));
  assert.ok(isMarketTablePath('market.borrow.points[0].rate'));
  assert.ok(!isMarketTablePath('market.volatility'));
});
