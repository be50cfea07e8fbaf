// Hedgeleaf page build: one self-contained dist/hedgeleaf.html, no npm packages.
//
//   node web/build.mjs [--module build/wasm/hedgeleaf.js] [--out dist/hedgeleaf.html]
//
// Inlines the engine module, the page's JS modules (bundled here: each becomes
// a function scope, imports become destructured constants), the CSS, the icon
// and an example trade. The module file holds its WebAssembly as base64
// (-sSINGLE_FILE=1, so Node loads the same file); the page carries those bytes
// gzip-compressed instead (packModule: 0.9 MB of base64 become 0.3 MB) and
// unpacks them with the browser's DecompressionStream (web/src/engine.js). The
// Content Security Policy allows exactly the inline scripts and style by their
// SHA-256 hashes, plus 'wasm-unsafe-eval' to compile the engine; nothing may
// load from anywhere, so the page works opened from disk with no network.
import { createHash } from 'node:crypto';
import { mkdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { gzipSync } from 'node:zlib';
import { createRequire } from 'node:module';
import { dirname, join, relative, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

const web = dirname(fileURLToPath(import.meta.url));
const root = dirname(web);
/** Under 1 MiB, so that the page goes by e-mail and chat (tests/node/page.test.mjs checks it too). */
export const maxBytes = 1024 * 1024;

function option(name, fallback) {
  const i = process.argv.indexOf(name);
  return i > 0 ? resolve(process.argv[i + 1]) : fallback;
}
const modulePath = option('--module', join(root, 'build/wasm/hedgeleaf.js'));
const outPath = option('--out', join(root, 'dist/hedgeleaf.html'));
const examplePath = join(root, 'examples/american-put.json');

/**
 * `source` without its whole-line comments (lines that start with // and blocks that
 * start a line with /*), which are for readers of web/src, not for the page's size.
 * Comments after code stay; nothing inside a template literal is touched.
 */
export function dropCommentLines(source) {
  const kept = [];
  let inBlock = false;
  let inTemplate = false;
  for (const line of source.split('\n')) {
    const text = line.trim();
    if (inBlock) inBlock = !text.endsWith('*/');
    else if (!inTemplate && text.startsWith('//')) continue;
    else if (!inTemplate && text.startsWith('/*') && (!text.includes('*/') || text.endsWith('*/')))
      inBlock = !text.endsWith('*/');
    else {
      kept.push(line);
      // an odd number of backticks opens or closes a template literal that spans lines
      if ((line.match(/`/g)?.length ?? 0) % 2) inTemplate = !inTemplate;
    }
  }
  return kept.join('\n');
}

/** Bundle an ES module and what it imports (named imports/exports only) into one script. */
export function bundle(entry) {
  const modules = [];
  const state = new Map();
  const importPattern = /^import\s*\{([^}]*)\}\s*from\s*'([^']+)';[ \t]*$/gm;
  function visit(file) {
    if (state.get(file) === 'done') return;
    if (state.get(file) === 'open') throw new Error(`import cycle through ${relative(root, file)}`);
    state.set(file, 'open');
    const source = dropCommentLines(readFileSync(file, 'utf8'));
    const imports = [...source.matchAll(importPattern)].map((m) => ({
      names: m[1],
      file: resolve(dirname(file), m[2]),
    }));
    for (const dep of imports) visit(dep.file);
    state.set(file, 'done');
    modules.push({ file, source, imports });
  }
  visit(resolve(entry));
  const ids = new Map(modules.map((m, i) => [m.file, `module${i}`]));
  const parts = modules.map(({ file, source, imports }) => {
    const exported = [];
    let body = source.replace(importPattern, '');
    body = body.replace(
      /^export\s+((?:async\s+)?(?:function\*?|class|const|let)\s+([A-Za-z_$][\w$]*))/gm,
      (_, decl, name) => {
        exported.push(name);
        return decl;
      },
    );
    body = body.replace(/^export\s*\{([^}]*)\};?[ \t]*$/gm, (_, names) => {
      exported.push(
        ...names
          .split(',')
          .map((n) => n.trim())
          .filter(Boolean),
      );
      return '';
    });
    if (/^\s*(import|export)\b/m.test(body))
      throw new Error(`${relative(root, file)}: only named imports and exports are bundled`);
    const bindings = imports
      .map(({ names, file: dep }) => {
        const list = names
          .split(',')
          .map((n) => n.trim())
          .filter(Boolean)
          .map((n) => n.replace(/\s+as\s+/, ': '));
        return `const { ${list.join(', ')} } = ${ids.get(dep)};\n`;
      })
      .join('');
    return `// ${relative(root, file)}\nconst ${ids.get(file)} = (() => {\n${bindings}${body}\nreturn { ${exported.join(', ')} };\n})();\n`;
  });
  return `(() => {\n'use strict';\n${parts.join('\n')}})();\n`;
}

// Where the module file keeps its WebAssembly: one string literal in its glue.
const embeddedWasm = /(["'])data:application\/octet-stream;base64,([A-Za-z0-9+/]+=*)\1/g;

/**
 * Split the module file's text into its JavaScript, with the embedded WebAssembly
 * left out (an empty data: URL in its place, never read: the page hands the module
 * its compiled code), and the WebAssembly itself, gzip-compressed, in base64.
 */
export function packModule(moduleText) {
  const found = [...moduleText.matchAll(embeddedWasm)];
  if (found.length !== 1)
    throw new Error(`expected the module to embed its WebAssembly once as a data: URL, found ${found.length}`);
  const wasm = Buffer.from(found[0][2], 'base64');
  if (wasm.readUInt32BE(0) !== 0x0061736d) throw new Error('the embedded data: URL is not WebAssembly');
  const quote = found[0][1];
  return {
    script: moduleText.replace(embeddedWasm, `${quote}data:application/octet-stream;base64,${quote}`),
    packed: gzipSync(wasm, { level: 9 }).toString('base64'),
    wasmBytes: wasm.length,
  };
}

const sha256 = (text) => `'sha256-${createHash('sha256').update(text, 'utf8').digest('base64')}'`;

function inlineSafe(text, tag, what) {
  if (new RegExp(`</${tag}`, 'i').test(text))
    throw new Error(`${what} contains </${tag}, which would end its inline element`);
  return text;
}

async function engineFacts() {
  const factory = createRequire(import.meta.url)(modulePath);
  const engine = await factory({ print: () => {}, printErr: () => {} });
  return { version: engine.version(), commands: engine.commands() };
}

async function main() {
  const engine = packModule(readFileSync(modulePath, 'utf8'));
  const engineJs = inlineSafe(engine.script, 'script', 'the engine module');
  const { version, commands } = await engineFacts();
  const appJs = inlineSafe(bundle(join(web, 'src/main.js')), 'script', 'the page script');
  const workerJs = inlineSafe(bundle(join(web, 'src/worker.js')), 'script', 'the worker script');
  const bootJs = inlineSafe(bundle(join(web, 'src/boot.js')), 'script', 'the boot script');
  const css = inlineSafe(readFileSync(join(web, 'style.css'), 'utf8'), 'style', 'the style sheet');
  const icon = `data:image/svg+xml;base64,${readFileSync(join(web, 'icons/leaf.svg')).toString('base64')}`;
  const example = JSON.stringify(JSON.parse(readFileSync(examplePath, 'utf8'))).replace(/</g, '\\u003c');

  const csp = [
    "default-src 'none'",
    `script-src ${sha256(engineJs)} ${sha256(bootJs)} ${sha256(appJs)} 'wasm-unsafe-eval'`,
    `style-src ${sha256(css)}`,
    'img-src data: blob:',
    'worker-src blob:',
    "base-uri 'none'",
    "form-action 'none'",
  ].join('; ');

  let html = readFileSync(join(web, 'index.html'), 'utf8');
  const fill = (marker, text) => {
    if (!html.includes(marker)) throw new Error(`index.html lacks ${marker}`);
    html = html.split(marker).join(text);
  };
  fill('<!--CSP-->', `<meta http-equiv="Content-Security-Policy" content="${csp}">`);
  fill('<!--ICON-->', icon);
  fill('/*STYLE*/', css);
  fill(
    '<!--TRADE-->',
    `<script type="application/json" id="example-trade">${example}</script>\n` +
      '<script type="application/json" id="embedded-trade"></script>\n' +
      `<script type="text/plain" id="engine-commands">${commands}</script>`,
  );
  fill(
    '<!--ENGINE-->',
    `<script id="engine-js">${engineJs}</script>\n` +
      `<script type="application/octet-stream" id="engine-wasm">${engine.packed}</script>`,
  );
  fill('<!--WORKER-->', `<script type="text/plain" id="worker-js">${workerJs}</script>`);
  fill('<!--BOOT-->', `<script id="boot-js">${bootJs}</script>`);
  fill('<!--APP-->', `<script id="app-js">${appJs}</script>`);

  mkdirSync(dirname(outPath), { recursive: true });
  writeFileSync(outPath, html);
  const size = statSync(outPath).size;
  console.log(
    `${relative(process.cwd(), outPath)}: ${(size / 1024).toFixed(0)} KiB (WebAssembly ${(engine.wasmBytes / 1024).toFixed(0)} KiB, ` +
      `packed ${(engine.packed.length / 1024).toFixed(0)} KiB), engine ${version}, commands ${commands}`,
  );
  if (size >= maxBytes) throw new Error(`the page is ${size} bytes, over the ${maxBytes}-byte budget`);
}

if (process.argv[1] && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  main().catch((err) => {
    console.error(`web/build.mjs: ${err.message}`);
    process.exit(1);
  });
}
