// Hedgeleaf page: bound inputs, read and written field by field in the trade document
// (terms.js decides which inputs the terms form shows; the cards draw their own).
//
// The trade document is the page's one source of truth. Every input names the
// path it writes (data-path) and how to read it (data-kind); typing writes that
// one value into the document, so parts of a file the form does not show
// (hedge, simulate and solve sections, extra legs) pass through untouched.
// Unreadable text goes to the engine as typed, and the engine names the field.
import { addMonths, addYears, isIsoDate, todayIso, yearsBetween } from './dates.js';
import { inputText, parseNumber, parsePercent, parseTenor, percentText } from './format.js';
import { decimalText, maxNumberChars } from './numbers.js';
import { getPath, setPath } from './paths.js';

/** Shapes with their strike count and a plain description. */
export const shapes = {
  'call-spread': [2, 'Buy a call at the lower strike, sell one at the higher.'],
  'put-spread': [2, 'Buy a put at the higher strike, sell one at the lower.'],
  collar: [2, 'Buy a put at the lower strike, sell a call at the higher (on shares held).'],
  'risk-reversal': [2, 'Buy a call at the higher strike, sell a put at the lower.'],
  straddle: [1, 'Buy a call and a put at the same strike.'],
  strangle: [2, 'Buy a put at the lower strike and a call at the higher.'],
  seagull: [3, 'Sell a put at the lowest strike, buy a call at the middle, sell a call at the highest.'],
  'covered-call': [1, 'Hold the share, sell a call.'],
};

/** Which key holds the contract: "option", "structure" or "legs". */
/** Exercise styles as the page names them, in the order the form offers them. */
export const exerciseNames = { european: 'European', american: 'American', bermudan: 'Bermudan' };

export function contractKey(doc) {
  if (doc.legs !== undefined) return 'legs';
  if (doc.structure !== undefined) return 'structure';
  return 'option';
}

/** The longest text a text field passes on (the engine's own limits are far below; see quote.hpp). */
export const maxTextChars = 10000;

/** The most characters `input` takes: longer text is refused beside it and never reaches the document. */
export function charLimit(input) {
  return ['number', 'percent', 'index', 'tenor', 'time', 'strike'].includes(input.dataset.kind)
    ? maxNumberChars
    : maxTextChars;
}

// A strike as the trade file writes it (docs/trade-file.md): a price, or a percent of spot or of
// the forward, or a delta in points: "105", "95 % spot", "100 % fwd", "−25 delta".
const strikeForms = [
  ['percent_of_spot', /^(.+?)\s*%\s*(?:of\s+)?spot$/i, (x) => x],
  ['percent_of_forward', /^(.+?)\s*%\s*(?:of\s+(?:the\s+)?)?(?:fwd|forward)$/i, (x) => x],
  ['delta', /^(.+?)\s*(?:delta|Δ)$/i, (x) => Number((x / 100).toPrecision(15))],
];

/** The written form `text` (trimmed) takes, as {key, scale, number: its number's text}, or null. */
function strikeForm(text) {
  for (const [key, pattern, scale] of strikeForms) {
    const found = pattern.exec(text);
    if (found) return { key, scale, number: found[1] };
  }
  return null;
}

/**
 * A strike field's text -> a price (a number), {percent_of_spot}, {percent_of_forward} or {delta};
 * null when empty; text the page cannot read stays as typed (checks.js says why).
 */
export function readStrike(text) {
  const trimmed = String(text).trim();
  const form = strikeForm(trimmed);
  if (!form) return parseNumber(trimmed);
  const value = parseNumber(form.number);
  return typeof value === 'number' ? { [form.key]: form.scale(value) } : trimmed;
}

/** The number a strike field's text holds, and how it is written (for checks.js). */
export function strikeNumberText(text) {
  const trimmed = String(text).trim();
  return strikeForm(trimmed)?.number ?? trimmed;
}

/** A strike as its field shows it: 105 -> "105", {delta: -0.25} -> "-25 delta" (see readStrike). */
export function strikeText(value) {
  if (!value || typeof value !== 'object' || Array.isArray(value)) return inputText(value);
  const keys = Object.keys(value);
  const number = value[keys[0]];
  if (keys.length === 1 && typeof number === 'number') {
    if (keys[0] === 'percent_of_spot') return `${decimalText(number)} % spot`;
    if (keys[0] === 'percent_of_forward') return `${decimalText(number)} % fwd`;
    if (keys[0] === 'delta') return `${decimalText(Number((number * 100).toPrecision(12)))} delta`;
  }
  return JSON.stringify(value); // a form the page does not know: shown as written, kept unless edited
}

/** Read an input's value as the document stores it (undefined = remove the field). */
export function readInput(input) {
  const kind = input.dataset.kind;
  if (kind === 'bool') {
    const fallback = input.dataset.default === 'true';
    return input.checked === fallback ? undefined : input.checked;
  }
  if (kind === 'radio') return input.checked ? input.value : undefined;
  const text = input.value;
  if (kind === 'text') return text.trim() === '' ? undefined : text;
  if (kind === 'choice') return text === '' ? undefined : text;
  if (kind === 'date') return text === '' ? undefined : text;
  if (kind === 'time') return readTime(text).value;
  if (kind === 'strike') return readStrike(text) ?? undefined;
  // a number the page cannot read goes into the document as typed (it stays on screen and in the
  // autosave); the page says why beside the field and prices nothing (checks.js)
  const value = kind === 'percent' ? parsePercent(text) : kind === 'tenor' ? parseTenor(text) : parseNumber(text);
  if (kind === 'index' && typeof value === 'number') return value - 1; // leg 1 on screen is legs[0] in the file
  return value === null ? undefined : value;
}

/** Show a document value in an input. */
export function showInput(input, value) {
  const kind = input.dataset.kind;
  if (kind === 'bool') input.checked = value === undefined ? input.dataset.default === 'true' : value === true;
  else if (kind === 'radio')
    input.checked = value === undefined ? input.dataset.default === 'true' : value === input.value;
  else if (kind === 'percent') input.value = value === undefined ? '' : percentText(value);
  else if (kind === 'number') input.value = value === undefined ? '' : inputText(value);
  else if (kind === 'strike') input.value = value === undefined ? '' : strikeText(value);
  else if (kind === 'index') input.value = typeof value === 'number' ? inputText(value + 1) : (value ?? '');
  else if (kind === 'tenor' || kind === 'time') input.value = value === undefined ? '' : tenorText(value);
  else if (kind === 'choice')
    input.value = value === undefined ? (input.querySelector('option[value=""]') ? '' : input.options[0].value) : value;
  else input.value = value ?? '';
}

/** Years as a tenor field shows them: 0.5 -> "0.5" ("0,5" in de-DE); text as typed. */
function tenorText(value) {
  return typeof value === 'number' ? decimalText(value) : String(value ?? '');
}

/**
 * A time as a grid's expiry or a curve's point takes it (docs/market.md): a date "2027-06-30", a
 * tenor "3m" (kept as text, for the engine to roll from the valuation date) or years "0.5" ("0,5"
 * in de-DE) -> {key: "date" | "tenor" | "years", value}; text the page cannot read stays as typed.
 */
export function readTime(text) {
  const trimmed = text.trim();
  if (trimmed === '') return { key: 'tenor', value: undefined };
  if (isIsoDate(trimmed)) return { key: 'date', value: trimmed };
  const tenor = /^(\d+)\s*([dwmy])$/i.exec(trimmed);
  if (tenor) return { key: 'tenor', value: `${tenor[1]}${tenor[2].toLowerCase()}` };
  const years = parseNumber(trimmed);
  return typeof years === 'number' ? { key: 'years', value: years } : { key: 'tenor', value: trimmed };
}

const pointTimeKeys = ['tenor', 'date', 'years'];

/** "2027-03-15" or "0.25" -> {key, value} for a field that takes a date or years. */
export function readWhen(text, dateKey, yearsKey) {
  const trimmed = text.trim();
  if (trimmed === '') return { key: dateKey, value: undefined };
  if (isIsoDate(trimmed)) return { key: dateKey, value: trimmed };
  const number = parseTenor(trimmed);
  return typeof number === 'number' ? { key: yearsKey, value: number } : { key: dateKey, value: trimmed };
}

/** "2027-01-15, 2027-03-15" or "0.25 0.5" -> {key, value} for Bermudan exercise dates. */
export function readDateList(text) {
  const items = text.split(/[\s,;]+/).filter(Boolean);
  if (items.length === 0) return { key: 'exercise_dates', value: undefined };
  if (items.every(isIsoDate)) return { key: 'exercise_dates', value: items };
  const numbers = items.map(parseNumber);
  if (numbers.every((n) => typeof n === 'number')) return { key: 'exercise_years', value: numbers };
  return { key: 'exercise_dates', value: items };
}

/** Where the shared expiry and exercise fields live: "option" or "structure" (null for legs). */
function sharedBase(doc) {
  const key = contractKey(doc);
  return key === 'legs' ? null : key;
}

/**
 * A starting Bermudan schedule for a contract that has none: monthly exercise dates
 * before expiry (quarterly past two years, at most 24), as dates when the expiry is a
 * date and the trade has a valuation date, else as years. The user edits it from there.
 */
export function defaultExerciseSchedule(doc, base) {
  const holder = doc[base] ?? {};
  const byDate = typeof holder.expiry_date === 'string';
  const years = byDate ? yearsBetween(doc.valuation_date, holder.expiry_date) : holder.expiry_years;
  if (!(typeof years === 'number' && years > 0)) return null;
  const months = years > 2 ? 3 : 1; // monthly, quarterly past two years
  const out = [];
  for (let k = 1; out.length < 24; k++) {
    const when = byDate ? addMonths(doc.valuation_date, k * months) : Number(((k * months) / 12).toFixed(6));
    const t = byDate ? yearsBetween(doc.valuation_date, when) : when;
    if (t === null || t >= years - 1 / 365) break; // the expiry itself is always an exercise date
    out.push(when);
  }
  return out.length ? { key: byDate ? 'exercise_dates' : 'exercise_years', value: out } : null;
}

/**
 * Write one bound input into the document. Returns the path written (for its error span). Text
 * longer than the input takes is not written: the document keeps what it had, the page refuses it.
 */
export function writeInput(doc, input) {
  const role = input.dataset.role;
  if (input.value.length > charLimit(input)) return errorPathOf(doc, input);
  if (!role) {
    setPath(doc, input.dataset.path, readInput(input));
    return input.dataset.path;
  }
  const base = input.dataset.base ?? sharedBase(doc);
  if (!base) return '';
  if (role === 'expiry-date' || role === 'expiry-tenor') {
    const dateMode = role === 'expiry-date';
    setPath(doc, `${base}.${dateMode ? 'expiry_years' : 'expiry_date'}`, undefined);
    setPath(doc, `${base}.${dateMode ? 'expiry_date' : 'expiry_years'}`, readInput(input));
    return `${base}.${dateMode ? 'expiry_date' : 'expiry_years'}`;
  }
  if (role === 'exercise') {
    const value = readInput(input);
    setPath(doc, `${base}.exercise`, value === 'european' ? undefined : value);
    if (value !== 'bermudan') {
      setPath(doc, `${base}.exercise_dates`, undefined);
      setPath(doc, `${base}.exercise_years`, undefined);
    } else if (
      getPath(doc, `${base}.exercise_dates`) === undefined &&
      getPath(doc, `${base}.exercise_years`) === undefined
    ) {
      const schedule = defaultExerciseSchedule(doc, base);
      if (schedule) setPath(doc, `${base}.${schedule.key}`, schedule.value);
    }
    return `${base}.exercise`;
  }
  if (role === 'exercise-dates') {
    const { key, value } = readDateList(input.value);
    setPath(doc, `${base}.exercise_dates`, undefined);
    setPath(doc, `${base}.exercise_years`, undefined);
    setPath(doc, `${base}.${key}`, value);
    return `${base}.${key}`;
  }
  if (role === 'point-time') {
    const { key, value } = readTime(input.value);
    for (const other of pointTimeKeys) setPath(doc, `${base}.${other}`, undefined);
    setPath(doc, `${base}.${key}`, value === undefined ? '' : value); // an emptied time stays, refused beside it
    return `${base}.${key}`;
  }
  if (role === 'when') {
    const [dateKey, yearsKey] = input.dataset.keys.split(',');
    const { key, value } = readWhen(input.value, dateKey, yearsKey);
    setPath(doc, `${base}.${dateKey}`, undefined);
    setPath(doc, `${base}.${yearsKey}`, undefined);
    setPath(doc, `${base}.${key}`, value);
    return `${base}.${key}`;
  }
  return '';
}

/** The path an input's error span listens to, given the document as it stands. */
export function errorPathOf(doc, input) {
  const role = input.dataset.role;
  if (!role) return input.dataset.path;
  const base = input.dataset.base ?? sharedBase(doc);
  if (!base) return '';
  if (role === 'expiry-date') return `${base}.expiry_date`;
  if (role === 'expiry-tenor') return `${base}.expiry_years`;
  if (role === 'exercise') return `${base}.exercise`;
  if (role === 'point-time')
    return `${base}.${pointTimeKeys.find((k) => getPath(doc, `${base}.${k}`) !== undefined) ?? 'tenor'}`;
  if (role === 'exercise-dates')
    return `${base}.${getPath(doc, `${base}.exercise_years`) !== undefined ? 'exercise_years' : 'exercise_dates'}`;
  if (role === 'when') {
    const [dateKey, yearsKey] = input.dataset.keys.split(',');
    return `${base}.${getPath(doc, `${base}.${yearsKey}`) !== undefined ? yearsKey : dateKey}`;
  }
  return '';
}

/** Show the document's value in one input. */
export function fillInput(doc, input) {
  const role = input.dataset.role;
  if (!role) {
    showInput(input, getPath(doc, input.dataset.path));
    return;
  }
  const base = input.dataset.base ?? sharedBase(doc);
  if (!base) return;
  if (role === 'expiry-date') input.value = getPath(doc, `${base}.expiry_date`) ?? '';
  else if (role === 'expiry-tenor') input.value = tenorText(getPath(doc, `${base}.expiry_years`));
  else if (role === 'exercise') input.value = getPath(doc, `${base}.exercise`) ?? 'european';
  else if (role === 'point-time')
    input.value = tenorText(pointTimeKeys.map((k) => getPath(doc, `${base}.${k}`)).find((v) => v !== undefined));
  else if (role === 'exercise-dates') {
    const list = getPath(doc, `${base}.exercise_dates`) ?? getPath(doc, `${base}.exercise_years`) ?? [];
    input.value = Array.isArray(list) ? list.join(', ') : String(list);
  } else if (role === 'when') {
    const [dateKey, yearsKey] = input.dataset.keys.split(',');
    input.value = getPath(doc, `${base}.${dateKey}`) ?? getPath(doc, `${base}.${yearsKey}`) ?? '';
  }
}

/** The expiry of the contract as a date or years, whichever the document uses. */
export function contractExpiry(doc) {
  const key = contractKey(doc);
  const holder = key === 'legs' ? (doc.legs || []).find((leg) => leg && leg.type !== 'stock') : doc[key];
  if (!holder) return {};
  return holder.expiry_date !== undefined ? { expiry_date: holder.expiry_date } : { expiry_years: holder.expiry_years };
}

/**
 * Switch the expiry between a date and a tenor, converting the value. A trade without a
 * valuation date is valued from today, so that date is filled in to count from. A value that
 * cannot be converted (text the page cannot read) is set aside in `aside` and comes back when
 * its way of giving the expiry is chosen again: switching never loses what was typed.
 */
export function switchExpiryMode(doc, mode, aside = {}) {
  const base = sharedBase(doc);
  if (!base || !doc[base]) return;
  const holder = doc[base];
  const [from, to] = mode === 'tenor' ? ['expiry_date', 'expiry_years'] : ['expiry_years', 'expiry_date'];
  const value = holder[from];
  const start = doc.valuation_date === undefined ? todayIso() : doc.valuation_date;
  if (value !== undefined) {
    delete holder[from];
    const converted =
      mode === 'tenor' ? yearsBetween(start, value) : typeof value === 'number' ? addYears(start, value) : null;
    if (converted !== null) {
      if (doc.valuation_date === undefined) putFirst(doc, 'valuation_date', start); // where the file has it
      holder[to] = mode === 'tenor' ? Number(converted.toFixed(6)) : converted; // within seconds of the date
      delete aside[to];
      return;
    }
    aside[from] = value;
  }
  if (holder[to] === undefined && aside[to] !== undefined) holder[to] = aside[to];
  delete aside[to];
}

/** Give `doc` the key `key` as its first, keeping the order of the others. */
function putFirst(doc, key, value) {
  const rest = { ...doc };
  for (const k of Object.keys(doc)) delete doc[k];
  Object.assign(doc, { [key]: value }, rest);
}

/** Round a strike suggestion to a tidy number near `x` (three significant figures). */
function tidy(x) {
  if (!(x > 0)) return 100;
  const step = 10 ** Math.floor(Math.log10(x)) / 100;
  return Number((Math.round(x / step) * step).toPrecision(6));
}

// Where a shape puts the strike of the option it is made from: its call's or its put's place
// (0 = the lowest strike): the leg the client buys where it has one of that type.
const keptPlace = {
  'call-spread': { call: 0, put: 0 },
  'put-spread': { call: 1, put: 1 },
  collar: { call: 1, put: 0 },
  'risk-reversal': { call: 1, put: 0 },
  straddle: { call: 0, put: 0 },
  strangle: { call: 1, put: 0 },
  seagull: { call: 1, put: 0 },
  'covered-call': { call: 0, put: 0 },
};
const strikeSpacing = { 1: [1], 2: [0.95, 1.05], 3: [0.9, 1, 1.1] }; // of spot

/**
 * Strikes for a new `shape`: a structure of as many strikes keeps its own; otherwise they are
 * spaced around today's spot, and the strike of the option it is made from (a single option,
 * or the first option leg) keeps its place, the other strikes moving round it if need be.
 */
function structureStrikes(doc, shape, from, current, spot) {
  const count = shapes[shape][0];
  const own = from === 'structure' ? (current.strikes || []).filter((k) => typeof k === 'number') : [];
  if (own.length === count) return own.sort((a, b) => a - b);
  const option =
    from === 'option' ? current : from === 'legs' ? (doc.legs || []).find((l) => l && l.type !== 'stock') : null;
  const spacing = strikeSpacing[count];
  const list = spacing.map((f) => tidy(spot * f));
  if (!(typeof option?.strike === 'number' && option.strike > 0)) return list;
  const place = keptPlace[shape][String(option.type).endsWith('put') ? 'put' : 'call'];
  list[place] = option.strike;
  if (list.every((k, i) => i === 0 || k > list[i - 1])) return list;
  return spacing.map((f, i) => (i === place ? option.strike : tidy((option.strike * f) / spacing[place])));
}

/**
 * Change the contract to `shape` ("option", "legs" or a structure shape), keeping
 * expiry, exercise and strikes where they carry over. `lastLegs` are the result
 * legs of the last good price (for turning a structure into editable legs).
 */
export function changeShape(doc, shape, lastLegs) {
  const from = contractKey(doc);
  const current = from === 'legs' ? null : doc[from];
  const expiry = contractExpiry(doc);
  const spot = typeof doc.market?.spot === 'number' ? doc.market.spot : 100;
  const strikes =
    from === 'structure'
      ? [...(current.strikes || [])]
      : from === 'option'
        ? [current?.strike]
        : (doc.legs || []).filter((l) => l.strike !== undefined).map((l) => l.strike);
  const exercise = from === 'legs' ? (doc.legs || []).find((l) => l.exercise)?.exercise : current?.exercise;
  let next;
  if (shape === 'option') {
    const type =
      from === 'option' ? current.type : ((doc.legs || []).find((l) => l.type && l.type !== 'stock')?.type ?? 'call');
    next = { type, strike: strikes.find((k) => typeof k === 'number') ?? tidy(spot), ...expiry };
    if (exercise && exercise !== 'european') next.exercise = exercise;
    if (from === 'option') next = { ...current };
  } else if (shape === 'legs') {
    let legs;
    if (from === 'option') legs = [{ ...current, quantity: 1 }];
    else if (Array.isArray(lastLegs) && lastLegs.length) {
      legs = lastLegs.map((l) =>
        l.type === 'stock'
          ? { type: 'stock', quantity: l.quantity }
          : {
              type: l.type,
              strike: l.strike,
              ...expiry,
              ...(l.exercise !== 'european' ? { exercise: l.exercise } : {}),
              quantity: l.quantity,
            },
      );
    } else legs = [{ type: 'call', strike: tidy(spot), ...expiry, quantity: 1 }];
    next = legs;
  } else {
    next = { shape, strikes: structureStrikes(doc, shape, from, current, spot), ...expiry };
    // a structure starts European (as desks quote them); one turned into another keeps its style
    if (from === 'structure' && exercise === 'american') next.exercise = exercise;
  }
  // rebuild so the contract key keeps its place after market in the file
  const target = shape === 'option' || shape === 'legs' ? shape : 'structure';
  const rebuilt = {};
  for (const [key, value] of Object.entries(doc)) {
    if (key === 'option' || key === 'structure' || key === 'legs') {
      if (!(target in rebuilt)) rebuilt[target] = next;
    } else rebuilt[key] = value;
  }
  if (!(target in rebuilt)) rebuilt[target] = next;
  for (const key of Object.keys(doc)) delete doc[key];
  Object.assign(doc, rebuilt);
}
