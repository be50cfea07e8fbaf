// Golden outputs of the WebAssembly module: the same (command, document) pairs as
// tests/golden/run.py (tests/golden/cases.json), run through the module's run().
//
// module.json holds a SHA-256 of each envelope text the module returned when the
// goldens were last written, so a refactor is proven to leave the module's output
// identical to the bit (the module and the native CLI differ in the last digits:
// another libm and SIMD; tests/node/golden.test.mjs compares those within 1e-9).
//
//   node tests/golden/module.mjs --update [build/wasm/hedgeleaf.js]   rewrite module.json
import { createHash } from 'node:crypto';
import { readFileSync, readdirSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

const here = dirname(fileURLToPath(import.meta.url));
export const root = join(here, '../..');
export const fingerprintPath = join(here, 'module.json');

const expand = (text) => (typeof text === 'string' ? text : text.$repeat[0].repeat(text.$repeat[1]));

/** Every JSON-format run of the golden set: { key: "<case>.<command>", command, text }. */
export function goldenRuns() {
  const spec = JSON.parse(readFileSync(join(here, 'cases.json'), 'utf8'));
  const out = [];
  for (const file of readdirSync(join(root, 'examples'))
    .filter((f) => f.endsWith('.json'))
    .sort()) {
    const text = readFileSync(join(root, 'examples', file), 'utf8');
    // A comparison document (several trades) is the compare command's alone.
    const commands = 'comparison' in JSON.parse(text) ? spec.comparison_commands : spec.example_commands;
    for (const command of commands) out.push({ key: `${file.slice(0, -5)}.${command}`, command, text });
  }
  for (const c of spec.cases) {
    const text = c.doc ? JSON.stringify(c.doc) : expand(c.text);
    for (const command of c.commands) out.push({ key: `${c.name}.${command}`, command, text });
  }
  return out;
}

export const fingerprint = (text) => createHash('sha256').update(text).digest('hex');

if (process.argv[1] === fileURLToPath(import.meta.url) && process.argv[2] === '--update') {
  const modulePath = resolve(process.argv[3] ?? join(root, 'build/wasm/hedgeleaf.js'));
  const module = await createRequire(import.meta.url)(modulePath)({ print: () => {}, printErr: () => {} });
  const prints = {};
  for (const run of goldenRuns()) prints[run.key] = fingerprint(module.run(run.command, run.text));
  writeFileSync(fingerprintPath, `${JSON.stringify(prints, null, 1)}\n`);
  console.log(`golden: wrote ${Object.keys(prints).length} module fingerprints to ${fingerprintPath}`);
}
