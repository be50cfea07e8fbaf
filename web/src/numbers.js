// Hedgeleaf page: numbers read as people type them in their own locale.
//
// "72,4" is 72.4 and "1.234,5" is 1234.5 anywhere; "1,234" is 1234 where the comma groups
// thousands (en-US) and 1.234 where it is the decimal mark (de-DE), and refused, saying both
// readings, where the locale uses neither (fr-FR groups with a space). Spaces, apostrophes and
// underscores always group. One pass over the text and no pattern that can backtrack, so a
// pasted megabyte is answered at once; a number longer than any real one is refused outright.

/** The longest text a number field reads; longer is refused beside the field, never cut. */
export const maxNumberChars = 100;

const minusSigns = new Set(['-', '\u2212', '\u2013']); // hyphen-minus, minus sign, en dash
const spacing = new Set([' ', '\u00a0', '\u202f', '\u2009', "'", '\u2019', '_']);
const isDigit = (c) => c >= '0' && c <= '9';

let cachedLocale = null;
let chosenLocale = null;

/**
 * Read and show numbers and dates as people in `locale` do (a BCP 47 tag the user picked, locale.js),
 * or, for null, in the browser's language. Files, links and the engine stay in the neutral format.
 */
export function setPageLocale(locale) {
  chosenLocale = locale;
  cachedLocale = null;
}

/** The locale numbers are read and shown in: the one picked, else the browser's first language, else en-US. */
export function pageLocale() {
  if (cachedLocale) return cachedLocale;
  if (chosenLocale) {
    try {
      cachedLocale = Intl.NumberFormat.supportedLocalesOf([chosenLocale])[0] ?? null;
    } catch {
      cachedLocale = null;
    }
    if (cachedLocale) return cachedLocale;
  }
  const wanted = globalThis.navigator?.languages?.[0] ?? globalThis.navigator?.language ?? 'en-US';
  try {
    cachedLocale = Intl.NumberFormat.supportedLocalesOf([wanted])[0] ?? 'en-US';
  } catch {
    cachedLocale = 'en-US';
  }
  return cachedLocale;
}

const separatorCache = new Map();
/** The locale's thousands separator and decimal mark, e.g. {group: ',', decimal: '.'}. */
export function separatorsOf(locale = pageLocale()) {
  if (!separatorCache.has(locale)) {
    const parts = new Intl.NumberFormat(locale, { numberingSystem: 'latn' }).formatToParts(1234567.5);
    separatorCache.set(locale, {
      group: parts.find((p) => p.type === 'group')?.value ?? ',',
      decimal: parts.find((p) => p.type === 'decimal')?.value ?? '.',
    });
  }
  return separatorCache.get(locale);
}

/** Split "1.234,5e3" into digit runs and the marks between them; null if another character is in it. */
function tokens(body) {
  const runs = [''];
  const marks = [];
  let exponent = '';
  for (let i = 0; i < body.length; i += 1) {
    const c = body[i];
    if (isDigit(c)) runs[runs.length - 1] += c;
    else if (c === ',' || c === '.' || spacing.has(c)) {
      if (runs[runs.length - 1] === '' && runs.length > 1) return null; // two marks in a row
      marks.push(spacing.has(c) ? ' ' : c);
      runs.push('');
    } else if ((c === 'e' || c === 'E') && i + 1 < body.length) {
      exponent = body.slice(i + 1);
      const start = exponent[0] === '+' || exponent[0] === '-' ? 1 : 0;
      if (exponent.length === start) return null;
      for (let j = start; j < exponent.length; j += 1) if (!isDigit(exponent[j])) return null;
      break;
    } else return null;
  }
  if (runs.every((r) => r === '')) return null;
  // a trailing decimal mark while typing ("1.") reads as the number so far; a trailing group mark does not
  if (runs[runs.length - 1] === '' && (marks[marks.length - 1] === ' ' || exponent)) return null;
  return { runs, marks, exponent };
}

/** Groups after the first hold three digits (two in the middle where lakhs are grouped). */
function groupsOk(runs) {
  if (runs.length === 1) return true;
  if (runs[0].length < 1 || runs[0].length > 3) return false;
  for (let i = 1; i < runs.length - 1; i += 1) if (runs[i].length !== 3 && runs[i].length !== 2) return false;
  return runs[runs.length - 1].length === 3;
}

/**
 * Which mark of `marks` is the decimal mark: its index, -1 for none, or
 * {ambiguous: mark} when only the locale could tell and it cannot.
 */
function decimalMark({ runs, marks }, locale) {
  const commas = marks.filter((m) => m === ',').length;
  const dots = marks.filter((m) => m === '.').length;
  const last = marks.length - 1;
  if (commas && dots) {
    // "1.234,5": the last one, once; the other groups
    const decimal = marks[last];
    return decimal === ' ' || marks.filter((m) => m === decimal).length > 1 ? null : last;
  }
  if (commas + dots === 0) return -1;
  if (commas + dots > 1) return -1; // "1,234,567": they group
  const at = marks.findIndex((m) => m === ',' || m === '.');
  if (at !== last) return null; // "1,234 567"
  const before = runs[at];
  const after = runs[at + 1];
  // Three digits after a lone mark: a group ("1,234") or decimals ("1,234" in de-DE)?
  // Not when spaces group the rest, or the whole part is 0 or empty or over three digits.
  if (after.length !== 3 || marks.length > 1 || before === '' || before === '0' || before.length > 3) return at;
  const { group, decimal } = separatorsOf(locale);
  if (marks[at] === decimal) return at;
  if (marks[at] === group) return -1;
  return { ambiguous: marks[at] };
}

/**
 * Read a typed number as people in `locale` write it. Returns {value} (a finite number),
 * {empty: true}, or {problem} (a sentence saying what is wrong, after the field's name).
 */
export function readNumber(text, locale = pageLocale()) {
  const raw = String(text ?? '');
  if (raw.length > maxNumberChars)
    return {
      problem: `is too long (${raw.length.toLocaleString('en-US')} characters; a number has at most ${maxNumberChars})`,
    };
  let body = raw.trim();
  if (body === '') return { empty: true };
  const shown = body;
  let sign = '';
  if (body[0] === '+' || minusSigns.has(body[0])) {
    sign = body[0] === '+' ? '' : '-';
    body = body.slice(1).trim();
  }
  if (body.endsWith('%')) body = body.slice(0, -1).trim();
  const parts = tokens(body);
  const notNumber = { problem: `is not a number (“${shown}”)` };
  if (!parts) return notNumber;
  const mark = decimalMark(parts, locale);
  if (mark === null) return notNumber;
  if (typeof mark === 'object') {
    const whole = parts.runs.join('');
    const { decimal } = separatorsOf(locale);
    const asDecimal = `${parts.runs[0]}${decimal}${parts.runs[1]}`;
    return {
      problem: `“${shown}” could be read as ${whole} or as ${asDecimal}: type it without the “${mark.ambiguous}”, or with “${decimal}” as the decimal mark`,
    };
  }
  const wholeRuns = mark >= 0 ? parts.runs.slice(0, mark + 1) : parts.runs;
  if (mark >= 0 && parts.marks.slice(mark + 1).length) return notNumber;
  if (!groupsOk(wholeRuns)) return notNumber;
  const fraction = mark >= 0 ? parts.runs[mark + 1] : '';
  const plain = `${sign}${wholeRuns.join('') || '0'}${fraction ? `.${fraction}` : ''}${parts.exponent ? `e${parts.exponent}` : ''}`;
  const value = Number(plain);
  if (!Number.isFinite(value)) return { problem: `is too large to hold (“${shown}”)` };
  return { value: value === 0 ? 0 : value };
}

/** A number with the locale's decimal mark and no grouping, every digit kept: 0.5 -> "0,5" in de-DE. */
export function decimalText(value, locale = pageLocale()) {
  const text = String(value);
  return /e/i.test(text) ? text : text.replace('.', separatorsOf(locale).decimal);
}

/** A number as an input shows it: grouped in the locale, every digit kept (25000 -> "25,000"). */
export function groupedText(value, locale = pageLocale()) {
  const text = String(value);
  if (/e/i.test(text)) return text;
  const { group, decimal } = separatorsOf(locale);
  const negative = text.startsWith('-');
  const [whole, fraction] = (negative ? text.slice(1) : text).split('.');
  let grouped = '';
  for (let i = 0; i < whole.length; i += 1) {
    if (i > 0 && (whole.length - i) % 3 === 0) grouped += group;
    grouped += whole[i];
  }
  return `${negative ? '-' : ''}${grouped}${fraction === undefined ? '' : `${decimal}${fraction}`}`;
}
