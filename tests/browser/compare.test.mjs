// Browser tests: alternatives side by side and the number format the user picks (the built page
// from file://, Chromium, offline). One page load walks a salesperson's preparation: open the
// example comparison, check its figures against the module's own `compare`, add and refuse
// alternatives, print the comparison and the single sheets to PDF and read their text with
// pdftotext (poppler-utils), switch to a decimal-comma locale, save and reopen.
//
// What is judged comes from issue 16 ("How it is judged": every leg, the validity time and the
// cautions on the client sheet and none of the desk's figures; the internal sheet has them; three
// alternatives on one printed page; a saved comparison reopens identical). German number and date
// writing (decimal comma, "." grouping, day.month.year) is common practice (DIN 5008).
import assert from 'node:assert/strict';
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { after, before, test } from 'node:test';
import { fileURLToPath, pathToFileURL } from 'node:url';

import { loadEngine } from '../../web/src/engine.js';
import { chromiumForFile, offlineContext, openPage, pageUnderTest, settled, until } from './harness.mjs';

const root = join(dirname(fileURLToPath(import.meta.url)), '../..');
const examplePath = join(root, 'examples/protect-a-holding.json');
const exampleText = readFileSync(examplePath, 'utf8');
const modulePath = resolve(process.env.HEDGELEAF_MODULE ?? join(root, 'build/wasm/hedgeleaf.js'));
const axeSource = readFileSync(join(root, 'web/node_modules/axe-core/axe.min.js'), 'utf8');
const work = mkdtempSync(join(tmpdir(), 'hedgeleaf-compare-'));

const run = chromiumForFile(before, after);

/** The text of a PDF as pdftotext reads it (layout kept), and its number of pages. */
function pdfText(pdf, name) {
  const path = join(work, `${name}.pdf`);
  writeFileSync(path, pdf);
  const text = execFileSync('pdftotext', ['-layout', path, '-'], { encoding: 'utf8' });
  const pages = Number(/Pages:\s+(\d+)/.exec(execFileSync('pdfinfo', [path], { encoding: 'utf8' }))[1]);
  return { text: text.replace(/[ \t]+/g, ' '), pages };
}

/** Print the page as it is now (A4 or Letter) and read it back. */
async function printed(page, name, format = 'A4') {
  await page.emulateMedia({ media: 'print' });
  await page.evaluate(() => window.dispatchEvent(new Event('beforeprint')));
  const read = pdfText(await page.pdf({ format }), name);
  await page.emulateMedia({ media: 'screen' });
  return read;
}

/** The document Save file writes (the download, parsed). */
async function saved(page) {
  const [download] = await Promise.all([page.waitForEvent('download'), page.click('#action-export')]);
  return JSON.parse(readFileSync(await download.path(), 'utf8'));
}

/** The comparison table's columns once the engine's figures are in: [heading, cells...] per row. */
function table(page, columns) {
  return until(
    page,
    (n) => {
      const t = document.getElementById('compare-figures');
      if (!t?.tHead || t.tHead.rows[0].cells.length !== n + 1 || t.closest('.stale')) return null;
      return [...t.tBodies[0].rows].map((r) => [...r.cells].map((c) => c.textContent));
    },
    columns,
  );
}

const deskOnly = ['Model value', 'Desk margin', 'Vega', 'Theta', 'Lattice', 'Position delta', 'INTERNAL', 'Engine'];

test('a comparison of three ways to protect a holding: figures, sheets, locale, saved and reopened', async () => {
  const engine = await loadEngine(createRequire(import.meta.url)(modulePath));
  const expected = engine.run('compare', exampleText);
  const context = await offlineContext(await run.ready());
  const problems = [];
  const page = await openPage(context, undefined, problems);
  await page.selectOption('#number-format', 'en-GB');
  await page.setInputFiles('#import-file', {
    name: 'protect.json',
    mimeType: 'application/json',
    buffer: Buffer.from(exampleText),
  });
  await settled(page);

  // The table is the module's comparison, formatted: client price per unit and in total.
  let rows = await table(page, 3);
  const row = (heading) => rows.find((r) => r[0].startsWith(heading));
  assert.deepEqual(
    row('Client price per unit').slice(1),
    expected.rows.map((r) => r.client_price.toFixed(4)),
  );
  assert.deepEqual(
    row('Client price in total').slice(1),
    expected.rows.map((r) => Math.round(r.client_price_total).toLocaleString('en-GB')),
  );
  assert.equal(row('Gains capped above')[3], '43.70', 'the collar caps gains at its call strike');
  // the chart: one line per alternative, each with its own dash pattern, and a legend
  const dashes = await page.$$eval('#compare-chart .chart-series path:not(.dots)', (paths) =>
    paths.map((p) => getComputedStyle(p).strokeDasharray),
  );
  assert.ok(dashes.length >= 3 && new Set(dashes.slice(0, 3)).size === 3, `dash patterns ${dashes}`);
  const legend = await page.textContent('#compare-chart .chart-legend');
  for (const label of ['Put 34.00', 'Put spread 34.00 / 29.00', 'Zero-cost collar 32.00 / 43.70'])
    assert.ok(legend.includes(label), `legend lacks ${label}`);

  // Duplicate, then a fifth is refused with a message; remove takes the copy away again.
  await page.click('#compare-add');
  await settled(page);
  await page.click('#compare-add');
  assert.match(await page.textContent('#compare-message'), /at most 4 alternatives/);
  assert.equal(await page.locator('#compare-list li').count(), 4);
  await page.click('#compare-list li:nth-child(2) button:has-text("Remove")');
  await settled(page);
  rows = await table(page, 3);
  assert.deepEqual(await page.$$eval('#compare-list .compare-name', (n) => n.map((x) => x.textContent)), [
    '1. Put 34.00',
    '2. Put spread 34.00 / 29.00',
    '3. Zero-cost collar 32.00 / 43.70',
  ]);
  await page.evaluate(axeSource);
  const findings = await page.evaluate(async () => {
    const r = await window.axe.run(document, { resultTypes: ['violations'] });
    return r.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical').map((v) => v.id);
  });
  assert.deepEqual(findings, [], 'axe-core: no serious or critical violation with the comparison open');

  // The comparison sheet: one A4 page, every alternative's legs, validity, cautions, no desk figures.
  await page.evaluate(() => (document.body.dataset.print = 'comparison'));
  const sheet = await printed(page, 'comparison');
  assert.equal(sheet.pages, 1, 'three alternatives print on one page');
  assert.equal((await printed(page, 'comparison-letter', 'Letter')).pages, 1, 'and on one Letter page');
  for (const phrase of [
    'Kestrel Harbour Foods',
    'Indicative until 02/12/2026 17:00Z',
    'Please read',
    'not an offer',
    'Client buys Put 34.00',
    'Client sells Call 43.70',
    'Prepared by Mara Lindqvist',
  ])
    assert.ok(sheet.text.includes(phrase), `the comparison sheet lacks "${phrase}"`);
  for (const phrase of deskOnly) assert.ok(!sheet.text.includes(phrase), `the comparison sheet shows "${phrase}"`);
  await page.evaluate(() => delete document.body.dataset.print);

  // The collar in the editor: its client sheet lists both legs on one page; the internal one adds the desk's figures.
  await page.click('#compare-list li:nth-child(3) button:has-text("Edit")');
  await settled(page);
  const client = await printed(page, 'collar-client');
  assert.equal(client.pages, 1, 'the structure’s client sheet fits one page');
  for (const phrase of ['Client buys Put 32.00', 'Client sells Call 43.70', 'Indicative until', 'Please read'])
    assert.ok(client.text.includes(phrase), `the client sheet lacks "${phrase}"`);
  for (const phrase of deskOnly) assert.ok(!client.text.includes(phrase), `the client sheet shows "${phrase}"`);
  await page.check('#sheet-internal');
  const internal = await printed(page, 'collar-internal');
  for (const phrase of [
    'INTERNAL',
    'Model value per unit',
    'Desk margin in total',
    'Position delta',
    'Vega',
    'Lattice error estimate',
  ])
    assert.ok(internal.text.includes(phrase), `the internal sheet lacks "${phrase}"`);
  await page.uncheck('#sheet-internal');

  // The scenario table at the client price: at today's spot the client is down by the desk's margin
  // (common practice: the client pays the model value plus the margin), within the coarser ladder
  // lattice's difference; with the shares held the same at today's spot.
  await page.click('#ladder-card > summary');
  const ladder = await until(page, () => {
    const t = document.querySelector('table[data-result="ladder"]');
    if (!t?.tHead || document.getElementById('ladder-card').classList.contains('stale')) return null;
    const head = [...t.tHead.rows[0].cells].map((c) => c.textContent);
    const today = [...t.tBodies[0].rows].find((r) => /^\+0(\.0)? %$/.test(r.cells[1].textContent));
    return today && { head, today: [...today.cells].map((c) => c.textContent) };
  });
  const column = ladder.head.indexOf('Client P&L at the client price EUR');
  assert.ok(column > 0, `scenario head ${ladder.head}`);
  assert.equal(ladder.head[column + 1], 'Client P&L with the shares held EUR');
  const margin = Number(await page.getAttribute('[data-result="desk-margin-total"]', 'data-value'));
  const clientToday = Number(ladder.today[column].replace(/[,\u2212]/g, (c) => (c === ',' ? '' : '-')));
  assert.ok(Math.abs(clientToday + margin) < 150000 * 0.005, `client P&L today ${clientToday}, margin ${margin}`);
  assert.equal(ladder.today[column + 1], ladder.today[column]);
  await page.click('#ladder-card > summary');

  // A decimal comma: on screen, in the typed numbers and on the sheet; the saved file stays neutral.
  await page.selectOption('#number-format', 'de-DE');
  await settled(page);
  rows = await table(page, 3);
  assert.deepEqual(
    row('Client price per unit').slice(1),
    expected.rows.map((r) => r.client_price.toFixed(4).replace('.', ',')),
  );
  assert.equal(await page.inputValue('[data-path="market.spot"]'), '36,4');
  await page.fill('[data-path="market.volatility"]', '28,5');
  await settled(page);
  const german = await printed(page, 'collar-de');
  assert.match(german.text, /Valuation date 02\.12\.2026/);
  assert.match(german.text, /Put 32,00 \(87,9 % of spot\)/);
  // an unreadable draft in another alternative: kept as typed
  await page.click('#compare-list li:nth-child(1) button:has-text("Edit")');
  await settled(page);
  await page.fill('[data-path="market.spot"]', '36,4x');
  await settled(page);
  const file = await saved(page);
  assert.equal(file.comparison.alternatives[2].market.volatility, 0.285, 'typed 28,5 % is saved as 0.285');
  assert.equal(file.comparison.alternatives[0].market.spot, '36,4x', 'an unreadable draft is kept as typed');
  assert.equal(file.comparison.title, JSON.parse(exampleText).comparison.title);

  // Reload (this tab's work) and open the saved file in a fresh profile: the same document both ways.
  await page.reload();
  await settled(page);
  assert.deepEqual(await saved(page), file, 'reloaded identical');
  assert.equal(await page.inputValue('[data-path="market.spot"]'), '36,4x');
  assert.equal(await page.inputValue('#number-format'), 'de-DE', 'the number format is remembered');
  assert.equal(await page.inputValue('[data-path="quantity"]'), '150.000');
  const fresh = await openPage(await offlineContext(await run.ready()), undefined, problems);
  await fresh.setInputFiles('#import-file', {
    name: 'saved.json',
    mimeType: 'application/json',
    buffer: Buffer.from(JSON.stringify(file)),
  });
  await settled(fresh);
  assert.deepEqual(await saved(fresh), file, 'reopened identical');
  // Copy link and Save page with trade carry the same document
  const link = `${pageUnderTest().url}#trade=${Buffer.from(JSON.stringify(file)).toString('base64url')}`;
  const linked = await openPage(await offlineContext(await run.ready()), link, problems);
  await settled(linked);
  assert.deepEqual(await saved(linked), file, 'a link reopens identical');
  const [copy] = await Promise.all([linked.waitForEvent('download'), linked.click('#action-copy-page')]);
  const copyPath = join(work, 'copy.html');
  await copy.saveAs(copyPath);
  const reopened = await openPage(await offlineContext(await run.ready()), pathToFileURL(copyPath).href, problems);
  await settled(reopened);
  assert.deepEqual(await saved(reopened), file, 'a saved page copy reopens identical');
  assert.equal(await reopened.locator('#compare-list li').count(), 3);
  // A three-leg structure's client sheet: every leg, on one page
  await reopened.fill('[data-path="market.spot"]', '36.4');
  await reopened.selectOption('#shape', 'seagull');
  await settled(reopened);
  const seagull = await printed(reopened, 'seagull-client');
  assert.equal(seagull.pages, 1, 'a three-leg client sheet fits one page');
  assert.equal(seagull.text.match(/Client (buys|sells) (Put|Call) \d/g)?.length, 3, seagull.text);
  for (const phrase of deskOnly) assert.ok(!seagull.text.includes(phrase), `the client sheet shows "${phrase}"`);
  // the draft is in the editor, refused beside its field, as typed
  assert.equal(await fresh.inputValue('[data-path="market.spot"]'), '36,4x');
  assert.match(await until(fresh, () => document.querySelector('[data-error="market.spot"]')?.textContent), /Spot/);
  // an alternative not in the editor that the engine refuses is named in the card
  await fresh.fill('[data-path="market.spot"]', '36.4');
  await fresh.click('#compare-list li:nth-child(2) button:has-text("Edit")');
  await settled(fresh);
  const broken = structuredClone(file);
  broken.comparison.alternatives[0].market.spot = 36.4;
  broken.comparison.alternatives[2].market.volatility = -0.2;
  await fresh.setInputFiles('#import-file', {
    name: 'broken.json',
    mimeType: 'application/json',
    buffer: Buffer.from(JSON.stringify(broken)),
  });
  await settled(fresh);
  assert.match(
    await until(fresh, () => document.getElementById('compare-message')?.textContent),
    /^Alternative 3 \(Zero-cost collar 32\.00 \/ 43\.70\) is refused: .*volatility/,
  );
  assert.deepEqual(problems, []);
});
