// Hedgeleaf page: the Web Worker that runs engine commands off the main thread.
//
// The page builds this worker from a Blob holding the module's JavaScript
// (which defines createHedgeleaf) followed by this code, so the worker needs
// no network and no eval. Messages in, first: {engine}, the engine's compiled
// WebAssembly.Module, or {unpack}, the page's packed WebAssembly, which this
// worker unpacks and compiles itself (saying {unpacking} as it starts) and then
// hands back as {compiled} for the page's other workers; then {id, command, trade}
// (a call may come before its engine is ready: it waits) and {warmUp: trade}. Out:
// {id, result, ready} (ready: when the result was, as performance.timeOrigin + now)
// or {id, error: {field, message}} or {id, fatal} when the engine cannot run, and
// {problem} for a security-policy violation here, which the page reports on
// its own console (where people and automation look; a worker's console is
// often hidden).
import { EngineError, loadEngine, unpackEngine } from './engine.js';

let haveEngine;
let noEngine;
const engineGiven = new Promise((resolve, reject) => {
  haveEngine = resolve;
  noEngine = reject;
});
engineGiven.catch(() => {}); // each call reports it

// V8 and WebKit first run WebAssembly in a baseline tier and optimise a function
// only after it has run for a while; a long call stays on the code it started
// with. So once the page has shown its first figures it asks one worker to run
// the page's own trade and a few small ones, spot moved a little each time (the
// engine remembers the last legs it priced: a repeat would run nothing), so that
// the code an edit runs is optimised before the user's first edit (a function runs
// some five times slower before it is: a four-leg price on curves and a smile takes
// 30-40 ms cold and 6 ms warm). One call at a time, each followed by a turn of this
// worker's event loop, so that a call from the page waits for one at most, and it
// stops when the page's first call comes. The workers share one compiled module,
// so the optimised code serves them all.
const warmUpTrades = [
  {
    market: { spot: 100, volatility: 0.3, rate: 0.03, dividends: [{ time_years: 0.2, amount: 1 }] },
    option: { type: 'put', strike: 100, expiry_years: 0.5, exercise: 'american' },
    lattice: { steps: 301 },
  },
  {
    market: { spot: 100, volatility: 0.3, rate: 0.03, carry_yield: 0.01 },
    option: { type: 'call', strike: 105, expiry_years: 1 },
    lattice: { steps: 301 },
  },
  // a desk's market: a smile and rate, yield and borrow curves, European legs (summed, not swept)
  {
    market: {
      spot: 100,
      volatility: {
        strike_basis: 'percent_of_spot',
        expiries: ['3m', '1y'],
        strikes: [80, 100, 120],
        vols: [
          [0.3, 0.24, 0.21],
          [0.28, 0.23, 0.21],
        ],
      },
      rate: {
        points: [
          { tenor: '3m', rate: 0.03 },
          { tenor: '1y', rate: 0.032 },
        ],
      },
      carry_yield: {
        points: [
          { tenor: '6m', rate: 0.01 },
          { tenor: '1y', rate: 0.012 },
        ],
      },
      borrow: { points: [{ tenor: '1y', rate: 0.003 }] },
    },
    legs: [
      { type: 'put', strike: 90, expiry_years: 0.5, quantity: 1 },
      { type: 'call', strike: 110, expiry_years: 0.5, quantity: -1 },
    ],
  },
];
const warmUpCommands = ['price', 'profile', 'hedge', 'ladder'];
const warmUpRounds = 12;

// Calls from the page so far (counted as they come, before they wait for the engine).
let callsSeen = 0;

/** Run one small price now, unless a call from the page came first (it is waiting for the engine). */
function firstCompile(engine) {
  if (callsSeen > 0) return;
  try {
    engine.run('price', warmUpTrades[0]);
  } catch {
    // best effort, as warming up
  }
}

/** Warm up on `trade` (the page's, or null) and the small trades, until the page's next call comes. */
async function warmUp(engine, trade) {
  const trades = trade && typeof trade === 'object' ? [trade, ...warmUpTrades] : [...warmUpTrades];
  const before = callsSeen;
  for (let round = 1; round <= warmUpRounds; round++)
    for (const name of warmUpCommands) {
      if (!engine.commands.includes(name)) continue;
      for (const base of [...trades]) {
        await new Promise((resolve) => setTimeout(resolve, 0));
        if (callsSeen !== before) return;
        const moved = structuredClone(base);
        if (typeof moved.market?.spot === 'number') moved.market.spot *= 1 + (round % 2 ? round : -round) * 1e-4;
        const started = performance.now();
        try {
          engine.run(name, moved);
        } catch {
          // a refusal here changes nothing for the user: warming up is best effort
        }
        // a trade that takes long (a huge lattice; not a first, cold run) would hold a call from
        // the page as long: dropped
        if (performance.now() - started > 60) trades.splice(trades.indexOf(base), 1);
      }
    }
}

self.addEventListener('securitypolicyviolation', (event) => {
  self.postMessage({ problem: `${event.violatedDirective} refused ${String(event.blockedURI).slice(0, 80)}` });
});

/* global createHedgeleaf */
self.onmessage = async (event) => {
  const { id, command, trade, engine: wasm, unpack } = event.data;
  if (wasm) {
    haveEngine(wasm);
    return;
  }
  if (unpack) {
    self.postMessage({ unpacking: true });
    unpackEngine(unpack).then(({ module }) => {
      haveEngine(module);
      // ready before the first call (a call reports a failure); and while this worker waits
      // for it, one small price compiles the code every call runs (the engine's functions
      // are compiled when first called: the first price costs some 50 ms more than the next)
      loadEngine(createHedgeleaf, module).then(firstCompile, () => {});
      try {
        self.postMessage({ compiled: module });
      } catch {
        // a browser that cannot pass the module on: the other workers compile their own
      }
    }, noEngine);
    return;
  }
  let engine;
  if (id) callsSeen += 1;
  try {
    engine = await loadEngine(createHedgeleaf, await engineGiven);
  } catch (err) {
    if (id) self.postMessage({ id, fatal: String(err.message || err) });
    return;
  }
  if (event.data.warmUp) {
    warmUp(engine, event.data.warmUp);
    return;
  }
  try {
    const result = engine.run(command, trade);
    const ready = performance.timeOrigin + performance.now();
    self.postMessage({ id, result, ready, version: engine.version, commands: engine.commands });
  } catch (err) {
    if (err instanceof EngineError)
      self.postMessage({ id, error: { field: err.field, message: err.message, detail: err.detail, kind: err.kind } });
    else self.postMessage({ id, fatal: String(err.message || err) });
  }
};
