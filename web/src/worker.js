// Hedgeleaf page: the Web Worker that runs engine commands off the main thread.
//
// The page builds this worker from a Blob holding the inlined module script
// (which defines createHedgeleaf) followed by this code, so the worker needs
// no network and no eval. Messages in: {id, command, trade}; out: {id, result}
// or {id, error: {field, message}} or {id, fatal} when the engine cannot run.
import { EngineError, loadEngine } from './engine.js';

// V8 first runs WebAssembly in its baseline tier and compiles a function
// optimised only after it has run for a while; a long call stays on the code it
// started with. So once the first results are back, price a few small trades
// (some 20 ms in all) so that the lattice kernels are optimised before the
// user's first edit. All four commands share the kernel, so a worker asked for
// any of them warms them all; a worker that only simulates (its own card) does not.
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
];
const warmUpCommands = ['price', 'profile', 'hedge', 'ladder', 'price', 'profile', 'hedge', 'ladder', 'price', 'price'];
let warmUp = null;

function scheduleWarmUp(engine, command) {
  if (warmUp || !warmUpCommands.includes(command)) return;
  warmUp = setTimeout(() => {
    for (const name of warmUpCommands) {
      if (!engine.commands.includes(name)) continue;
      for (const trade of warmUpTrades) {
        try {
          engine.run(name, trade);
        } catch {
          // a refusal here changes nothing for the user: warming up is best effort
        }
      }
    }
  }, 30);
}

/* global createHedgeleaf */
self.onmessage = async (event) => {
  const { id, command, trade } = event.data;
  let engine;
  try {
    engine = await loadEngine(createHedgeleaf);
  } catch (err) {
    self.postMessage({ id, fatal: String(err.message || err) });
    return;
  }
  try {
    self.postMessage({ id, result: engine.run(command, trade), version: engine.version, commands: engine.commands });
  } catch (err) {
    if (err instanceof EngineError) self.postMessage({ id, error: { field: err.field, message: err.message } });
    else self.postMessage({ id, fatal: String(err.message || err) });
  }
  scheduleWarmUp(engine, command);
};
