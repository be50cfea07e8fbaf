// Hedgeleaf page: the engine's workers, made from the page's own scripts.
//
// Each worker is built from a Blob of the module's JavaScript plus the worker code
// (no network, no eval; CSP worker-src blob:). This file is also the page's boot
// script's (boot.js), so it holds only what making workers needs.
import { unpackEngine } from './engine.js';

/**
 * Workers built from the page's module script followed by the worker code (one
 * Blob, made once: no network, no eval), and the engine's WebAssembly for them.
 * `packed` is the page's packed WebAssembly (engine.js unpackEngine). The first
 * worker unpacks and compiles it itself, at once, while this thread draws the page,
 * and hands the compiled module back; every later worker gets that module (a
 * worker made before it exists, or in a browser that will not pass a module to a
 * worker, compiles its own). Returns {make: () => Worker, mainThread: () =>
 * Promise<{factory, wasm}> (the engine where no worker can start), started: Promise}. With
 * `startOne`, the first worker is made at once (boot.js) and is the one the first make()
 * returns; if it failed to start meanwhile, that make() throws, as a worker that cannot start
 * does. `started` settles once that worker has its packed engine in hand, or failed, or at once
 * when there is none.
 */
export function engineWorkers(engineText, workerText, packed, { startOne = false } = {}) {
  /** Give `worker` the compiled module; false where this browser cannot pass one to a worker. */
  const handOver = (worker, compiled) => {
    try {
      worker.postMessage({ engine: compiled });
      return true;
    } catch {
      return false;
    }
  };
  const url = URL.createObjectURL(new Blob([engineText, '\n', workerText], { type: 'text/javascript' }));
  let module = null;
  let markStarted;
  const started = new Promise((resolve) => {
    markStarted = resolve;
  });
  const keep = (event) => {
    if (event.data.unpacking) markStarted();
    else if (event.data.compiled) module ??= event.data.compiled;
    else return;
    event.stopImmediatePropagation(); // for here, not for the worker's channel
  };
  let early = null;
  let earlyFailed = false;
  function make() {
    if (early) {
      const worker = early;
      early = null;
      worker.removeEventListener('error', failedEarly);
      if (!earlyFailed) return worker;
      worker.terminate();
      throw new Error('the engine worker did not start');
    }
    const worker = new Worker(url, { name: 'hedgeleaf-engine' });
    if (module && handOver(worker, module)) return worker;
    worker.addEventListener('message', keep);
    worker.postMessage({ unpack: packed });
    return worker;
  }
  /** The early worker's error before a channel took it (its own handler was not there yet). */
  function failedEarly(event) {
    event.preventDefault();
    earlyFailed = true;
    markStarted();
  }
  if (startOne) {
    try {
      early = make();
      early.addEventListener('error', failedEarly);
    } catch {
      early = null; // no worker here: the channels find out for themselves
    }
  }
  if (!early) markStarted();
  async function mainThread() {
    module ??= (await unpackEngine(packed)).module;
    return { factory: globalThis.createHedgeleaf, wasm: module };
  }
  return { make, mainThread, started };
}
