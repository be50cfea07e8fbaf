// Hedgeleaf benchmark: the WebAssembly module against the usual loop compiled the
// same way and against a plain-JavaScript peer, all in this one Node process.
//
//   node bench/module_bench.mjs [--module FILE[=LABEL]]... [--reference FILE]
//
// Each --module is a built benchmark module, hedgeleaf_bench.js (default
// build/wasm-bench/hedgeleaf_bench.js: the page's bindings plus bench/bench_exports.cpp,
// built by bench/run.sh); a second one (for instance a build without -msimd128) is timed
// the same way. The page's own module holds no benchmark entry points. Times are
// this process's CPU time (process.cpuUsage), best batch of several, as in the
// native benchmark: other processes share the machine.
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { peerPut } from './peer.mjs';

const root = dirname(dirname(fileURLToPath(import.meta.url)));
const require = createRequire(import.meta.url);

function options() {
  const modules = [];
  let reference = join(root, 'bench/american_reference.csv');
  const args = process.argv.slice(2);
  for (let i = 0; i < args.length; i += 2) {
    if (args[i] === '--module') {
      const [file, label] = args[i + 1].split('=');
      modules.push({ file: resolve(file), label: label ?? 'module' });
    } else if (args[i] === '--reference') {
      reference = resolve(args[i + 1]);
    } else {
      throw new Error(`unknown option ${args[i]}`);
    }
  }
  if (modules.length === 0) modules.push({ file: join(root, 'build/wasm-bench/hedgeleaf_bench.js'), label: 'module' });
  return { modules, reference };
}

const cpuSeconds = () => {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1e6;
};

/** Best mean CPU seconds per call over batches (budget seconds in all). */
function timeCalls(call, budget) {
  let start = cpuSeconds();
  let value = call();
  const first = cpuSeconds() - start;
  const batch = budget / 8;
  if (first >= batch) {
    start = cpuSeconds();
    value = call();
    return { seconds: Math.min(first, cpuSeconds() - start), value };
  }
  let best = Infinity;
  let spent = 0;
  while (spent < budget) {
    let calls = 0;
    let elapsed = 0;
    start = cpuSeconds();
    while (elapsed < batch) {
      value = call();
      calls++;
      elapsed = cpuSeconds() - start;
    }
    spent += elapsed;
    best = Math.min(best, elapsed / calls);
  }
  return { seconds: best, value };
}

const nodeUpdates = (steps) => 0.5 * steps * (steps + 1);
const pad = (text, width) => String(text).padStart(width);
const padEnd = (text, width) => String(text).padEnd(width);

async function load(file) {
  const factory = require(file);
  const start = performance.now();
  const module = await factory({ print: () => {}, printErr: () => {} });
  return { module, loadMs: performance.now() - start };
}

function readReference(file) {
  const lines = readFileSync(file, 'utf8').trim().split('\n');
  const header = lines.shift().split(',');
  return lines
    .filter((l) => l && !l.startsWith('#'))
    .map((line) => {
      const cells = line.split(',');
      const row = Object.fromEntries(header.map((h, i) => [h, h === 'type' ? cells[i] : Number(cells[i])]));
      return row;
    });
}

const benchPut = { spot: 100, strike: 100, vol: 0.25, rate: 0.05, carry: 0.01, expiry: 1 };

async function main() {
  const { modules, reference } = options();
  const loaded = [];
  for (const m of modules) {
    const { module, loadMs } = await load(m.file);
    // Tier-up: V8 first runs wasm in its baseline compiler and swaps in the
    // optimised code between calls, so the very first long call is slow.
    let start = performance.now();
    module.benchKernel('kernel', 10000, true);
    const coldMs = performance.now() - start;
    for (let i = 0; i < 20; i++) module.benchKernel('kernel', 50 + i, true); // warm-up with small prices
    module.benchKernel('usual', 100, true);
    start = performance.now();
    module.benchKernel('kernel', 10000, true);
    const warmMs = performance.now() - start;
    loaded.push({ ...m, module, loadMs, coldMs, warmMs });
  }

  console.log(`# Module backward induction (bench/module_bench.mjs), Node ${process.version}`);
  for (const m of loaded) {
    console.log(`${m.label}: ${m.file}`);
    console.log(
      `  instantiate ${m.loadMs.toFixed(1)} ms; 10,000-step American kernel: first call ${m.coldMs.toFixed(1)} ms ` +
        `(baseline tier), after warm-up with small prices ${m.warmMs.toFixed(1)} ms`,
    );
  }
  console.log('times are CPU time of this process, best batch; node updates = steps (steps + 1) / 2\n');
  console.log(
    `${padEnd('exercise', 9)} ${pad('steps', 6)}  ${padEnd('loop', 22)} ${pad('time/price ms', 14)} ` +
      `${pad('node updates', 12)} ${pad('node updates/s', 15)} ${pad('ns/node', 8)} ${pad('vs usual', 9)} ` +
      `${pad('vs JS peer', 11)}`,
  );
  const summary = [];
  for (const american of [false, true]) {
    for (const steps of [1000, 10000, 50000]) {
      const budget = 0.4;
      const peer = timeCalls(() => peerPut({ ...benchPut, steps, american }), budget);
      const rows = [];
      for (const m of loaded) {
        const usual = timeCalls(() => m.module.benchKernel('usual', steps, american), budget);
        const kernel = timeCalls(() => m.module.benchKernel('kernel', steps, american), budget);
        const band = timeCalls(() => m.module.benchKernel('band', steps, american), budget);
        const bandNodes = m.module.benchBandUpdates(steps, american);
        rows.push(
          { name: `${m.label} usual loop`, t: usual, usual, nodes: nodeUpdates(steps) },
          { name: `${m.label} kernel`, t: kernel, usual, nodes: nodeUpdates(steps) },
          { name: `${m.label} band`, t: band, usual, nodes: bandNodes },
        );
        const agree = Math.abs(kernel.value - peer.value) / Math.abs(peer.value);
        if (agree > 1e-9) console.log(`  WARNING: ${m.label} kernel and JS peer differ by ${agree.toExponential(2)}`);
        summary.push({
          american,
          steps,
          label: m.label,
          usual: usual.seconds,
          kernel: kernel.seconds,
          band: band.seconds,
          peer: peer.seconds,
        });
      }
      rows.push({ name: 'JS peer (Float64Array)', t: peer, usual: null, nodes: nodeUpdates(steps) });
      for (const r of rows) {
        const ns = (r.t.seconds / r.nodes) * 1e9;
        console.log(
          `${padEnd(american ? 'american' : 'european', 9)} ${pad(steps, 6)}  ${padEnd(r.name, 22)} ` +
            `${pad((r.t.seconds * 1e3).toFixed(3), 14)} ${pad(r.nodes.toPrecision(4), 12)} ` +
            `${pad((r.nodes / r.t.seconds).toExponential(3), 15)} ` +
            `${pad(ns.toFixed(3), 8)} ${pad(r.usual ? (r.usual.seconds / r.t.seconds).toFixed(2) : '-', 9)} ` +
            `${pad((peer.seconds / r.t.seconds).toFixed(2), 11)}`,
        );
      }
    }
  }
  console.log(
    "(CRR lattice, put, spot 100, strike 100, vol 25 %, rate 5 %, carry 1 %, 1 year; kernel = the core's " +
      'sweep over every node; band = the same sweep over the probable band only, as the pricer runs it, same value)\n',
  );
  for (const m of loaded) {
    const am = summary.filter((s) => s.american && s.label === m.label);
    const fmt = (f) => am.map((s) => `${f(s).toFixed(1)}x at ${s.steps}`).join(', ');
    console.log(
      `${m.label}, American: kernel vs usual loop ${fmt((s) => s.usual / s.kernel)}; ` +
        `kernel vs JS peer ${fmt((s) => s.peer / s.kernel)}; band vs JS peer ${fmt((s) => s.peer / s.band)}`,
    );
  }

  // Accuracy per time in the module: the fixed random set against its reference.
  const set = readReference(reference);
  console.log(`\n# Module accuracy per time: ${set.length} American options (${reference})`);
  console.log(
    `${padEnd('module', 12)} ${padEnd('method', 16)} ${padEnd('extrap', 6)} ${pad('steps', 6)} ` +
      `${pad('time/price us', 14)} ${pad('RMS rel err', 12)}`,
  );
  const settings = [
    ['leisen-reimer', true, 0],
    ['leisen-reimer', true, 501],
    ['leisen-reimer', true, 1001],
    ['leisen-reimer', true, 2001],
    ['leisen-reimer', false, 0],
    ['crr', false, 0],
  ];
  for (const m of loaded) {
    for (const [method, extrapolate, steps] of settings) {
      const prices = new Float64Array(set.length);
      let best = Infinity;
      for (let pass = 0; pass < 3; pass++) {
        const start = cpuSeconds();
        set.forEach((o, i) => {
          prices[i] = m.module.benchPrice(
            o.type === 'put',
            o.spot,
            o.strike,
            o.volatility,
            o.rate,
            o.carry_yield,
            o.expiry_years,
            method,
            steps,
            extrapolate,
          );
        });
        best = Math.min(best, cpuSeconds() - start);
      }
      let sum = 0;
      set.forEach((o, i) => {
        const e = (prices[i] - o.reference) / Math.max(o.reference, 0.5);
        sum += e * e;
      });
      console.log(
        `${padEnd(m.label, 12)} ${padEnd(method, 16)} ${padEnd(extrapolate ? 'yes' : 'no', 6)} ` +
          `${pad(steps === 0 ? 'default' : steps, 7)} ${pad(((best / set.length) * 1e6).toFixed(1), 13)} ` +
          `${pad(Math.sqrt(sum / set.length).toExponential(2), 12)}`,
      );
    }
  }

  // The page's price call: JSON in and out, price plus bumped vega and rho. Spot moves by a
  // hair on every call, as on the page: the engine remembers the last legs it priced
  // (analytics/pricing.cpp), and the same trade again would time that memory, not a price.
  for (const m of loaded) {
    let call = 0;
    const trade = () =>
      JSON.stringify({
        market: { spot: 100 + 1e-9 * (call += 1), volatility: 0.25, rate: 0.05, carry_yield: 0.01 },
        option: { type: 'put', strike: 100, expiry_years: 1, exercise: 'american' },
      });
    const t = timeCalls(() => m.module.run('price', trade()), 0.4);
    console.log(
      `${m.label}: price command (JSON, default settings, with vega and rho by re-pricing): ` +
        `${(t.seconds * 1e3).toFixed(3)} ms`,
    );
  }
}

main().catch((error) => {
  console.error(error);
  process.exit(1);
});
