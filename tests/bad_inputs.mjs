// Reading tests/bad_inputs.json from JavaScript (the Node module test and the browser
// test); the same rules as caseText in tests/bad_inputs_cli.py and tests/bad_inputs_test.cpp.
import { readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const here = dirname(fileURLToPath(import.meta.url));

/** The table: {bases, cases: [{kind, name, command, base, patch | text, field, message}]}. */
export const badInputs = JSON.parse(readFileSync(join(here, 'bad_inputs.json'), 'utf8'));

/** RFC 7386 JSON merge patch: objects merge, null removes, anything else replaces. */
export function mergePatch(target, patch) {
  if (patch === null || typeof patch !== 'object' || Array.isArray(patch)) return patch;
  const out = target && typeof target === 'object' && !Array.isArray(target) ? { ...target } : {};
  for (const [key, value] of Object.entries(patch)) {
    if (value === null) delete out[key];
    else out[key] = mergePatch(out[key], value);
  }
  return out;
}

/** {"$repeat": [s, n]} -> s repeated n times, anywhere in the document. */
export function expand(node) {
  if (Array.isArray(node)) return node.map(expand);
  if (node && typeof node === 'object') {
    const keys = Object.keys(node);
    if (keys.length === 1 && keys[0] === '$repeat') return node.$repeat[0].repeat(node.$repeat[1]);
    return Object.fromEntries(keys.map((k) => [k, expand(node[k])]));
  }
  return node;
}

/** The text a case feeds to the engine. */
export function caseText(c) {
  if ('text' in c) return c.text;
  return JSON.stringify(expand(mergePatch(structuredClone(badInputs.bases[c.base]), c.patch)));
}
