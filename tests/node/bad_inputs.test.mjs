// Every case of tests/bad_inputs.json through the WebAssembly module the page inlines:
// refused with an EngineError naming the expected field, and (when the native CLI is
// built) exactly the line the CLI prints on standard error with exit code 2.
import assert from 'node:assert/strict';
import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join, resolve } from 'node:path';
import { test } from 'node:test';
import { fileURLToPath } from 'node:url';

import { EngineError, loadEngine } from '../../web/src/engine.js';
import { badInputs, caseText } from '../bad_inputs.mjs';

const root = join(dirname(fileURLToPath(import.meta.url)), '../..');
const modulePath = resolve(process.env.HEDGELEAF_MODULE ?? join(root, 'build/wasm/hedgeleaf.js'));
const engine = await loadEngine(createRequire(import.meta.url)(modulePath));
const cli = process.env.HEDGELEAF_CLI ?? join(root, 'build/native/hedgeleaf');
const haveCli = existsSync(cli);

test(`the bad-input table has at least 40 cases (${badInputs.cases.length})`, () => {
  assert.ok(badInputs.cases.length >= 40);
});

for (const c of badInputs.cases) {
  test(`bad input, ${c.kind}: ${c.name}`, () => {
    const text = caseText(c);
    let caught;
    try {
      engine.run(c.command, text);
    } catch (err) {
      caught = err;
    }
    assert.ok(caught instanceof EngineError, `not refused as bad input: ${caught ?? 'accepted'}`);
    assert.equal(caught.field, c.field);
    assert.ok(caught.message.includes(c.message), caught.message);
    if (c.field) assert.ok(caught.message.startsWith(`${c.field}: `), caught.message);
    assert.ok(!caught.message.includes('\n'));
    if (haveCli) {
      const run = spawnSync(cli, [c.command, '-'], { input: text, encoding: 'utf8', maxBuffer: 1 << 20 });
      assert.equal(run.status, 2, run.stderr);
      assert.equal(run.stderr, `${caught.message}\n`, 'the module and the CLI give the same line');
    }
  });
}

test('after every refusal the module still prices', () => {
  const ok = engine.run('price', caseText({ base: 'put', patch: {} }));
  assert.ok(ok.premium > 0);
});

test("a request above the page's work budget is refused up front, naming the field", () => {
  const legs = Array.from({ length: 12 }, (_, i) => ({
    type: 'put',
    strike: 80 + 5 * i,
    expiry_years: 2,
    exercise: 'american',
    quantity: 1,
  }));
  const doc = { market: { spot: 100, volatility: 0.3, rate: 0.05 }, legs, lattice: { steps: 50000 } };
  const start = performance.now();
  let caught;
  try {
    engine.run('price', doc);
  } catch (err) {
    caught = err;
  }
  const seconds = (performance.now() - start) / 1000;
  assert.ok(caught instanceof EngineError, `not refused: ${caught}`);
  assert.equal(caught.field, 'lattice.steps');
  assert.match(
    caught.message,
    /^lattice\.steps: 12 option legs at 50001 steps, .* the page runs at once .*command-line tool/,
  );
  assert.ok(seconds < 1, `refused after ${seconds} s: it was attempted`);
  // One leg at the same steps is within the budget and prices.
  assert.ok(engine.run('price', { ...doc, legs: legs.slice(0, 1) }).premium > 0);
});
