// Golden outputs through the WebAssembly module (the file the page inlines): every
// (command, document) pair of tests/golden/cases.json.
//
//  - the module's envelope text is the one recorded in tests/golden/module.json (a
//    SHA-256 per run): a refactor leaves the module's output identical to the bit;
//  - its result matches the CLI's golden file (tests/golden/expected/): the same keys
//    in the same order, the same strings, booleans and nulls, numbers within 1e-9
//    relative (the module has another libm and SIMD, so the last digits differ), and a
//    refusal carries the very message the CLI prints.
// Regenerate both after a deliberate change: python3 tests/golden/run.py --update.
import assert from 'node:assert/strict';
import { existsSync, readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { join } from 'node:path';
import { test } from 'node:test';

import { fingerprint, fingerprintPath, goldenRuns, root } from '../golden/module.mjs';

const module = await createRequire(import.meta.url)(join(root, 'build/wasm/hedgeleaf.js'))({
  print: () => {},
  printErr: () => {},
});
const prints = JSON.parse(readFileSync(fingerprintPath, 'utf8'));
const expectedDir = join(root, 'tests/golden/expected');

/** Same keys in the same order, equal non-numbers, numbers within 1e-9 relative. */
function assertClose(actual, expected, path) {
  if (typeof expected === 'number') {
    assert.equal(typeof actual, 'number', `${path} is not a number`);
    assert.ok(
      Math.abs(actual - expected) <= 1e-9 * Math.max(1, Math.abs(expected)),
      `${path}: module ${actual}, CLI ${expected}`,
    );
  } else if (Array.isArray(expected)) {
    assert.ok(Array.isArray(actual) && actual.length === expected.length, `${path}: not a list of ${expected.length}`);
    expected.forEach((e, i) => assertClose(actual[i], e, `${path}[${i}]`));
  } else if (expected && typeof expected === 'object') {
    assert.deepEqual(Object.keys(actual), Object.keys(expected), `${path} keys`);
    for (const key of Object.keys(expected)) assertClose(actual[key], expected[key], `${path}.${key}`);
  } else {
    assert.equal(actual, expected, path);
  }
}

const runs = goldenRuns();

test('every golden run has a recorded module fingerprint and no stale ones remain', () => {
  assert.deepEqual(Object.keys(prints).sort(), runs.map((r) => r.key).sort());
});

for (const run of runs) {
  test(`${run.key}: the module's recorded output, the CLI's figures`, () => {
    const text = module.run(run.command, run.text);
    assert.equal(fingerprint(text), prints[run.key], 'the module output changed (tests/golden/module.json)');
    const envelope = JSON.parse(text);
    const refused = join(expectedDir, `${run.key}.refused.txt`);
    if (existsSync(refused)) {
      const [exit, message] = readFileSync(refused, 'utf8').split('\n');
      assert.equal(exit, 'exit 2');
      assert.equal(envelope.ok, false);
      assert.equal(envelope.error.message, message);
    } else {
      assert.equal(envelope.ok, true, envelope.error?.message);
      const cli = JSON.parse(readFileSync(join(expectedDir, `${run.key}.json`), 'utf8'));
      assertClose(envelope.result, cli, 'result');
    }
  });
}
