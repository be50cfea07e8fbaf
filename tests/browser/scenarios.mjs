// The core scenarios, written once and run on every engine the harness drives
// (tests/browser/harness.mjs; one *.engine.test.mjs file per engine calls
// coreScenarios). Each opens the built page, dist/hedgeleaf.html, from file://
// with the network unreachable, and checks what a person would:
//   - it opens and prices the example as the CLI does (a known value);
//   - an edit gives the new premium, again the CLI's;
//   - a bad input shows the engine's message beside its field;
//   - Save file gives the trade file; Copy link gives a link that reopens the trade;
//   - the print sheet carries the figures and the cautions (a PDF where the
//     engine's driver prints);
//   - the scrolling tables are reached with the Tab key alone;
//   - axe-core finds no serious or critical accessibility violation with every
//     panel open, with the cards greyed by a bad input, and on the print sheet;
//   - a fresh engine worker started after opening runs a simulation;
//   - no console error or warning, in the page or in its workers, and no request.
import assert from 'node:assert/strict';
import { execFileSync } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join, resolve } from 'node:path';
import { after, before, describe, test } from 'node:test';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { inflateSync } from 'node:zlib';

import { openBrowser, pasteInPage, until } from './harness.mjs';

const root = join(dirname(fileURLToPath(import.meta.url)), '../..');
const axeSource = readFileSync(join(root, 'web/node_modules/axe-core/axe.min.js'), 'utf8');
const pagePath = resolve(process.env.HEDGELEAF_PAGE ?? join(root, 'dist/hedgeleaf.html'));
const pageUrl = pathToFileURL(pagePath).href;
const cli = process.env.HEDGELEAF_CLI ?? join(root, 'build/native/hedgeleaf');
const exampleText = readFileSync(join(root, 'examples/american-put.json'), 'utf8');
const linkTo = (text) => `${pageUrl}#trade=${Buffer.from(text).toString('base64url')}`;

/** The premium the CLI prints for a trade (the module's, if no native build is around). */
async function cliPremium(text) {
  if (existsSync(cli)) return JSON.parse(execFileSync(cli, ['price', '-'], { input: text, encoding: 'utf8' })).premium;
  const { loadEngine } = await import('../../web/src/engine.js');
  const engine = await loadEngine(createRequire(import.meta.url)(join(root, 'build/wasm/hedgeleaf.js')));
  return engine.run('price', text).premium;
}

const premiumOf = async (tab) =>
  Number(
    await until(
      tab,
      () => !('computing' in document.body.dataset) && document.querySelector('[data-result="premium"]')?.dataset.value,
    ),
  );
const settled = (tab) => until(tab, () => !('computing' in document.body.dataset));
const close = (a, b) => Math.abs(a - b) <= 1e-9 * Math.abs(b); // same tolerance as the module tests

/**
 * Press Tab from the last control before `target` (a selector) until the focus is on it;
 * returns its role and accessible name, or null if 40 presses never got there.
 */
async function tabTo(tab, target) {
  await tab.evaluate((selector) => {
    const goal = document.querySelector(selector);
    const controls = [...document.querySelectorAll('input, select, button, summary, [tabindex="0"]')].filter(
      (el) =>
        el.checkVisibility() &&
        !el.closest('details:not([open]) > :not(summary)') &&
        el.compareDocumentPosition(goal) & Node.DOCUMENT_POSITION_FOLLOWING,
    );
    controls.at(-1).focus();
  }, target);
  for (let i = 0; i < 40; i += 1) {
    await tab.pressTab();
    const reached = await tab.evaluate(
      (selector) =>
        document.activeElement === document.querySelector(selector) && {
          role: document.activeElement.getAttribute('role'),
          name: document.activeElement.getAttribute('aria-label'),
        },
      target,
    );
    if (reached) return reached;
  }
  return null;
}

/** axe-core's serious and critical findings on the page as it is now (axe is put in first). */
/**
 * Click `selector` until `done` holds in the page. A card that opens above the target (its table
 * arriving from the engine) can move the target between WebDriver's scroll and its click, so
 * that WebKit's click lands beside it (seen about once in five runs): a person would click again.
 */
/** A simulation runs (its button is off until it ends) or has shown its figures. */
const simulationStarted = () =>
  Boolean(
    document.getElementById('simulate-run')?.disabled || document.querySelector('[data-result="simulation"] tbody tr'),
  );

async function clickUntil(tab, selector, done) {
  for (let attempt = 1; ; attempt += 1) {
    await tab.click(selector);
    try {
      return await until(tab, done, undefined, 3000);
    } catch (error) {
      if (attempt === 3) throw new Error(`three clicks on ${selector} did not take: ${error.message}`);
    }
  }
}

async function axeFindings(tab) {
  if (!(await tab.evaluate(() => typeof window.axe === 'object'))) await tab.evaluate(axeSource);
  return tab.evaluate(async () => {
    const result = await window.axe.run(document, {
      resultTypes: ['violations'],
    });
    return result.violations
      .filter((v) => v.impact === 'serious' || v.impact === 'critical')
      .map((v) => `${v.id} (${v.impact}): ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`);
  });
}

/** The pages of a PDF: its /Type /Page objects, also those inside compressed object streams. */
function pdfPages(pdf) {
  const raw = pdf.toString('latin1');
  let text = raw;
  for (const found of raw.matchAll(/stream\r?\n/g)) {
    const start = found.index + found[0].length;
    try {
      text += inflateSync(pdf.subarray(start, raw.indexOf('endstream', start))).toString('latin1');
    } catch {
      // not a deflated stream (an image, a font)
    }
  }
  return (text.match(/\/Type\s*\/Page(?!s)/g) ?? []).length;
}

/** Register the core scenarios for engine `name` (harness.mjs engineNames). */
export function coreScenarios(name) {
  describe(`${name}: core scenarios`, () => {
    let browser;
    const tabs = [];
    const open = async (url = linkTo(exampleText)) => {
      const tab = await browser.newTab(url);
      tabs.push(tab);
      await premiumOf(tab);
      return tab;
    };
    const done = async (tab) => {
      tab.finalProblems = await tab.problems();
      await tab.close();
    };

    before(async () => {
      assert.ok(existsSync(pagePath), `build the page first: node web/build.mjs (${pagePath})`);
      browser = await openBrowser(name);
    });
    after(async () => {
      await browser?.close();
    });

    test('opens from file:// offline and prices the example as the CLI does', async () => {
      const tab = await open();
      const premium = await premiumOf(tab);
      const expected = await cliPremium(exampleText);
      assert.ok(close(premium, expected), `page ${premium}, CLI ${expected}`);
      assert.equal(await tab.evaluate(() => document.querySelector('[data-result="premium"]').textContent), '3.0822');
      // the page loaded nothing: no resource besides data: and blob: URLs
      const loaded = await tab.evaluate(() =>
        performance
          .getEntriesByType('resource')
          .map((e) => e.name)
          .filter((url) => !/^(data|blob):/.test(url)),
      );
      assert.deepEqual(loaded, []);
      await done(tab);
    });

    test('an edit of the strike shows the new premium, the CLI’s', async () => {
      const tab = await open();
      await tab.fill('[data-path="option.strike"]', '50');
      const premium = Number(
        await until(tab, () => {
          const node = document.querySelector('[data-result="premium"]');
          return (
            !('computing' in document.body.dataset) && node.dataset.value !== '3.082237412556305' && node.dataset.value
          );
        }),
      );
      const edited = JSON.parse(exampleText);
      edited.option.strike = 50;
      const expected = await cliPremium(JSON.stringify(edited));
      assert.ok(close(premium, expected), `page ${premium}, CLI ${expected}`);
      await done(tab);
    });

    test('a bad volatility shows the engine’s refusal beside the field, in the units on screen; the last result stays, greyed', async () => {
      const tab = await open();
      await tab.fill('[data-path="market.volatility"]', '-20');
      const message = await until(tab, () =>
        document.querySelector('[data-error="market.volatility"].shown')?.textContent.includes('must be')
          ? document.querySelector('[data-error="market.volatility"]').textContent
          : null,
      );
      // the engine refuses market.volatility > 0, got -0.2; the page words it in percent as typed
      assert.equal(message, 'Volatility must be above 0 %, got −20 %');
      const state = await tab.evaluate(() => ({
        invalid: document.querySelector('[data-path="market.volatility"]').getAttribute('aria-invalid'),
        stale: document.querySelector('.headline').classList.contains('stale'),
        premium: document.querySelector('[data-result="premium"]').textContent,
      }));
      assert.deepEqual(state, {
        invalid: 'true',
        stale: true,
        premium: '3.0822',
      });
      await tab.fill('[data-path="market.volatility"]', '31');
      await until(tab, () => !document.querySelector('.headline').classList.contains('stale'));
      await done(tab);
    });

    test('Save file gives the trade file', async () => {
      const tab = await open();
      const saved = await tab.savedFile('#action-export');
      assert.match(saved.name, /\.json$/);
      assert.deepEqual(JSON.parse(saved.text), JSON.parse(exampleText));
      await done(tab);
    });

    test('Copy link gives a link that reopens the edited trade', async () => {
      const tab = await open();
      await tab.fill('[data-path="option.strike"]', '50');
      const premium = await until(tab, () => {
        const value = document.querySelector('[data-result="premium"]').dataset.value;
        return !('computing' in document.body.dataset) && value !== '3.082237412556305' && value;
      });
      // what the page puts on the clipboard is kept on the side (reading a clipboard back
      // needs permissions not every driver grants); a refusal puts the link in the address bar
      await tab.evaluate(() => {
        const clipboard = navigator.clipboard;
        if (!clipboard) return;
        const write = clipboard.writeText.bind(clipboard);
        clipboard.writeText = (text) => {
          window.__copied = text;
          return write(text);
        };
      });
      await tab.click('#action-link');
      const link = await until(
        tab,
        () => window.__copied ?? (location.hash.startsWith('#trade=') ? location.href : null),
      );
      assert.ok(link.startsWith(`${pageUrl}#trade=`), link);
      await done(tab);
      const reopened = await open(link);
      await until(reopened, (p) => document.querySelector('[data-result="premium"]').dataset.value === p, premium);
      assert.equal(await reopened.evaluate(() => document.querySelector('[data-path="option.strike"]').value), '50');
      await done(reopened);
    });

    test('the print sheet carries the figures and the cautions', async () => {
      const tab = await open();
      await tab.printMedia(true);
      const sheet = await until(tab, () => {
        const text = document.getElementById('quote-sheet').innerText;
        return /Input fingerprint\s+[0-9a-f]{12}/.test(text) && text;
      });
      const shown = await tab.evaluate(() => ({
        sheet: document.getElementById('quote-sheet').getClientRects().length > 0,
        terms: document.getElementById('terms').getClientRects().length > 0,
      }));
      assert.deepEqual(shown, { sheet: true, terms: false });
      for (const phrase of [
        'Indicative only',
        'not an offer',
        'not investment advice',
        'sales rules',
        'Indicative until',
      ])
        assert.ok(sheet.includes(phrase), `the sheet lacks "${phrase}"`);
      // the client sheet by default: the price, never the desk's Greeks or lattice
      assert.match(sheet, /Indicative price per unit\s+3\.0822/);
      for (const deskOnly of ['Engine', 'Position delta', 'Lattice error', 'INTERNAL'])
        assert.ok(!sheet.includes(deskOnly), `the client sheet shows "${deskOnly}"`);
      await tab.printMedia(false);
      const pdf = await tab.pdf(); // null where the engine's driver cannot print (WebKit)
      if (pdf) {
        assert.equal(pdf.subarray(0, 5).toString('latin1'), '%PDF-');
        assert.ok(pdf.length > 10000, `a PDF of ${pdf.length} bytes`);
        assert.equal(pdfPages(pdf), 1, 'the quote sheet prints on one A4 page');
      }
      await done(tab);
    });

    test('the Tab key alone reaches the scrolling hedge schedule and scenario table', async () => {
      const tab = await open();
      await until(tab, () => Boolean(document.querySelector('[data-result="hedge-schedule"] tbody tr')));
      const hedge = await tabTo(tab, '.table-scroll:has(> [data-result="hedge-schedule"])');
      assert.deepEqual(hedge, { role: 'region', name: 'Hedge schedule' });
      await clickUntil(tab, '#ladder-card summary', () => document.getElementById('ladder-card').open);
      await until(tab, () => Boolean(document.querySelector('[data-result="ladder"] tbody tr')));
      const ladder = await tabTo(tab, '.table-scroll:has(> [data-result="ladder"])');
      assert.deepEqual(ladder, { role: 'region', name: 'Scenario table' });
      await done(tab);
    });

    test('axe-core: no serious or critical violation with every panel open, greyed, and printed', async () => {
      const tab = await open();
      await clickUntil(tab, '#ladder-card summary', () => document.getElementById('ladder-card').open);
      await clickUntil(tab, '#solve-card summary', () => document.getElementById('solve-card').open);
      await tab.evaluate(() => {
        const unknown = document.getElementById('solve-for');
        unknown.value = 'volatility';
        unknown.dispatchEvent(new Event('change', { bubbles: true }));
      });
      await clickUntil(tab, 'input[name="hedge-kind"][value="lattice"]', () =>
        Boolean(document.querySelector('input[name="hedge-kind"][value="lattice"]:checked')),
      );
      // A small simulation: this test is about the panels, not the engine's speed (WebKit's
      // WebAssembly, under other work on a 2-core machine, once took over a minute for 2,000 paths).
      await tab.fill('[data-path="simulate.paths"]', '200');
      await settled(tab);
      await clickUntil(tab, '#simulate-run', simulationStarted);
      // One wait per panel, so that a timeout names the panel that did not come.
      for (const ready of [
        () => Boolean(document.querySelector('[data-result="simulation"] tbody tr')),
        () => Boolean(document.querySelector('#hedge-tree .node')),
        () => Boolean(document.querySelector('[data-result="ladder"] tbody tr')),
        () => Boolean(document.querySelector('[data-result="solve-solution"]')),
        () => !('computing' in document.body.dataset),
      ])
        await until(tab, ready, undefined, 60000).catch(async (error) => {
          // say what the page holds, so that a timeout shows where the panel's work stopped
          const seen = await tab.evaluate(() => ({
            computing: document.body.dataset.computing ?? null,
            kind: document.querySelector('input[name="hedge-kind"]:checked')?.value ?? null,
            trees: document.querySelectorAll('#hedge-tree').length,
            treeHidden: document.getElementById('hedge-tree')?.hidden ?? null,
            treeNodes: document.querySelectorAll('#hedge-tree .node').length,
            treeEdges: document.querySelectorAll('#hedge-tree .edge').length,
            treeHtml: (document.getElementById('hedge-tree')?.innerHTML ?? '').slice(0, 300),
            hedgeStale: document.querySelector('[data-panel="hedge"]')?.className ?? null,
            errors: [...document.querySelectorAll('.error:not(:empty)')].map((n) => n.textContent).slice(0, 3),
          }));
          throw new Error(`${error.message}; the page holds ${JSON.stringify(seen)}`);
        });
      await tab.evaluate(() => {
        for (const details of document.querySelectorAll('details')) details.open = true;
      });
      // a chart's table of figures is filled when it is opened
      await until(tab, () =>
        [...document.querySelectorAll('details.chart-data table')].every((table) => table.rows.length > 1),
      );
      assert.deepEqual(await axeFindings(tab), [], 'every panel open');
      await tab.fill('[data-path="market.volatility"]', '-20');
      await until(tab, () => Boolean(document.querySelector('.headline.stale')));
      assert.deepEqual(await axeFindings(tab), [], 'cards greyed after a bad input');
      await tab.fill('[data-path="market.volatility"]', '31');
      await until(tab, () => !document.querySelector('.headline.stale'));
      await tab.printMedia(true);
      assert.deepEqual(await axeFindings(tab), [], 'the print sheet');
      await tab.printMedia(false);
      await done(tab);
    });

    test('the smile grid: a pasted spreadsheet block prices each leg at its own cell, as the CLI does; a butterfly is refused beside its cell', async () => {
      // A collar on 100 for six months (put 90, call 110), valued 2026-12-01, first at one volatility.
      const collar = {
        valuation_date: '2026-12-01',
        market: { spot: 100, volatility: 0.25, rate: 0.03 },
        structure: { shape: 'collar', strikes: [90, 110], expiry_date: '2027-06-01' },
        quantity: 1000,
      };
      const tab = await open(linkTo(JSON.stringify(collar)));
      await clickUntil(tab, '#smile-open', () => document.querySelector('.vol-grid') !== null);
      await settled(tab);
      // Copied from a spreadsheet in a decimal-comma locale: tabs between cells, "30,5" for 30.5 %.
      const block = [
        'expiry\t80\t90\t100\t110\t120',
        '3m\t30,5\t27,2\t24\t22,1\t21,5',
        '6m\t29,8\t26,9\t24,2\t22,6\t22',
        '1y\t29\t26,5\t24,5\t23\t22,6',
      ].join('\n');
      await tab.evaluate(pasteInPage, ['[data-path="market.volatility.vols[0][0]"]', block]);
      await until(tab, () => document.querySelector('[data-path="market.volatility.vols[0][0]"]').value === '30.5');
      const premium = await premiumOf(tab);
      // The legs expire on the 6m row's date at the grid's strikes 90 and 110: each takes that
      // cell's volatility (a grid point is its own quote; docs/market.md).
      const legs = await tab.evaluate(() =>
        [...document.querySelectorAll('#leg-market-table tbody tr')].map((r) => r.cells[3].textContent),
      );
      assert.deepEqual(legs, ['26.90 %', '22.60 %']);
      const withGrid = structuredClone(collar);
      withGrid.market.volatility = {
        strike_basis: 'percent_of_spot',
        expiries: ['3m', '6m', '1y'],
        strikes: [80, 90, 100, 110, 120],
        vols: [
          [0.305, 0.272, 0.24, 0.221, 0.215],
          [0.298, 0.269, 0.242, 0.226, 0.22],
          [0.29, 0.265, 0.245, 0.23, 0.226],
        ],
      };
      const expected = await cliPremium(JSON.stringify(withGrid));
      assert.ok(close(premium, expected), `page ${premium}, CLI ${expected}`);
      // 10 % at 100 between 26.9 % at 90 and 22.6 % at 110 on the 6m row: butterfly arbitrage,
      // refused beside the cell, named from 1 as on screen, with the fix in percent.
      await tab.fill('[data-path="market.volatility.vols[1][2]"]', '10');
      const beside = await until(tab, () => {
        const node = document.querySelector('[data-error="market.volatility.vols[1][2]"]');
        return node?.textContent.includes('butterfly') ? node.textContent : null;
      });
      assert.match(beside, /^Volatility, row 2, column 3: /);
      assert.match(beside, /raise this volatility to at least [\d.]+ %/);
      assert.equal(await premiumOf(tab), premium, 'the last good premium stays (greyed)');
      // The last row's remove button takes a click: where scrollbars overlay the content
      // (WebKitGTK), the wide grid's horizontal scrollbar lay over that row and took it.
      await tab.click('#smile-editor button[aria-label="Remove row 3"]');
      await until(tab, () => document.querySelectorAll('.vol-grid tbody tr').length === 2);
      await done(tab);
    });

    test('a fresh engine worker started after opening runs a simulation', async () => {
      const tab = await open();
      await tab.fill('[data-path="simulate.paths"]', '200');
      await settled(tab);
      await clickUntil(tab, '#simulate-run', simulationStarted);
      const rows = await until(
        tab,
        () => document.querySelectorAll('[data-result="simulation"] tbody tr').length,
        undefined,
        60000,
      );
      assert.equal(rows, 3);
      await done(tab);
    });

    test('no console error or warning in the page or its workers, and no request', async () => {
      assert.ok(tabs.length >= 10);
      const problems = [];
      for (const tab of tabs) problems.push(...(tab.finalProblems ?? (await tab.problems())));
      assert.deepEqual(problems, []);
    });
  });
}
