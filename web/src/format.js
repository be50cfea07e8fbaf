// Hedgeleaf page: numbers on screen and numbers typed in.
//
// Display: thousands separators (1,234,567.89), a decimal point, a real minus.
// Input: separators , _ ' and spaces are ignored; percentages are typed in
// percent and stored as the file's decimals (31 -> 0.31) here and only here.

const groups = new Map();
function formatter(digits) {
  if (!groups.has(digits)) {
    groups.set(
      digits,
      new Intl.NumberFormat('en-US', { minimumFractionDigits: digits, maximumFractionDigits: digits }),
    );
  }
  return groups.get(digits);
}

/** 1234.5 -> "1,234.50"; null/NaN -> "–". */
export function formatNumber(value, digits = 2) {
  if (value === null || value === undefined || !Number.isFinite(value)) return '–';
  const text = formatter(digits).format(value);
  return text.replace(/^-/, '−').replace(/^−(0(\.0+)?)$/, '$1');
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
 * Read a typed number. Returns a number, null for an empty field, or the
 * trimmed text when it is not a number (the engine then names the field).
 */
export function parseNumber(text) {
  const trimmed = String(text ?? '').trim();
  if (trimmed === '') return null;
  const cleaned = trimmed
    .replace(/[\s,_'\u00a0\u202f]/g, '')
    .replace(/^[−–]/, '-')
    .replace(/%$/, '');
  if (!/^[-+]?(\d+\.?\d*|\.\d+)(e[-+]?\d+)?$/i.test(cleaned)) return trimmed;
  const value = Number(cleaned);
  return Number.isFinite(value) ? value : cleaned; // 1e400: the engine names the field ("too large to hold")
}

/** A percent field: "31" -> 0.31 (exact to the digits typed, no 0.31000000000000005). */
export function parsePercent(text) {
  const value = parseNumber(text);
  if (typeof value !== 'number') return value;
  return Number((value / 100).toPrecision(15));
}

/** Decimal -> the text a percent field shows: 0.31 -> "31". */
export function percentText(decimal) {
  if (typeof decimal !== 'number') return decimal ?? '';
  return String(Number((decimal * 100).toPrecision(12)));
}

/** A number as an input shows it: grouped, every digit kept (25000 -> "25,000"). */
export function inputText(value) {
  if (typeof value !== 'number') return value ?? '';
  if (!Number.isFinite(value)) return String(value);
  const [whole, fraction] = String(value).split('.');
  if (/e/i.test(whole)) return String(value);
  const grouped = whole.replace(/\B(?=(\d{3})+(?!\d))/g, ',');
  return fraction === undefined ? grouped : `${grouped}.${fraction}`;
}

/**
 * A tenor: "0.5" (years), "6m", "18M", "2y", "90d", "3w" -> years (days ACT/365F).
 * Returns null for empty, the text itself when it cannot be read.
 */
export function parseTenor(text) {
  const trimmed = String(text ?? '').trim();
  if (trimmed === '') return null;
  const match = /^(\d+(?:\.\d+)?)\s*([dwmy]?)$/i.exec(trimmed.replace(/,/g, ''));
  if (!match) return trimmed;
  const amount = Number(match[1]);
  const unit = match[2].toLowerCase();
  const years = unit === 'd' ? amount / 365 : unit === 'w' ? (7 * amount) / 365 : unit === 'm' ? amount / 12 : amount;
  return Number(years.toPrecision(15));
}
