// Module tests of the compare command: the comparison the page shows comes from the engine
// (one analytics function for the CLI and the module), not from figures recomputed in JS.
// The expected figures are the payoff arithmetic of the trades' own words (common practice):
// a put bought for P on shares held breaks even at spot + P and loses at most spot - K + P.
import assert from 'node:assert/strict';
import { execFileSync } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { test } from 'node:test';
import { fileURLToPath } from 'node:url';

import { EngineError, loadEngine } from '../../web/src/engine.js';

const root = join(dirname(fileURLToPath(import.meta.url)), '../..');
const engine = await loadEngine(createRequire(import.meta.url)(join(root, 'build/wasm/hedgeleaf.js')));
const cli = process.env.HEDGELEAF_CLI ?? join(root, 'build/native/hedgeleaf');
const examplePath = join(root, 'examples/protect-a-holding.json');
const example = JSON.parse(readFileSync(examplePath, 'utf8'));

test('the module lists compare and runs the example comparison', () => {
  assert.ok(engine.commands.includes('compare'));
  const r = engine.run('compare', JSON.stringify(example));
  assert.deepEqual(
    r.rows.map((row) => row.label),
    example.comparison.alternatives.map((t) => t.quote.label),
  );
  assert.equal(r.alternatives.length, 3);
  assert.match(r.caution, /^Indicative only/);
});

test('each row is the price command at the client price, with the shares held', () => {
  const r = engine.run('compare', JSON.stringify(example));
  example.comparison.alternatives.forEach((trade, i) => {
    const priced = engine.run('price', JSON.stringify(trade));
    const row = r.rows[i];
    assert.equal(row.client_price, priced.client_price.offer.per_unit, 'the client buys at the offer');
    assert.equal(row.delta, priced.greeks.delta);
    assert.equal(row.holding_shares, 150000);
  });
  const [put, spread, collar] = r.rows;
  // Shares at 36.40 with a 34 put bought at P: break-even 36.40 + P, worst (34 - 36.40 - P) per share.
  assert.ok(Math.abs(put.break_even_low - (36.4 + put.client_price)) < 1e-9);
  assert.ok(Math.abs(put.worst_pnl - 150000 * (34 - 36.4 - put.client_price)) < 1e-6);
  assert.equal(put.best_pnl, null, 'unbounded as spot rises');
  assert.equal(spread.protection_from, 34);
  assert.equal(spread.protection_down_to, 29);
  assert.equal(collar.cap, 43.7);
  assert.ok(Math.abs(collar.best_pnl - 150000 * (43.7 - 36.4 - collar.client_price)) < 1e-6);
});

test('the chart curves share one row of spots', () => {
  const r = engine.run('compare', JSON.stringify(example));
  const spots = r.alternatives[0].curve.map((p) => p.spot);
  assert.equal(spots.length, r.chart.spots);
  for (const a of r.alternatives)
    assert.deepEqual(
      a.curve.map((p) => p.spot),
      spots,
    );
  for (const k of [29, 32, 34, 43.7]) assert.ok(spots.includes(k), `strike ${k} on the chart`);
});

test('a refusal names the field inside the comparison', () => {
  const bad = structuredClone(example);
  bad.comparison.alternatives[2].quote.margin = -1;
  assert.throws(
    () => engine.run('compare', JSON.stringify(bad)),
    (err) =>
      err instanceof EngineError && err.message === 'comparison.alternatives[2].quote.margin: must be >= 0, got -1',
  );
});

test('the module and the native CLI give the same comparison', { skip: !existsSync(cli) && 'no native CLI' }, () => {
  const native = JSON.parse(execFileSync(cli, ['compare', examplePath], { encoding: 'utf8' }));
  const module = engine.run('compare', JSON.stringify(example));
  assert.deepEqual(
    module.rows.map((row) => row.label),
    native.rows.map((row) => row.label),
  );
  module.rows.forEach((row, i) => {
    for (const [key, value] of Object.entries(native.rows[i]))
      if (typeof value === 'number')
        assert.ok(Math.abs(row[key] - value) <= 1e-9 * Math.max(1, Math.abs(value)), `rows[${i}].${key}`);
      else assert.equal(row[key], value, `rows[${i}].${key}`);
  });
});
