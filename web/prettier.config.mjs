// Prettier settings for all of Hedgeleaf's JavaScript (the page, its build, the Node and
// browser tests, the benchmarks): close to how the code was written by hand.
// Run from web/: npm run format (write) or npm run format:check (what the test command runs).
export default {
  printWidth: 120,
  singleQuote: true,
  trailingComma: 'all',
  tabWidth: 2,
  semi: true,
  arrowParens: 'always',
  endOfLine: 'lf',
};
