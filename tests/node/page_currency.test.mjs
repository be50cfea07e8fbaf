// The page's switch between a share and a currency pair (web/src/currency.js): the document it
// writes is one the engine prices, the switch back gives the trade as it was (nothing typed is
// lost), and a rate's basis changes how it is written, never the number typed.
import assert from 'node:assert/strict';
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { test } from 'node:test';
import { fileURLToPath } from 'node:url';

import { rebase, toEquity, toPair } from '../../web/src/currency.js';
import { loadEngine } from '../../web/src/engine.js';

const root = join(dirname(fileURLToPath(import.meta.url)), '../..');
const engine = await loadEngine(createRequire(import.meta.url)(join(root, 'build/wasm/hedgeleaf.js')));
const read = (name) => JSON.parse(readFileSync(join(root, 'examples', name), 'utf8'));

test('a share turned into a pair is priced as one; turned back it is the trade it was', () => {
  const share = read('american-put.json');
  const doc = structuredClone(share);
  const aside = {};
  toPair(doc, aside);
  assert.deepEqual(doc.underlying, { kind: 'currency_pair' });
  assert.equal(doc.market.domestic_rate, share.market.rate);
  assert.equal(doc.market.foreign_rate, share.market.carry_yield);
  assert.deepEqual(doc.notional, { amount: share.quantity });
  assert.equal(doc.market.dividends, undefined);
  Object.assign(doc.underlying, { base: 'EUR', quote: 'USD' });
  doc.notional.currency = 'EUR';
  const priced = engine.run('price', JSON.stringify(doc));
  // the numbers are continuously compounded ACT/365F rates (docs/currency.md): F = S exp((r_d - r_f) t)
  // over the forward's years, covered interest parity (common practice)
  const c = priced.currency;
  const expected = share.market.spot * Math.exp((share.market.rate - share.market.carry_yield) * c.years.forward);
  assert.ok(Math.abs(c.forward - expected) < 1e-12, `${c.forward} against ${expected}`);
  toEquity(doc, aside);
  assert.deepEqual(doc, share);
});

test('a pair turned into a share and back keeps its quotes, notional and conventions', () => {
  const pair = read('currency-receivable-put.json');
  const doc = structuredClone(pair);
  const aside = {};
  toEquity(doc, aside);
  assert.equal(doc.market.rate, 0.03);
  assert.equal(doc.market.carry_yield, 0.015);
  assert.equal(doc.quantity, 5000000);
  assert.equal(doc.conventions, undefined);
  toPair(doc, aside);
  assert.deepEqual(doc.market, pair.market);
  assert.deepEqual(doc.notional, pair.notional);
  assert.deepEqual(doc.conventions, pair.conventions);
  assert.deepEqual(doc.underlying, pair.underlying);
});

test("a rate's basis is how it is written: the number typed stays", () => {
  assert.deepEqual(rebase(0.03, 'ACT/360 simple'), { rate: 0.03, day_count: 'ACT/360', compounding: 'simple' });
  assert.equal(rebase({ rate: 0.03, day_count: 'ACT/365', compounding: 'annual' }, 'continuous-365F'), 0.03);
});
