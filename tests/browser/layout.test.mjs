// Browser tests: the layout at a phone's, a tablet's and a laptop's width (the built page from
// file://, Chromium, offline). The premium is on the first screen, no table or drop-down is cut
// off, and the page never scrolls sideways.
import assert from 'node:assert/strict';
import { after, before, test } from 'node:test';

import { chromiumForFile, linkToPage, offlineContext, openPage } from './harness.mjs';

const widths = [
  ['phone', 390, 844],
  ['tablet', 768, 1024],
  ['laptop', 1440, 900],
];

const run = chromiumForFile(before, after);

/** Choices whose chosen text does not fit their box (measured with the select's own font). */
function truncatedSelects(page) {
  return page.evaluate(() => {
    const canvas = document.createElement('canvas').getContext('2d');
    const out = [];
    // (Recent work is a menu: its face always reads "Recent work…", its entries open as a list)
    for (const select of document.querySelectorAll('select:not(#recent-work)')) {
      if (select.closest('[hidden]') || select.getBoundingClientRect().width === 0) continue;
      const style = getComputedStyle(select);
      canvas.font = `${style.fontWeight} ${style.fontSize} ${style.fontFamily}`;
      // room for the text: the box less its padding, borders and the drop-down arrow (about 20 px)
      const room =
        select.getBoundingClientRect().width -
        parseFloat(style.paddingLeft) -
        parseFloat(style.paddingRight) -
        parseFloat(style.borderLeftWidth) -
        parseFloat(style.borderRightWidth) -
        20;
      for (const option of select.options) {
        const width = canvas.measureText(option.text).width;
        if (width > room)
          out.push(
            `${select.dataset.path ?? select.id}: "${option.text}" needs ${Math.ceil(width)} px, has ${Math.floor(room)}`,
          );
      }
    }
    return out;
  });
}

for (const [name, width, height] of widths) {
  test(`${name} (${width} px): the premium on the first screen, nothing cut off or scrolling sideways`, async () => {
    const context = await offlineContext(await run.ready(), { width, height });
    const problems = [];
    const page = await openPage(context, linkToPage(), problems);
    const premium = await page.evaluate(() => {
      const box = document.querySelector('[data-result="premium"]').getBoundingClientRect();
      return { top: box.top + scrollY, bottom: box.bottom + scrollY };
    });
    assert.ok(premium.bottom <= height, `the premium ends ${Math.round(premium.bottom)} px down, the screen ${height}`);
    assert.equal(await page.evaluate(() => document.documentElement.scrollWidth), width, 'no sideways scroll');
    assert.deepEqual(await truncatedSelects(page), []);
    // the hedge schedule: every row shown; at laptop width every column too
    const table = await page.evaluate(() => {
      const t = document.querySelector('[data-result="hedge-schedule"]');
      const box = t.parentElement;
      return {
        rows: t.tBodies[0].rows.length,
        h: [box.scrollHeight, box.clientHeight],
        w: [box.scrollWidth, box.clientWidth],
      };
    });
    assert.ok(table.rows > 20);
    assert.ok(table.h[0] <= table.h[1] + 1, `the schedule is cut off at the bottom: ${table.h}`);
    if (width >= 1200) assert.ok(table.w[0] <= table.w[1] + 1, `the schedule is cut off at the side: ${table.w}`);
    assert.deepEqual(problems, []);
    await context.close();
  });
}
