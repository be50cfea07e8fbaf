// Hedgeleaf benchmark: the `ladder` command inside the WebAssembly module, in Node.
//
// The same cases as bench/ladder_bench.cpp (21 x 11 spot x vol grid at 51, 101
// and 201 steps; a 21-row spot ladder), timed through module.run() with JSON
// text in and out, as the page calls it. Prints median and best of 15 runs
// after one warm-up run.
// Usage: node bench/ladder_module_bench.mjs [path/to/hedgeleaf.js]   (default build/wasm/hedgeleaf.js)
import { createRequire } from 'node:module';
import { dirname, join, resolve } from 'node:path';
import { performance } from 'node:perf_hooks';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const modulePath = resolve(process.argv[2] ?? join(root, 'build/wasm/hedgeleaf.js'));
const createHedgeleaf = createRequire(import.meta.url)(modulePath);
const module = await createHedgeleaf();

const market = { spot: 36.4, volatility: 0.27, rate: 0.032, carry_yield: 0.018 };
const europeanCall = { market, option: { type: 'call', strike: 38, expiry_years: 1, exercise: 'european' } };
const structure = (shape, strikes, exercise) => ({ market, structure: { shape, strikes, expiry_years: 1, exercise } });

function time(doc, ladder, runs = 15) {
  const text = JSON.stringify({ ...doc, ladder });
  module.run('ladder', text); // warm-up: the first call also compiles the hot code in the engine's tiers
  const ms = [];
  for (let i = 0; i < runs; i += 1) {
    const start = performance.now();
    const envelope = JSON.parse(module.run('ladder', text));
    ms.push(performance.now() - start);
    if (!envelope.ok) throw new Error(envelope.error.message);
  }
  ms.sort((a, b) => a - b);
  return { median: ms[Math.floor(ms.length / 2)], best: ms[0] };
}

function report(label, doc, ladder) {
  const t = time(doc, ladder);
  console.log(
    `  ${label.padEnd(44)} ${t.median.toFixed(2).padStart(9)} ms median  ${t.best.toFixed(2).padStart(9)} ms best`,
  );
}

console.log(`ladder command in the WebAssembly module (${modulePath}), Node ${process.version}, 15 runs each`);
for (const steps of [51, 101, 201]) {
  console.log(`21 x 11 spot x vol grid, ${steps} steps (Leisen-Reimer + Richardson)`);
  const grid = { kind: 'grid', steps };
  report('european call', europeanCall, grid);
  report('collar (2 legs, european)', structure('collar', [32, 42], 'european'), grid);
  report('seagull (3 legs, european)', structure('seagull', [30, 38, 44], 'european'), grid);
  report('seagull (3 legs, american)', structure('seagull', [30, 38, 44], 'american'), grid);
}
console.log('21-row spot ladder, 101 steps');
report('seagull (3 legs, american)', structure('seagull', [30, 38, 44], 'american'), { kind: 'spot' });
