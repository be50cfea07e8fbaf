// Module tests for market snapshots (docs/market.md): runInMarket prices a trade without a
// market of its own in a snapshot, the same figures as the native CLI's --market, and refuses
// a trade that carries its own market as well.
import assert from 'node:assert/strict';
import { execFileSync } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { test } from 'node:test';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '../..');
const module = await createRequire(import.meta.url)(join(root, 'build/wasm/hedgeleaf.js'))({
  print: () => {},
  printErr: () => {},
});
const cli = process.env.HEDGELEAF_CLI ?? join(root, 'build/native/hedgeleaf');
const tradePath = join(root, 'examples/markets/collar-trade.json');
const snapshotPath = join(root, 'examples/markets/quillmoor.json');
const trade = readFileSync(tradePath, 'utf8');
const snapshot = readFileSync(snapshotPath, 'utf8');

test('a trade is priced in a snapshot and its result carries the as_of', () => {
  const envelope = JSON.parse(module.runInMarket('price', trade, snapshot));
  assert.equal(envelope.ok, true, JSON.stringify(envelope.error));
  assert.equal(envelope.result.market_as_of, '2026-12-02T16:30:00Z');
  assert.equal(envelope.result.legs.length, 2);
  for (const leg of envelope.result.legs) assert.equal(typeof leg.market.volatility, 'number');
  if (existsSync(cli)) {
    const native = JSON.parse(execFileSync(cli, ['price', tradePath, '--market', snapshotPath], { encoding: 'utf8' }));
    assert.ok(Math.abs(native.premium - envelope.result.premium) <= 1e-9 * Math.abs(native.premium));
  }
});

test('a trade with its own market and a snapshot is refused, naming market', () => {
  const withMarket = JSON.stringify({ ...JSON.parse(trade), market: JSON.parse(snapshot) });
  const envelope = JSON.parse(module.runInMarket('price', withMarket, snapshot));
  assert.equal(envelope.ok, false);
  assert.equal(envelope.error.field, 'market');
  assert.match(envelope.error.message, /^market: the trade carries its own market and a market snapshot/);
});

test('a bad grid cell in the snapshot is named by its path', () => {
  const bad = JSON.parse(snapshot);
  bad.volatility = { expiries: [1], strikes: [90, 110], vols: [[0.2, -0.1]] };
  const envelope = JSON.parse(module.runInMarket('price', trade, JSON.stringify(bad)));
  assert.equal(envelope.ok, false);
  assert.equal(envelope.error.field, 'market.volatility.vols[0][1]');
});
