// Hedgeleaf page: engine calls on a Web Worker, one at a time, cancellable.
//
// A channel owns one worker built from a Blob of the module's JavaScript plus
// the worker code (no network, no eval; CSP worker-src blob:); each new worker
// is handed the engine's WebAssembly compiled once by the page, so no worker
// compiles it again. cancel() terminates the worker mid-run; the next call
// starts a fresh one. Where a worker cannot start, calls run on the main thread
// through the same loader.
import { EngineError, loadEngine } from './engine.js';

/** Raised for calls cut short by cancel(). */
export class Cancelled extends Error {
  constructor() {
    super('cancelled');
    this.name = 'Cancelled';
  }
}

/**
 * Mark a call started ahead of its turn as handled, so that a rejection nobody
 * awaits (the price failed first, a newer edit came) is not reported as
 * unhandled; awaiting the returned promise still throws.
 */
export function started(promise) {
  promise.catch(() => {});
  return promise;
}

/**
 * Workers built from the page's module script followed by the worker code (one
 * Blob, made once: no network, no eval). `compiled` is the promise of the
 * engine's {module, bytes} (engine.js unpackEngine); each worker gets the compiled
 * module (its bytes where a browser will not pass a module to a worker). Returns
 * a function that starts one.
 */
export function workerMaker(engineText, workerText, compiled) {
  const url = URL.createObjectURL(new Blob([engineText, '\n', workerText], { type: 'text/javascript' }));
  return () => {
    const worker = new Worker(url, { name: 'hedgeleaf-engine' });
    compiled.then(
      ({ module, bytes }) => {
        try {
          worker.postMessage({ engine: module });
        } catch {
          worker.postMessage({ engine: bytes });
        }
      },
      (err) => worker.postMessage({ engineFailed: String(err.message || err) }),
    );
    return worker;
  };
}

export class EngineChannel {
  /**
   * @param {() => Worker} makeWorker
   * @param {() => Promise<{factory: Function, wasm: WebAssembly.Module}>} mainThreadFactory the engine for the main thread
   */
  constructor(makeWorker, mainThreadFactory) {
    this.makeWorker = makeWorker;
    this.mainThreadFactory = mainThreadFactory;
    this.held = null;
    this.worker = null;
    this.pending = new Map();
    this.nextId = 1;
    this.inline = false;
    this.proven = false;
    /** Settles when this channel has answered its first call. */
    this.answered = new Promise((resolve) => {
      this.markAnswered = resolve;
    });
  }

  /**
   * Post no call before `promise` settles (calls made meanwhile wait for it), so that
   * another channel's first result comes first. Returns this channel.
   */
  holdUntil(promise) {
    const held = promise.then(
      () => {},
      () => {},
    );
    this.held = held;
    held.then(() => {
      if (this.held === held) this.held = null;
    });
    return this;
  }

  /** Run one command; resolves with its result, rejects with EngineError, Cancelled or Error. */
  call(command, trade) {
    if (this.held) return this.held.then(() => this.call(command, trade));
    if (this.inline) return this.callInline(command, trade);
    if (!this.worker) {
      try {
        this.worker = this.makeWorker();
      } catch {
        // no worker here (a browser that refuses them from this page): run on the main thread
        this.inline = true;
        return this.callInline(command, trade);
      }
      this.worker.onmessage = (event) => {
        this.proven = true;
        if (event.data.problem) console.error(`Hedgeleaf engine worker: ${event.data.problem}`);
        else this.settle(event.data);
      };
      this.worker.onerror = (event) => {
        event.preventDefault();
        if (!this.proven) {
          // the browser would not start a worker from this page: run here instead
          const waiting = [...this.pending.values()];
          this.pending.clear();
          this.worker.terminate();
          this.worker = null;
          this.inline = true;
          for (const entry of waiting) this.callInline(entry.command, entry.trade).then(entry.resolve, entry.reject);
          return;
        }
        this.fail(new Error(`the engine worker failed: ${event.message || 'unknown error'}`));
      };
    }
    const id = this.nextId++;
    return new Promise((resolve, reject) => {
      this.pending.set(id, { resolve, reject, command, trade });
      this.worker.postMessage({ id, command, trade });
    });
  }

  /** Have the worker, if one runs, optimise the engine's code now (worker.js), ahead of the user's edits. */
  warmUp() {
    if (this.worker && !this.held) this.worker.postMessage({ warmUp: true });
  }

  /** True while a call is running on the worker. */
  get busy() {
    return this.pending.size > 0;
  }

  /** Stop whatever runs now; pending calls reject with Cancelled. */
  cancel() {
    this.fail(new Cancelled());
  }

  settle(message) {
    this.markAnswered();
    const entry = this.pending.get(message.id);
    if (!entry) return;
    this.pending.delete(message.id);
    if (message.error) entry.reject(new EngineError(message.error.field, message.error.message));
    else if (message.fatal) {
      entry.reject(new Error(message.fatal));
      this.fail(new Error(message.fatal)); // an aborted runtime is dead: start afresh next time
    } else entry.resolve(message.result);
  }

  fail(error) {
    if (this.worker) this.worker.terminate();
    this.worker = null;
    const entries = [...this.pending.values()];
    this.pending.clear();
    for (const entry of entries) entry.reject(error);
  }

  async callInline(command, trade) {
    const { factory, wasm } = await this.mainThreadFactory();
    const engine = await loadEngine(factory, wasm);
    await new Promise((resolve) => setTimeout(resolve, 0)); // let the page paint first
    try {
      return engine.run(command, trade);
    } finally {
      this.markAnswered();
    }
  }
}
