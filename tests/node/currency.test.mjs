// Module tests for currency pairs (docs/currency.md): the module prices the treasurer's EUR/USD put
// of examples/currency-receivable-put.json with the same forward, forward points and premiums as
// Garman-Kohlhagen computed independently (scipy.stats.norm, tests/analytics/currency_test.cpp),
// and refuses a pair's document with the message naming the field.
import assert from 'node:assert/strict';
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { test } from 'node:test';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '../..');
const module = await createRequire(import.meta.url)(join(root, 'build/wasm/hedgeleaf.js'))({
  print: () => {},
  printErr: () => {},
});
const example = JSON.parse(readFileSync(join(root, 'examples/currency-receivable-put.json'), 'utf8'));

const close = (actual, expected, tolerance) =>
  assert.ok(Math.abs(actual - expected) <= tolerance, `${actual} is not within ${tolerance} of ${expected}`);

test("the treasurer's put: dates, forward points and the premium in every convention", () => {
  const envelope = JSON.parse(module.run('price', JSON.stringify(example)));
  assert.equal(envelope.ok, true, JSON.stringify(envelope.error));
  const c = envelope.result.currency;
  // Thursday trade -> Monday spot, Friday expiry -> Tuesday delivery (calendar facts, T+2).
  assert.deepEqual(c.dates, {
    trade: '2026-12-03',
    spot: '2026-12-07',
    expiry: '2027-09-03',
    delivery: '2027-09-07',
    premium: '2026-12-07',
  });
  // Python: F = 1.085 (1 + 0.03 x 274/360) / (1 + 0.015 x 274/360); D x Black put 0.014490687623303385.
  close(c.forward, 1.0972472604432726, 1e-12);
  close(c.forward_points, 122.47260443272623, 1e-8);
  close(envelope.result.closed_form.premium, 0.014490687623303385, 1e-12);
  close(c.premium.value, 144.90687623303384, 0.002);
  close(c.premium.in_each_convention.percent_of_foreign, 1.3355472463874087, 1e-4);
  close(c.premium.in_each_convention.foreign_pips, 125.99502324409515, 0.002);
  assert.equal(c.premium.currency, 'USD');
  assert.ok('foreign' in envelope.result.replication && !('shares' in envelope.result.replication));
});

test("a pair's refusal names the field", () => {
  const bad = { ...example, underlying: { ...example.underlying, quote: 'usd' } };
  const envelope = JSON.parse(module.run('price', JSON.stringify(bad)));
  assert.equal(envelope.ok, false);
  assert.equal(envelope.error.field, 'underlying.quote');
  assert.match(envelope.error.message, /^underlying\.quote: must be an ISO 4217 currency code/);
});
