// Hedgeleaf page: engine calls on a Web Worker, one at a time, cancellable.
//
// A channel owns one worker built from a Blob of the inlined module script plus
// the worker code (no network, no eval; CSP worker-src blob:). cancel()
// terminates the worker mid-run; the next call starts a fresh one. Where a
// worker cannot start, calls run on the main thread through the same loader.
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
 * Workers built from the page's inlined engine module followed by the worker code
 * (one Blob, made once: no network, no eval). Returns a function that starts one.
 */
export function workerMaker(engineText, workerText) {
  const url = URL.createObjectURL(new Blob([engineText, '\n', workerText], { type: 'text/javascript' }));
  return () => new Worker(url, { name: 'hedgeleaf-engine' });
}

export class EngineChannel {
  /** @param {() => Worker} makeWorker  @param {() => Function} mainThreadFactory */
  constructor(makeWorker, mainThreadFactory) {
    this.makeWorker = makeWorker;
    this.mainThreadFactory = mainThreadFactory;
    this.worker = null;
    this.pending = new Map();
    this.nextId = 1;
    this.inline = false;
    this.proven = false;
  }

  /** Run one command; resolves with its result, rejects with EngineError, Cancelled or Error. */
  call(command, trade) {
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
        this.settle(event.data);
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

  /** True while a call is running on the worker. */
  get busy() {
    return this.pending.size > 0;
  }

  /** Stop whatever runs now; pending calls reject with Cancelled. */
  cancel() {
    this.fail(new Cancelled());
  }

  settle(message) {
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
    const engine = await loadEngine(this.mainThreadFactory());
    await new Promise((resolve) => setTimeout(resolve, 0)); // let the page paint first
    return engine.run(command, trade);
  }
}
