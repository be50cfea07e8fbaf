// The module's vocabulary(): the words and limits the engine accepts (core/commands/vocabulary.hpp),
// which the page can read instead of writing them again. Checked against the module's own
// commands(), version() and refusals, and against the native CLI's `hedgeleaf --vocabulary`.
import assert from 'node:assert/strict';
import { execFileSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { test } from 'node:test';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '../..');
const cli = process.env.HEDGELEAF_CLI ?? join(root, 'build/native/hedgeleaf');
const module = await createRequire(import.meta.url)(join(root, 'build/wasm/hedgeleaf.js'))({
  print: () => {},
  printErr: () => {},
});
const vocabulary = JSON.parse(module.vocabulary());

const refusal = (command, doc) => {
  const envelope = JSON.parse(module.run(command, typeof doc === 'string' ? doc : JSON.stringify(doc)));
  assert.equal(envelope.ok, false, `${command} accepted ${JSON.stringify(doc).slice(0, 80)}`);
  return envelope.error;
};
const put = {
  market: { spot: 100, volatility: 0.2, rate: 0.03 },
  option: { type: 'put', strike: 100, expiry_years: 1 },
};

test('the vocabulary names the commands, the version, the lists, the limits and the fields', () => {
  assert.deepEqual(Object.keys(vocabulary), ['engine_version', 'commands', 'lists', 'limits', 'fields']);
  assert.equal(vocabulary.engine_version, module.version());
  assert.deepEqual(
    vocabulary.commands.map((c) => c.name),
    module.commands().split(','),
  );
  for (const c of vocabulary.commands) assert.ok(c.help.length > 10 && c.work_field.includes('.'), c.name);
  assert.deepEqual(vocabulary.lists.lattice_methods, ['crr', 'jarrow-rudd', 'tian', 'leisen-reimer']);
  assert.deepEqual(
    vocabulary.lists.structure_shapes.find((s) => s.name === 'seagull'),
    { name: 'seagull', strikes: 3 },
  );
  assert.ok(Object.keys(vocabulary.fields).length > 80);
});

test('the limits and bounds it states are the ones the module enforces', () => {
  const bytes = vocabulary.limits.document_bytes;
  assert.equal(bytes, 1048576);
  assert.match(refusal('price', ' '.repeat(bytes + 1)).message, new RegExp(`at most ${bytes}$`));
  assert.match(
    refusal('price', '['.repeat(vocabulary.limits.document_depth + 1)).message,
    /nested more than 64 levels/,
  );
  const volatility = vocabulary.fields['market.volatility'];
  assert.deepEqual(volatility, { type: 'number', minimum: 0.001, maximum: 5 });
  const tooHigh = refusal('price', { ...put, market: { ...put.market, volatility: volatility.maximum + 0.5 } });
  assert.equal(tooHigh.message, `market.volatility: must be <= ${volatility.maximum}, got 5.5`);
  const methods = vocabulary.fields['lattice.method'];
  assert.equal(methods.default, 'leisen-reimer');
  assert.match(
    refusal('price', { ...put, lattice: { method: 'binomial' } }).message,
    new RegExp(methods.enum.join(', ')),
  );
  const steps = vocabulary.fields['lattice.steps'];
  assert.equal(
    refusal('price', { ...put, lattice: { steps: steps.maximum + 1 } }).message,
    `lattice.steps: must be between ${steps.minimum} and ${steps.maximum}, got ${steps.maximum + 1}`,
  );
});

test('the module and the CLI hand out the same vocabulary', { skip: !existsSync(cli) && 'no native CLI' }, () => {
  assert.deepEqual(JSON.parse(execFileSync(cli, ['--vocabulary'], { encoding: 'utf8' })), vocabulary);
});
