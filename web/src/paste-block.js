// Hedgeleaf page: a block of cells pasted from a spreadsheet, read into a volatility grid or a
// curve's points (the editor shows them in percent; this file returns the file's decimals).
//
// A spreadsheet copies a selection as lines of tab-separated cells. Cells are split on tabs,
// else semicolons, else commas (the first of the three the text holds), as the engine reads
// table text (docs/market.md); with tabs or semicolons a decimal comma is read ("25,5"). A
// cell ending in % is a percentage. Volatilities and rates written without % are percent as
// on screen (25 = 25 %), unless every one of them is at most 1: a block of 0.25s is the
// spreadsheet's decimals, and the caller says so. Text that is not a number stays as typed,
// so the page can refuse it beside its cell and nothing pasted is lost.
import { isIsoDate } from './dates.js';

const tenorPattern = /^\d+\s*[dwmy]$/i;

/** `text` -> rows of trimmed cells (blank lines dropped) and the separator used. */
export function splitBlock(text) {
  const body = String(text ?? '').replace(/\r\n?/g, '\n');
  const separator = body.includes('\t') ? '\t' : body.includes(';') ? ';' : ',';
  const rows = body
    .split('\n')
    .filter((line) => line.trim() !== '')
    .map((line) => line.split(separator).map((cell) => cell.trim()));
  return { rows, separator };
}

/**
 * A cell as a number: {value, percent} ("25,5 %" with a decimal comma -> {value: 25.5,
 * percent: true}), or null when it is not one. Spaces (and no-break spaces) group thousands.
 */
export function cellNumber(cell, decimalComma) {
  let text = String(cell).replace(/[\s\u00a0\u202f]/g, '');
  const percent = text.endsWith('%');
  if (percent) text = text.slice(0, -1);
  if (decimalComma && text.includes(',')) text = text.replace(/\./g, '').replace(',', '.');
  if (!/^[-+]?(\d+\.?\d*|\.\d+)(e[-+]?\d+)?$/i.test(text)) return null;
  return { value: Number(text), percent };
}

/** A cell that names a time: a date or a tenor as typed ("3M" -> "3m"), years as a number, else the text. */
export function cellTime(cell, decimalComma) {
  if (isIsoDate(cell)) return cell;
  if (tenorPattern.test(cell)) return cell.replace(/\s+/g, '').toLowerCase();
  const read = cellNumber(cell, decimalComma);
  return read && !read.percent ? read.value : cell;
}

const isTimeText = (cell) => isIsoDate(cell) || tenorPattern.test(cell);

/**
 * Volatilities or rates as decimals: percentages (25 or 25 %) / 100, unless every plain number is
 * at most 1 (then the block holds decimals already: `decimals` is true). Unreadable cells stay as text.
 */
function toDecimals(cells, decimalComma) {
  const read = cells.map((row) => row.map((cell) => cellNumber(cell, decimalComma)));
  const plain = read.flat().filter((r) => r && !r.percent);
  const decimals = plain.length > 0 && plain.every((r) => Math.abs(r.value) <= 1);
  const values = read.map((row, i) =>
    row.map((r, j) => {
      if (!r) return cells[i][j];
      return r.percent || !decimals ? Number((r.value / 100).toPrecision(15)) : r.value;
    }),
  );
  return { values, decimals };
}

/**
 * A pasted grid block. With a corner cell that is blank or words, the first line holds the strikes
 * and the first column the expiries; with a corner that is an expiry (a tenor or a date), only the
 * first column does; otherwise the block is volatilities only. Returns {expiries?, strikes?, vols,
 * decimals, rows, columns}, or {why} when there is nothing to paste.
 */
export function readGridBlock(text) {
  const { rows, separator } = splitBlock(text);
  if (rows.length === 0) return { why: 'the pasted text holds no cells' };
  const decimalComma = separator !== ',';
  const corner = rows[0][0];
  const cornerIsNumber = cellNumber(corner, decimalComma) !== null;
  const headerRow = !cornerIsNumber && !isTimeText(corner) && rows.length > 1;
  const headerColumn = !cornerIsNumber;
  const body = rows.slice(headerRow ? 1 : 0);
  const out = {};
  if (headerRow)
    out.strikes = rows[0].slice(1).map((cell) => {
      const read = cellNumber(cell, decimalComma);
      return read ? read.value : cell; // "90%" of spot is the strike 90 in percent_of_spot
    });
  if (headerColumn) out.expiries = body.map((row) => cellTime(row[0], decimalComma));
  const cells = body.map((row) => row.slice(headerColumn ? 1 : 0));
  const { values, decimals } = toDecimals(cells, decimalComma);
  return { ...out, vols: values, decimals, rows: values.length, columns: Math.max(...values.map((r) => r.length)) };
}

/**
 * A pasted curve block: one point a line, a time and a rate; a first line of words is a header.
 * Returns {points: [{time, rate}], decimals}, or {why}.
 */
export function readCurveBlock(text) {
  const { rows, separator } = splitBlock(text);
  const decimalComma = separator !== ',';
  const body = rows.length && cellNumber(rows[0][1] ?? '', decimalComma) === null ? rows.slice(1) : rows;
  if (body.length === 0) return { why: 'the pasted text holds no points' };
  if (body.some((row) => row.length < 2)) return { why: 'each line needs a time and a rate' };
  const { values, decimals } = toDecimals(
    body.map((row) => [row[1]]),
    decimalComma,
  );
  return { points: body.map((row, i) => ({ time: cellTime(row[0], decimalComma), rate: values[i][0] })), decimals };
}
