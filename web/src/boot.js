// Hedgeleaf page: the engine's first worker, started from the page's <head>.
//
// This small script runs before the browser parses the page's body, so the first
// engine worker starts, unpacks and compiles the WebAssembly while the body is
// parsed and the page script (main.js, at the end of the body) builds the form: a
// worker made from the page script would start only once that script and the
// first layout were done, some 200 ms later on a 2-core laptop. It hands the page
// script the workers' factory (workers.js engineWorkers), whose first worker is
// this one. A page where this script did not run makes its workers itself.
import { engineWorkers } from './workers.js';

const text = (id) => document.getElementById(id).textContent;
globalThis.hedgeleafWorkers = engineWorkers(text('engine-js'), text('worker-js'), text('engine-wasm'), {
  startOne: true,
});
