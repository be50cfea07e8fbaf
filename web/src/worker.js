// Hedgeleaf page: the Web Worker that runs engine commands off the main thread.
//
// The page builds this worker from a Blob holding the inlined module script
// (which defines createHedgeleaf) followed by this code, so the worker needs
// no network and no eval. Messages in: {id, command, trade}; out: {id, result}
// or {id, error: {field, message}} or {id, fatal} when the engine cannot run.
import { EngineError, loadEngine } from './engine.js';

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
};
