// Hedgeleaf page: the one loader of the WebAssembly engine.
//
// Shared by the page's Web Workers, the main-thread fallback and the Node
// tests, so all of them read the engine through the same few lines. The
// contract of the module itself is wasm/hedgeleaf.d.ts.

/**
 * A refused input: `field` is the trade-document path, `message` starts with it; `detail`, when
 * the engine gives it, is {value, limit, relation} in file units (the page words it in screen units).
 */
export class EngineError extends Error {
  constructor(field, message, detail) {
    super(message);
    this.name = 'EngineError';
    this.field = field;
    if (detail) this.detail = detail;
  }
}

let loading = null;

/**
 * Load the engine once; later calls get the same promise. Rejects if the
 * runtime aborts while starting. `factory` is createHedgeleaf from the module file.
 * @returns {Promise<{version: string, commands: string[], run: (command: string, trade: object|string) => object}>}
 */
export function loadEngine(factory) {
  if (loading) return loading;
  loading = new Promise((resolve, reject) => {
    let dead = null;
    const onAbort = (what) => {
      dead = `the engine stopped (${String(what).slice(0, 200)})`;
      reject(new Error(dead));
    };
    factory({ onAbort, print: () => {}, printErr: () => {} }).then((module) => {
      resolve({
        version: module.version(),
        commands: module.commands().split(',').filter(Boolean),
        run(command, trade) {
          if (dead) throw new Error(dead);
          const text = typeof trade === 'string' ? trade : JSON.stringify(trade);
          const envelope = JSON.parse(module.run(command, text));
          if (!envelope.ok) throw new EngineError(envelope.error.field, envelope.error.message, envelope.error.detail);
          return envelope.result;
        },
      });
    }, reject);
  });
  return loading;
}
