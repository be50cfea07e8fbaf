// Hedgeleaf page: engine calls on a Web Worker, one at a time, cancellable.
//
// A channel owns one worker (workers.js makes them: the first compiles the
// engine's WebAssembly and every later one is handed that compiled module, so
// it is compiled once). cancel() terminates the worker mid-run; the next call
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

/** A promise that resolves after `ms` milliseconds (a task of its own for 0). */
export const delay = (ms) => new Promise((resolve) => setTimeout(resolve, ms));

const readyTimes = new WeakMap();
/**
 * When the worker had `result` ready (ms since the epoch, by the worker's clock:
 * performance.timeOrigin + now), whatever kept this thread from taking it; null
 * for a result worked out on this thread or that is no object.
 */
export function readyTime(result) {
  return (result && typeof result === 'object' && readyTimes.get(result)) || null;
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

  /**
   * Start the worker now, if none runs, so that it loads the engine before the first call
   * comes (calls start one anyway). False where no worker can start: calls run here.
   */
  start() {
    if (this.worker) return true;
    if (this.inline) return false;
    try {
      this.worker = this.makeWorker();
    } catch {
      // no worker here (a browser that refuses them from this page): run on the main thread
      this.inline = true;
      return false;
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
    return true;
  }

  /** Run one command; resolves with its result, rejects with EngineError, Cancelled or Error. */
  call(command, trade) {
    if (this.held) return this.held.then(() => this.call(command, trade));
    if (!this.start()) return this.callInline(command, trade);
    const id = this.nextId++;
    return new Promise((resolve, reject) => {
      this.pending.set(id, { resolve, reject, command, trade });
      this.worker.postMessage({ id, command, trade });
    });
  }

  /** Have the worker, if one runs, optimise the engine's code now on `trade` and its own (worker.js), ahead of the user's edits. */
  warmUp(trade) {
    if (this.worker && !this.held) this.worker.postMessage({ warmUp: trade ?? true });
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
    if (message.error)
      entry.reject(
        new EngineError(message.error.field, message.error.message, message.error.detail, message.error.kind),
      );
    else if (message.fatal) {
      entry.reject(new Error(message.fatal));
      this.fail(new Error(message.fatal)); // an aborted runtime is dead: start afresh next time
    } else {
      if (message.result && typeof message.result === 'object' && message.ready)
        readyTimes.set(message.result, message.ready);
      entry.resolve(message.result);
    }
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
    await delay(0); // let the page paint first
    try {
      return engine.run(command, trade);
    } finally {
      this.markAnswered();
    }
  }
}
