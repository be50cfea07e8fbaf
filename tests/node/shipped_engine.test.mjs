// The engine as the page ships it: dist/hedgeleaf.html carries the module's
// JavaScript with the WebAssembly taken out, and the WebAssembly gzip-compressed
// in base64 (web/build.mjs packModule). These tests take both out of the built
// page and load them the way the page does (web/src/engine.js: unpackEngine with
// DecompressionStream, then loadEngine with the compiled module), then check:
//   - the page's parts put back together are exactly build/wasm/hedgeleaf.js;
//   - every command on every example gives the same envelope, character for
//     character, as the module file loaded by Node the usual way;
//   - the module never tries to fetch anything (the page's policy refuses it);
//   - the page stays under its size budget (1 MiB, for e-mail and chat).
import assert from 'node:assert/strict';
import { existsSync, readFileSync, readdirSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { test } from 'node:test';
import { fileURLToPath } from 'node:url';
import { gunzipSync } from 'node:zlib';
import vm from 'node:vm';

import { loadEngine, unpackEngine } from '../../web/src/engine.js';
import { dropCommentLines, maxBytes, packModule } from '../../web/build.mjs';

const root = join(dirname(fileURLToPath(import.meta.url)), '../..');
const pagePath = join(root, 'dist/hedgeleaf.html');
const modulePath = join(root, 'build/wasm/hedgeleaf.js');
const built = existsSync(pagePath) && existsSync(modulePath);
const skip = !built && 'build the module and the page first';

const page = built ? readFileSync(pagePath, 'utf8') : '';
const inline = (id) => {
  const found = new RegExp(`<script(?: type="[^"]+")? id="${id}">([\\s\\S]*?)</script>`).exec(page);
  assert.ok(found, `the page has no #${id} script`);
  return found[1];
};

/**
 * createHedgeleaf from the page's module script, run as in the page's worker: a worker
 * scope (importScripts, self.location, no Node process) whose `fetch` only records.
 */
function pageFactory(fetches) {
  const names = ['importScripts', 'self', 'process', 'require', 'module', 'exports', 'fetch'];
  const run = vm.compileFunction(`${inline('engine-js')}\nreturn createHedgeleaf;`, names);
  const fetch = (url) => {
    fetches.push(String(url).slice(0, 60));
    return Promise.reject(new Error('no fetch in the page'));
  };
  const self = { location: { href: 'blob:null/engine' } };
  return run(() => {}, self, undefined, undefined, undefined, undefined, fetch);
}

test('the page carries exactly the module file: its script, and its WebAssembly packed', { skip }, () => {
  const moduleText = readFileSync(modulePath, 'utf8');
  const { script, packed } = packModule(moduleText);
  assert.equal(inline('engine-js'), script);
  const wasm = gunzipSync(Buffer.from(inline('engine-wasm'), 'base64'));
  const embedded = /data:application\/octet-stream;base64,([A-Za-z0-9+/]+=*)/.exec(moduleText)[1];
  assert.ok(wasm.equals(Buffer.from(embedded, 'base64')), 'the unpacked WebAssembly differs from the module file');
  assert.equal(inline('engine-wasm'), packed);
  assert.ok(!/data:application\/octet-stream;base64,[A-Za-z0-9+/]/.test(inline('engine-js')), 'a second copy');
});

test('the page build drops whole-line comments and nothing else', () => {
  const source = [
    '// a comment line',
    'const a = 1; // after code: kept',
    '/**',
    ' * a block',
    ' */',
    '/* one line */',
    '/* before code */ const b = 2;',
    'const c = `',
    '// inside a template: kept',
    '`;',
    '  // indented',
    'const d = "//";',
  ].join('\n');
  assert.equal(
    dropCommentLines(source),
    [
      'const a = 1; // after code: kept',
      '/* before code */ const b = 2;',
      'const c = `',
      '// inside a template: kept',
      '`;',
      'const d = "//";',
    ].join('\n'),
  );
});

test('the page stays under 1 MiB', { skip }, () => {
  const size = Buffer.byteLength(page);
  assert.equal(maxBytes, 1024 * 1024);
  assert.ok(size < maxBytes, `the page is ${size} bytes`);
});

test('loaded as the page loads it, the engine answers every example as the module file does', { skip }, async () => {
  const fetches = [];
  const { module } = await unpackEngine(inline('engine-wasm'));
  assert.ok(module instanceof WebAssembly.Module);
  const shipped = await loadEngine(pageFactory(fetches), module);
  const reference = await createRequire(import.meta.url)(modulePath)({ print: () => {}, printErr: () => {} });
  assert.equal(shipped.version, reference.version());
  assert.deepEqual(shipped.commands, reference.commands().split(','));
  let compared = 0;
  for (const name of readdirSync(join(root, 'examples')).filter((f) => f.endsWith('.json'))) {
    const text = readFileSync(join(root, 'examples', name), 'utf8');
    for (const command of shipped.commands) {
      if (command === 'simulate') continue; // seconds each; the module tests cover it
      const expected = JSON.parse(reference.run(command, text));
      let got;
      try {
        got = { ok: true, result: shipped.run(command, text) };
      } catch (err) {
        got = { ok: false, error: { field: err.field, message: err.message, kind: err.kind } };
        if (err.detail) got.error.detail = err.detail;
      }
      assert.deepEqual(got, expected, `${command} ${name}`);
      compared += 1;
    }
  }
  assert.ok(compared >= 12, `only ${compared} comparisons`);
  assert.deepEqual(fetches, [], 'the module fetched something');
});

test(
  'without the compiled module the page script would fetch its own bytes (so the check above can fail)',
  { skip },
  async () => {
    const fetches = [];
    await assert.rejects(pageFactory(fetches)({ print: () => {}, printErr: () => {}, onAbort: () => {} }));
    assert.deepEqual(fetches, ['data:application/octet-stream;base64,']);
  },
);
