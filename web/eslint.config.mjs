// ESLint settings for all of Hedgeleaf's JavaScript: the recommended rules plus the few
// that catch real bugs (loose equality, unused names, undeclared globals), with the
// globals each place really has: the page (browser), its engine worker (worker), the
// build, tests and benchmarks (Node; the browser tests and the page benchmark also run
// functions inside the page). Run from web/: npm run lint (the test command runs it).
// Paths in here are relative to the repository root (the scripts run from there).
import js from '@eslint/js';
import globals from 'globals';

export default [
  { ignores: ['build/**', 'dist/**', '**/node_modules/**'] },
  js.configs.recommended,
  {
    languageOptions: { ecmaVersion: 2024, sourceType: 'module' },
    linterOptions: { reportUnusedDisableDirectives: 'error' },
    rules: {
      eqeqeq: ['error', 'always'],
      'no-unused-vars': ['error', { args: 'after-used', caughtErrors: 'all', ignoreRestSiblings: true }],
      'no-undef': 'error',
      'no-shadow-restricted-names': 'error',
      'no-implicit-globals': 'error',
      'no-var': 'error',
      'prefer-const': 'error',
    },
  },
  {
    files: ['web/src/**/*.js'],
    ignores: ['web/src/worker.js', 'web/src/engine.js'],
    languageOptions: { globals: globals.browser },
  },
  {
    // the engine worker (it declares createHedgeleaf, from the engine script before it in its Blob)
    files: ['web/src/worker.js'],
    languageOptions: { globals: globals.worker },
  },
  {
    // the loader shared by the page, its workers and the Node tests: JavaScript's own globals
    // and the few that browsers, workers and Node 20 all have
    files: ['web/src/engine.js'],
    languageOptions: {
      globals: {
        atob: 'readonly',
        DecompressionStream: 'readonly',
        Response: 'readonly',
        WebAssembly: 'readonly',
      },
    },
  },
  {
    files: ['web/*.mjs', 'tests/**/*.mjs', 'bench/**/*.mjs'],
    languageOptions: { globals: globals.node },
  },
  {
    // page.evaluate(() => ...) bodies run in the page
    files: ['tests/browser/**/*.mjs', 'bench/page_bench.mjs', 'web/screenshot.mjs'],
    languageOptions: { globals: { ...globals.node, ...globals.browser } },
  },
];
