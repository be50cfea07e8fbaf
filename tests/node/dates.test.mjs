// The page's tenor rule (web/src/dates.js tenorToDate) and the engine's (core/contract/dates,
// expiry_tenor) give the same expiry: for every day of 2027-2028 (a leap year, every weekday,
// every month end) and the month ends of 2000-2040, each tenor through the module's price
// command and through tenorToDate + yearsBetween (ACT/365F) agree exactly, and where
// modified following rolls a tenor back onto the valuation date both refuse it.
import assert from 'node:assert/strict';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { test } from 'node:test';
import { fileURLToPath } from 'node:url';

import { addMonths, tenorToDate, yearsBetween } from '../../web/src/dates.js';
import { EngineError, loadEngine } from '../../web/src/engine.js';

const root = join(dirname(fileURLToPath(import.meta.url)), '../..');
const engine = await loadEngine(createRequire(import.meta.url)(join(root, 'build/wasm/hedgeleaf.js')));

const tenors = ['1d', '3d', '1w', '2w', '1m', '3m', '6m', '9m', '1y', '18m', '2y', '5Y'];

function* valuationDates() {
  for (let day = Date.UTC(2027, 0, 1); day <= Date.UTC(2028, 11, 31); day += 86400000)
    yield new Date(day).toISOString().slice(0, 10);
  // Month ends: the 31st of January moved on month by month, clamped to each month's end.
  for (let month = 0; month < 12 * 41; month++) yield addMonths('2000-01-31', month);
}

/** The engine's expiry in years for a tenor, or its refusal. */
function engineYears(valuation, tenor) {
  const doc = {
    valuation_date: valuation,
    market: { spot: 100, volatility: 0.2, rate: 0.02 },
    option: { type: 'call', strike: 100, expiry_tenor: tenor },
    lattice: { steps: 5 },
  };
  try {
    return engine.run('price', JSON.stringify(doc)).expiry_years;
  } catch (err) {
    assert.ok(err instanceof EngineError, String(err));
    return err.message;
  }
}

test('tenorToDate agrees with the engine on every day of 2027-2028 and on month ends', () => {
  let compared = 0;
  let rolledBack = 0;
  for (const valuation of valuationDates())
    for (const tenor of tenors) {
      const expiry = tenorToDate(valuation, tenor);
      const fromEngine = engineYears(valuation, tenor);
      if (expiry <= valuation) {
        assert.match(String(fromEngine), /rolls back to/, `${valuation} + ${tenor}`);
        rolledBack++;
      } else {
        assert.equal(fromEngine, yearsBetween(valuation, expiry), `${valuation} + ${tenor} = ${expiry}`);
      }
      compared++;
    }
  assert.ok(compared > 9000, `${compared} compared`);
  assert.ok(rolledBack > 0, 'some 1d tenors roll back onto a Friday valuation date');
});

test('tenorToDate: calendar facts and bad tenors', () => {
  // Weekdays are calendar facts (checked with Python's datetime); common practice for the roll.
  assert.equal(tenorToDate('2026-12-02', '6m'), '2027-06-02');
  assert.equal(tenorToDate('2026-12-31', '2m'), '2027-02-26'); // Sunday 28 Feb back to Friday
  assert.equal(tenorToDate('2027-03-03', '1m'), '2027-04-05'); // Saturday forward to Monday
  assert.equal(tenorToDate('2028-01-31', '1m'), '2028-02-29'); // leap day, a Tuesday
  for (const bad of ['6', 'm6', '0m', '6x', '123456m', '', 6, null])
    assert.equal(tenorToDate('2026-12-02', bad), null, String(bad));
  assert.equal(tenorToDate('02/12/2026', '6m'), null);
});
