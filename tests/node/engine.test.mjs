// Module tests: the exact engine file the page inlines, loaded through the
// page's own loader (web/src/engine.js), checked against the native CLI on the
// same example trade files, plus the error messages and "no input aborts".
//
// The native CLI is build/native/hedgeleaf (tools/setup.sh test builds it
// first) or $HEDGELEAF_CLI; without it the comparisons are skipped and the
// fixed checks below still run.
import assert from 'node:assert/strict';
import { execFileSync, spawnSync } from 'node:child_process';
import { existsSync, readFileSync, readdirSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { test } from 'node:test';
import { fileURLToPath } from 'node:url';

import { EngineError, loadEngine } from '../../web/src/engine.js';

const root = join(dirname(fileURLToPath(import.meta.url)), '../..');
const modulePath = join(root, 'build/wasm/hedgeleaf.js');
const pagePath = join(root, 'dist/hedgeleaf.html');
const cli = process.env.HEDGELEAF_CLI ?? join(root, 'build/native/hedgeleaf');
const haveCli = existsSync(cli);
const engine = await loadEngine(createRequire(import.meta.url)(modulePath));

const examples = readdirSync(join(root, 'examples'))
  .filter((f) => f.endsWith('.json'))
  .sort();
const readExample = (name) => readFileSync(join(root, 'examples', name), 'utf8');

/** Commands that apply to an example: price always, a section's own command when it has one; compare for a comparison. */
function commandsFor(doc) {
  if (doc.comparison) return ['compare']; // several trades side by side
  const own = {
    hedge: ['hedge', 'tree'],
    simulate: ['simulate'],
    solve: ['solve'],
    ladder: ['ladder'],
    profile: ['profile'],
  };
  const list = ['price'];
  for (const [section, commands] of Object.entries(own)) if (doc[section]) list.push(...commands);
  return list.filter((c) => engine.commands.includes(c));
}

/** Same shape, strings and booleans equal, numbers within 1e-9 relative (wasm32 vs x86-64 libm). */
function assertClose(actual, expected, path = 'result') {
  if (typeof expected === 'number') {
    assert.equal(typeof actual, 'number', `${path} is not a number`);
    const scale = Math.max(1, Math.abs(expected));
    assert.ok(Math.abs(actual - expected) <= 1e-9 * scale, `${path}: wasm ${actual}, native ${expected}`);
  } else if (Array.isArray(expected)) {
    assert.ok(Array.isArray(actual), `${path} is not a list`);
    assert.equal(actual.length, expected.length, `${path} length`);
    expected.forEach((e, i) => assertClose(actual[i], e, `${path}[${i}]`));
  } else if (expected && typeof expected === 'object') {
    assert.deepEqual(Object.keys(actual).sort(), Object.keys(expected).sort(), `${path} keys`);
    for (const key of Object.keys(expected)) assertClose(actual[key], expected[key], `${path}.${key}`);
  } else {
    assert.equal(actual, expected, path);
  }
}

function messageOf(command, doc) {
  try {
    engine.run(command, doc);
  } catch (err) {
    assert.ok(err instanceof EngineError, `expected an EngineError, got ${err}`);
    return err.message;
  }
  assert.fail(`${command} accepted ${String(doc).slice(0, 80)}`);
}

const bad = (patch) => {
  const doc = JSON.parse(readExample('american-put.json'));
  patch(doc);
  return JSON.stringify(doc);
};

test(
  "the page lists this module file's commands (shipped_engine.test.mjs checks the module it carries)",
  { skip: !existsSync(pagePath) && 'dist/hedgeleaf.html not built' },
  () => {
    const page = readFileSync(pagePath, 'utf8');
    assert.match(
      page,
      new RegExp(`<script type="text/plain" id="engine-commands">${engine.commands.join(',')}</script>`),
    );
  },
);

test('version and commands match the native CLI', { skip: !haveCli && 'no native CLI' }, () => {
  assert.equal(execFileSync(cli, ['--version'], { encoding: 'utf8' }).trim(), `hedgeleaf ${engine.version}`);
  const usage = execFileSync(cli, ['--help'], { encoding: 'utf8' });
  assert.match(usage, new RegExp(`commands: ${engine.commands.join(' ')}`));
});

for (const name of examples) {
  const text = readExample(name);
  for (const command of commandsFor(JSON.parse(text))) {
    test(`${command} ${name}: same figures as the native CLI`, { skip: !haveCli && 'no native CLI' }, () => {
      const native = JSON.parse(execFileSync(cli, [command, join(root, 'examples', name)], { encoding: 'utf8' }));
      assertClose(engine.run(command, text), native);
    });
  }
}

test('american-put.json: fixed checks that need no native build', () => {
  const r = engine.run('price', readExample('american-put.json'));
  // European put under the escrowed-dividend model, computed independently with
  // scipy.stats.norm (Black-Scholes-Merton on S - PV(dividend), as in Hull,
  // "Options, Futures, and Other Derivatives", 10th ed., section 17.3 / 15.12).
  assert.ok(Math.abs(r.closed_form.premium - 3.028538675547967) < 1e-9, `closed form ${r.closed_form.premium}`);
  // An American put is worth at least its European twin and its exercise value (common practice).
  assert.ok(r.premium >= r.closed_form.premium && r.premium >= 46 - 48.2);
  assert.ok(Math.abs(r.early_exercise_premium - (r.premium - r.closed_form.premium)) < 1e-12);
  // The error bound covers the error: against the same trade on 25,601 steps (common practice).
  const fine = JSON.parse(readExample('american-put.json'));
  fine.lattice = { steps: 25601 };
  const converged = engine.run('price', JSON.stringify(fine)).premium;
  assert.ok(r.lattice.error_estimate > 0 && r.lattice.error_estimate < 0.01 * r.premium);
  assert.ok(Math.abs(r.premium - converged) <= r.lattice.error_estimate, `${r.premium} vs ${converged}`);
  // The replicating portfolio is worth the premium (shares x spot + cash = value).
  assert.ok(Math.abs(r.replication.shares * r.spot + r.replication.cash - r.premium) < 1e-9);
  assert.equal(r.position.premium, 25000 * r.premium);
  assert.equal(r.engine_version, engine.version);
});

test('bad input gives the field and the same message as the CLI', () => {
  const cases = [
    [
      bad((d) => {
        d.market.volatility = -0.2;
      }),
      'market.volatility',
      'market.volatility: must be > 0, got -0.2',
    ],
    [
      bad((d) => {
        d.market.spot = 'abc';
      }),
      'market.spot',
      null,
    ],
    [
      bad((d) => {
        d.market.volatilty = 0.3;
      }),
      'market.volatilty',
      null,
    ],
    [
      bad((d) => {
        d.option.expiry_date = '2026-11-30';
      }),
      'option.expiry_date',
      null,
    ],
    [
      bad((d) => {
        d.lattice = { steps: 0 };
      }),
      'lattice.steps',
      null,
    ],
    [
      bad((d) => {
        d.market.dividends[0].amount = 60;
      }),
      'market.dividends[0].amount',
      null,
    ],
    ['{"market": ', '', null],
  ];
  for (const [text, field, message] of cases) {
    let caught;
    try {
      engine.run('price', text);
    } catch (err) {
      caught = err;
    }
    assert.ok(caught instanceof EngineError, `no error for ${text.slice(0, 60)}`);
    assert.equal(caught.field, field);
    if (message) assert.equal(caught.message, message);
    assert.ok(caught.message.startsWith(field ? `${field}: ` : 'not a valid JSON document'), caught.message);
    if (haveCli) {
      const run = spawnSync(cli, ['price', '-'], { input: text, encoding: 'utf8' });
      assert.equal(run.status, 2);
      assert.equal(run.stderr.trim(), caught.message);
    }
  }
  assert.match(messageOf('nosuch', readExample('american-put.json')), /^unknown command "nosuch" \(one of .*price/);
  assert.match(messageOf('price', 'x'.repeat((1 << 20) + 1)), /^the trade document is 1048577 bytes, at most 1048576/);
});

test('no input aborts the module (random damage to every example)', () => {
  // Deterministic generator (mulberry32, common practice) so a failure replays.
  let seed = 20261202;
  const random = () => {
    seed = (seed + 0x6d2b79f5) | 0;
    let t = Math.imul(seed ^ (seed >>> 15), 1 | seed);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  const junk = [null, true, -1, 0, 1e308, -1e-308, 'x', '2027-02-30', [], {}, [1, 'a'], 50001, 0.5, -0.5, 1e9];
  const mutate = (node) => {
    if (Array.isArray(node) && node.length && random() < 0.5) return node.map(mutate);
    if (node && typeof node === 'object' && !Array.isArray(node)) {
      const keys = Object.keys(node);
      const key = keys[Math.floor(random() * keys.length)];
      const roll = random();
      if (roll < 0.1) delete node[key];
      else if (roll < 0.55) node[key] = junk[Math.floor(random() * junk.length)];
      else node[key] = mutate(node[key]);
    }
    return node;
  };
  let refused = 0;
  for (let i = 0; i < 400; i += 1) {
    const name = examples[i % examples.length];
    const doc = mutate(JSON.parse(readExample(name)));
    if (doc.lattice && typeof doc.lattice === 'object') doc.lattice.steps = 101; // keep the run short
    for (const command of engine.commands.filter((c) => c !== 'simulate')) {
      try {
        const result = engine.run(command, doc);
        assert.equal(typeof result, 'object');
      } catch (err) {
        assert.ok(err instanceof EngineError, `${command} threw ${err}`);
        assert.ok(err.message.length > 0 && !/internal error/.test(err.message), err.message);
        refused += 1;
      }
    }
  }
  assert.ok(refused > 100, 'the damage should be refused most of the time');
  assert.ok(engine.run('price', readExample('american-put.json')).premium > 0, 'the module still prices');
});
