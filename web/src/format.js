// Hedgeleaf page: numbers on screen and numbers typed in.
//
// Display: in the browser's locale (1,234,567.89 in en-US, 1.234.567,89 in de-DE), a real
// minus. Input: read as people in that locale type them (numbers.js); percentages are typed
// in percent and stored as the file's decimals (31 -> 0.31) here and only here.
import { decimalText, groupedText, pageLocale, readNumber } from './numbers.js';

const groups = new Map();
function formatter(digits) {
  const key = `${pageLocale()}|${digits}`;
  if (!groups.has(key)) {
    groups.set(
      key,
      new Intl.NumberFormat(pageLocale(), {
        minimumFractionDigits: digits,
        maximumFractionDigits: digits,
        numberingSystem: 'latn',
      }),
    );
  }
  return groups.get(key);
}

const dateFormats = new Map();
/** The locale's date format (day, month and year in its order), made once per locale and kind. */
function dateFormat(withTime) {
  const key = `${pageLocale()}|${withTime}`;
  if (!dateFormats.has(key)) {
    const time = withTime ? { hour: '2-digit', minute: '2-digit' } : { timeZone: 'UTC' };
    dateFormats.set(
      key,
      new Intl.DateTimeFormat(pageLocale(), {
        day: '2-digit',
        month: '2-digit',
        year: 'numeric',
        ...time,
        numberingSystem: 'latn',
      }),
    );
  }
  return dateFormats.get(key);
}

/** A file's date "2027-12-02" as the locale writes it (02/12/2027, 12/02/2027, 02.12.2027); other text as it is. */
export function formatDate(iso) {
  const match = typeof iso === 'string' ? /^(\d{4})-(\d{2})-(\d{2})$/.exec(iso) : null;
  if (!match) return iso;
  return dateFormat(false).format(Date.UTC(Number(match[1]), Number(match[2]) - 1, Number(match[3])));
}

/**
 * A time the user typed ("2026-12-02T17:00Z", "2026-12-02"): its date in the locale's order, the
 * time of day and zone as written. Null stays null; text that is no date stays as typed.
 */
export function formatWhen(text) {
  if (typeof text !== 'string' || !text.trim()) return null;
  const match = /^(\d{4}-\d{2}-\d{2})(?:[T ](.*))?$/.exec(text.trim());
  if (!match) return text;
  return match[2] ? `${formatDate(match[1])} ${match[2]}` : formatDate(match[1]);
}

/** A moment (the time a sheet is made) in the locale, with the computer's offset from UTC. */
export function formatStamp(moment) {
  const offset = -moment.getTimezoneOffset();
  const hours = String(Math.abs(offset / 60)).padStart(2, '0');
  return `${dateFormat(true).format(moment)} (UTC${offset >= 0 ? '+' : '−'}${hours})`;
}

/** 1234.5 -> "1,234.50"; null/NaN -> "–". */
export function formatNumber(value, digits = 2) {
  if (value === null || value === undefined || !Number.isFinite(value)) return '–';
  const text = formatter(digits).format(value);
  return text.replace(/^-/, '−').replace(/^−(0([.,]0+)?)$/, '$1');
}

/** Digits that keep about `significant` significant figures (at least `min`, at most 8 decimals). */
export function smartDigits(value, significant = 4, min = 2) {
  if (!Number.isFinite(value) || value === 0) return min;
  const magnitude = Math.floor(Math.log10(Math.abs(value)));
  return Math.max(min, Math.min(8, significant - 1 - magnitude));
}

/** Format keeping significant figures for small numbers (gamma, error estimates). */
export function formatSmart(value, significant = 4, min = 2) {
  if (Number.isFinite(value) && Math.abs(value) < 5e-9) return formatNumber(0, min); // rounding noise, not a figure
  return formatNumber(value, smartDigits(value, significant, min));
}

/** 0.3125 -> "31.25 %" */
export function formatPercent(decimal, digits = 2) {
  if (decimal === null || decimal === undefined || !Number.isFinite(decimal)) return '–';
  return `${formatNumber(decimal * 100, digits)} %`;
}

/**
 * Read a typed number. Returns a number, null for an empty field, or the trimmed
 * text when the page cannot read it (the page then says why beside the field).
 */
export function parseNumber(text) {
  const read = readNumber(text);
  if (read.empty) return null;
  return read.problem ? String(text).trim() : read.value;
}

/** A percent field: "31" -> 0.31 (exact to the digits typed, no 0.31000000000000005). */
export function parsePercent(text) {
  const value = parseNumber(text);
  if (typeof value !== 'number') return value;
  return Number((value / 100).toPrecision(15));
}

/** Decimal -> the text a percent field shows: 0.31 -> "31", 0.035 -> "3.5" ("3,5" in de-DE). */
export function percentText(decimal) {
  if (typeof decimal !== 'number') return decimal ?? '';
  return decimalText(Number((decimal * 100).toPrecision(12)));
}

/** A number as an input shows it: grouped, every digit kept (25000 -> "25,000"). */
export function inputText(value) {
  if (typeof value !== 'number') return value ?? '';
  if (!Number.isFinite(value)) return String(value);
  return groupedText(value);
}

/**
 * A tenor: "0.5" (years), "6m", "18M", "2y", "90d", "3w" -> years (days ACT/365F).
 * Returns null for empty, the text itself when it cannot be read.
 */
export function parseTenor(text) {
  const trimmed = String(text ?? '').trim();
  if (trimmed === '') return null;
  const last = trimmed.slice(-1).toLowerCase();
  const unit = 'dwmy'.includes(last) ? last : '';
  const amount = parseNumber(unit ? trimmed.slice(0, -1) : trimmed);
  if (typeof amount !== 'number' || amount < 0) return trimmed;
  const years = unit === 'd' ? amount / 365 : unit === 'w' ? (7 * amount) / 365 : unit === 'm' ? amount / 12 : amount;
  return Number(years.toPrecision(15));
}
