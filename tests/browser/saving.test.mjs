// Browser tests: work on the page is never lost (the built page from file://, Chromium, offline).
// Tabs and saved copies keep their own work and a list of recent work brings any of it back; a
// #trade= link stays in the address until the trade is edited; a damaged link changes nothing;
// the last good figures survive a reload, marked; the storage warning names the real button; a
// linked trade without a side shows the client buying; the notice line can be dismissed.
import assert from 'node:assert/strict';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { after, before, test } from 'node:test';
import { pathToFileURL } from 'node:url';

import { chromiumForFile, exampleTrade, linkToPage, offlineContext, openPage, settled, until } from './harness.mjs';

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
