// Hedgeleaf page: what the page itself checks in what is typed, before the engine sees it.
//
// Refusals: a number the page cannot read, or could read two ways in this locale, and text
// longer than a field takes (refused beside the field, never cut short). While any stands,
// nothing is priced and the last good figures stay, greyed. Warnings: a value that reads but
// is probably not what was meant (0.28 in a percent field where 28 % is likely); it is priced.
import { charLimit, strikeNumberText } from './form.js';
import { formatNumber } from './format.js';
import { readNumber } from './numbers.js';

/** The page's refusal of what `input` holds (a sentence after the field's name), or null. */
export function inputProblem(input) {
  const { kind } = input.dataset;
  const length = input.value.length;
  if (length > charLimit(input)) {
    const unit = kind === 'text' ? 'this field takes' : 'a number has';
    return `is too long (${formatNumber(length, 0)} characters; ${unit} at most ${formatNumber(charLimit(input), 0)})`;
  }
  if (kind === 'number' || kind === 'percent' || kind === 'index') return readNumber(input.value).problem ?? null;
  if (kind === 'strike') {
    const number = strikeNumberText(input.value);
    const problem = readNumber(number).problem;
    if (!problem) return null;
    if (number === input.value.trim() && /[A-Za-z]/.test(number))
      return 'is not a strike: write a price (105), a percent of spot (95 % spot) or of the forward (100 % fwd), or a delta in points (−25 delta)';
    return problem;
  }
  return null;
}

// Percent fields where a value this small is unusual enough to ask about (typed as a fraction?).
const usualFloor = [
  [/volatility$/, 1], // a volatility of under 1 % a year
  [/^hedge\.path\.change$/, 1], // a stress of under 1 %
  [/(^market\.(rate|carry_yield)|drift|^quote\.margin)$/, 0.1], // a rate under 0.1 % (0.25 % is a real rate)
  [/^market\.(domestic|foreign)_rate(\.rate)?$/, 0.1], // a currency pair's rate, as a number or a money-market quote
  [/^market\.volatility\.vols\[\d+\]\[\d+\]$/, 1], // a grid's cell, as the volatility
  [/^market\.(rate|carry_yield)\.points\[\d+\]\.rate$/, 0.1], // a curve's point, as the rate
];

/** A note about a percent value that looks like a decimal fraction ("0.28" meant as 28 %), or null. */
export function inputWarning(input) {
  if (input.dataset.kind !== 'percent') return null;
  const floor = usualFloor.find(([pattern]) => pattern.test(input.dataset.path ?? ''))?.[1];
  const read = readNumber(input.value);
  if (floor === undefined || read.value === undefined || read.value === 0 || Math.abs(read.value) >= floor) return null;
  const typed = input.value.trim().replace(/\s*%$/, '');
  const meant = formatNumber(read.value * 100, Math.max(0, decimalsOf(read.value) - 2));
  return `${typed} in a percent field means ${typed} % — did you mean ${meant} %?`;
}

function decimalsOf(value) {
  const text = String(value);
  return text.includes('e') ? 10 : (text.split('.')[1] ?? '').length;
}
