// Hedgeleaf page: a refusal in the words and units of the field on screen.
//
// The engine speaks in the trade file's terms ("market.volatility: must be > 0, got -0.2":
// a path, decimals, legs counted from 0), as the CLI must. Beside a field the page says the
// same in the field's own terms: "Volatility must be above 0 %, got −20 %". It takes the limit
// and the value from the refusal's structured part (`detail`, in file units) when the engine
// gives one, else from the engine's sentence when it has the usual shape; anything else keeps
// the engine's words after the field's name.
import { formatNumber } from './format.js';
import { gridWords, isMarketTablePath } from './grid-words.js';

const relationWords = { '>': 'above', '>=': 'at least', '<': 'below', '<=': 'at most' };

/** How a field shows its value: percent fields ×100 with " %", leg numbers from 1. */
function unitOf(kind) {
  if (kind === 'percent') return { show: (x) => `${plain(x * 100)} %`, converts: true };
  if (kind === 'index') return { show: (x) => plain(x + 1), converts: true };
  return { show: plain, converts: false };
}

/** A number as a person writes it: every digit kept (to 12), grouped, a real minus. */
function plain(x) {
  const rounded = Number(x.toPrecision(12));
  const digits = Math.min(10, (String(Math.abs(rounded)).split('.')[1] ?? '').length);
  return /e/.test(String(rounded)) ? String(rounded).replace('-', '−') : formatNumber(rounded, digits);
}

/** The field's name as its label shows it, with the row it sits in: "Volatility", "Leg 2 strike". */
export function fieldName(input) {
  const own = input.getAttribute('aria-label'); // a grid's cell names its row and column
  if (own) return own;
  const holder = input.closest('label, fieldset');
  const caption = holder?.querySelector(':scope > span, :scope > legend');
  const first = caption?.firstChild;
  let name = (first?.nodeType === Node.TEXT_NODE ? first.data : (caption?.textContent ?? '')).trim();
  name = name.replace(/\s*(%|\().*$/, '').trim() || 'This field';
  const path = input.dataset.path ?? '';
  const leg = /^legs\[(\d+)\]/.exec(path);
  const dividend = /^market\.dividends\[(\d+)\]\.amount$/.exec(path);
  if (leg && !/^Leg\b/.test(name)) return `Leg ${Number(leg[1]) + 1} ${name.toLowerCase()}`;
  if (dividend) return `Dividend ${Number(dividend[1]) + 1} ${name.toLowerCase()}`;
  if (input.closest('.spot-list')) return `Spot on ${name}`;
  return name;
}

// The engine's usual shapes after "<path>: must be ": "> 0, got -0.2", ">= -0.95 (a note), got -1.2",
// "between 0 and 2, got 5", "between 1e-06 and 1e+09 (a note), got 1e-20". Short engine text, so these plain patterns cannot run long.
const oneSided = /^must be (>=|<=|>|<) (-?[\d.e+-]+)( \([^)]*\))?, got (-?[\d.e+-]+)$/;
const sidedNoteLast = /^must be (>=|<=|>|<) (-?[\d.e+-]+), got (-?[\d.e+-]+)( \([^)]*\))$/; // a grid's bound
const between = /^must be between (-?[\d.e+-]+) and (-?[\d.e+-]+)( \([^)]*\))?, got (-?[\d.e+-]+)$/;

/**
 * The refusal of `field` (the engine's `message` and optional `detail` = {value, limit, relation})
 * as shown beside `input`, in its units. Without an input (a parent path, the whole document)
 * the engine's words stand.
 */
export function screenMessage(input, field, message, detail) {
  if (!input) return message;
  const name = fieldName(input);
  const unit = unitOf(input.dataset.kind);
  if (detail && Number.isFinite(detail.value) && Number.isFinite(detail.limit) && relationWords[detail.relation])
    return `${name} must be ${relationWords[detail.relation]} ${unit.show(detail.limit)}, got ${unit.show(detail.value)}`;
  const prefix = `${field}: `;
  if (!message.startsWith(prefix)) return message;
  const rest = message.slice(prefix.length);
  const sided = oneSided.exec(rest);
  if (sided) {
    const [, relation, limit, note = '', value] = sided;
    // a note in file units ("a fraction of today's spot") would contradict converted numbers
    const tail = unit.converts ? '' : note;
    return `${name} must be ${relationWords[relation]} ${unit.show(Number(limit))}${tail}, got ${unit.show(Number(value))}`;
  }
  const late = sidedNoteLast.exec(rest);
  if (late) {
    const [, relation, limit, value, note] = late;
    return `${name} must be ${relationWords[relation]} ${unit.show(Number(limit))}, got ${unit.show(Number(value))}${unit.converts ? '' : note}`;
  }
  const range = between.exec(rest);
  if (range) {
    const [, low, high, note = '', value] = range;
    const tail = unit.converts ? '' : note;
    return `${name} must be between ${unit.show(Number(low))} and ${unit.show(Number(high))}${tail}, got ${unit.show(Number(value))}`;
  }
  if (isMarketTablePath(field)) return `${name}: ${gridWords(rest)}`;
  const words = pathsAsNames(rest);
  return `${name}: ${input.dataset.kind === 'index' ? screenNote(words).replace(fromZero, fromOne) : words}`;
}

/**
 * The trade file's paths in engine text that name a field shown on the page, as that field's
 * name ("must be after valuation_date 2026-12-03" -> "must be after Trade date 2026-12-03" for a
 * pair, "Valuation date" for a share); other words, and paths of fields not on screen, stay.
 */
function pathsAsNames(text) {
  return text.replace(/\b[a-z][a-z_]*(?:\.[a-z][a-z_]*)*\b/g, (path) => {
    if (!/[._]/.test(path)) return path; // a plain word, not a path
    const shown = [...document.querySelectorAll(`[data-path="${path}"]`)].find((node) => node.getClientRects().length);
    return shown ? fieldName(shown) : path;
  });
}

// "(0 to 2, in the order of the legs...)": the engine's count of legs from 0, on screen from 1
const fromZero = /\((\d+) to (\d+),/;
const fromOne = (_, a, b) => `(${Number(a) + 1} to ${Number(b) + 1},`;

/** Engine text shown on screen counts legs from 1, as the page does ("legs[0]", "leg 0" -> "leg 1"). */
export function screenNote(text) {
  return String(text).replace(/\blegs?(?:\[(\d+)\]| (\d+)\b)/g, (_, a, b) => `leg ${Number(a ?? b) + 1}`);
}
