// Hedgeleaf page: the one loader of the WebAssembly engine.
//
// Shared by the page, its Web Workers and the Node tests, so all of them read
// the engine through the same few lines. The contract of the module itself is
// wasm/hedgeleaf.d.ts.
//
// The page carries the engine's WebAssembly gzip-compressed, in base64, beside
// the module's JavaScript (web/build.mjs takes it out of the module file, which
// holds it uncompressed). The page unpacks and compiles it once (unpackEngine)
// and hands the compiled module to every worker; loadEngine gives it to the
// module through `instantiateWasm`, so the module never fetches its own bytes
// (a fetch of a data: URL that the page's security policy refuses).

/**
 * A refused input: `field` is the trade-document path, `message` starts with it; `detail`, when
 * the engine gives it, is {value, limit, relation} in file units (the page words it in screen units);
 * `kind` is the engine's "input" | "budget" | "internal".
 */
export class EngineError extends Error {
  constructor(field, message, detail, kind) {
    super(message);
    this.name = 'EngineError';
    this.field = field;
    if (kind) this.kind = kind;
    if (detail) this.detail = detail;
  }
}

/** The bytes of base64 `text` (where there is no Uint8Array.fromBase64, atob gives one character per byte). */
function base64Bytes(text) {
  if (typeof Uint8Array.fromBase64 === 'function') return Uint8Array.fromBase64(text);
  const chars = atob(text);
  const bytes = new Uint8Array(chars.length);
  for (let i = 0; i < chars.length; i += 1) bytes[i] = chars.charCodeAt(i);
  return bytes;
}

/**
 * The engine's WebAssembly from the page's packed text (base64 of gzip bytes):
 * unzipped with the browser's DecompressionStream, then compiled once.
 * @returns {Promise<{module: WebAssembly.Module}>}
 */
export async function unpackEngine(packed) {
  // (a Response's body, not a Blob's stream: WebKit cannot read a Blob in a worker of a file:// page)
  const unzipped = new Response(base64Bytes(packed.trim())).body.pipeThrough(new DecompressionStream('gzip'));
  const bytes = await new Response(unzipped).arrayBuffer();
  return { module: await WebAssembly.compile(bytes) };
}

let loading = null;

/**
 * Load the engine once; later calls get the same promise. Rejects if the
 * runtime aborts while starting. `factory` is createHedgeleaf from the module
 * file; `wasm`, when given, is the engine's compiled WebAssembly.Module (or its
 * bytes), which the module then uses instead of the copy inside its own file.
 * @returns {Promise<{version: string, commands: string[], run: (command: string, trade: object|string) => object}>}
 */
export function loadEngine(factory, wasm) {
  if (loading) return loading;
  loading = new Promise((resolve, reject) => {
    let dead = null;
    const onAbort = (what) => {
      dead = `the engine stopped (${String(what).slice(0, 200)})`;
      reject(new Error(dead));
    };
    const options = { onAbort, print: () => {}, printErr: () => {} };
    if (wasm) {
      // The module calls this instead of finding its bytes itself; it waits for receive().
      options.instantiateWasm = (imports, receive) => {
        WebAssembly.instantiate(wasm, imports).then(
          (made) => (made instanceof WebAssembly.Instance ? receive(made) : receive(made.instance)),
          reject,
        );
        return {};
      };
    }
    factory(options).then((module) => {
      resolve({
        version: module.version(),
        commands: module.commands().split(',').filter(Boolean),
        run(command, trade) {
          if (dead) throw new Error(dead);
          const text = typeof trade === 'string' ? trade : JSON.stringify(trade);
          const envelope = JSON.parse(module.run(command, text));
          if (!envelope.ok)
            throw new EngineError(
              envelope.error.field,
              envelope.error.message,
              envelope.error.detail,
              envelope.error.kind,
            );
          return envelope.result;
        },
      });
    }, reject);
  });
  return loading;
}
