// Hedgeleaf page: the engine's words about a volatility grid, as the editor on screen shows it.
//
// The engine names grid cells by path, counted from 0, with volatilities as decimals
// ("... that of vols[0][2] (volatility 0.14 over 0.25 years) ...; raise this volatility to at
// least 0.1415"). Beside a cell the page counts rows and columns from 1 and shows volatilities
// in percent, as the grid does: "that of row 1, column 3 (volatility 14 % over 0.25 years)".
import { formatNumber } from './format.js';

const percent = (text) => {
  const value = Number(text) * 100;
  const digits = Math.min(6, (String(Number(value.toPrecision(12))).split('.')[1] ?? '').length);
  return `${formatNumber(Number(value.toPrecision(12)), digits)} %`;
};

/** True for a path inside a volatility grid's lists or a curve's points. */
export function isMarketTablePath(path) {
  return /^market\.(volatility\.(vols|expiries|strikes)|(rate|carry_yield|borrow)\.points)\[/.test(path ?? '');
}

/** The engine's sentence about a grid, in the grid's screen terms (rows and columns from 1, vols in %). */
export function gridWords(text) {
  return String(text)
    .replace(/\bvols\[(\d+)\]\[(\d+)\]/g, (_, i, j) => `row ${Number(i) + 1}, column ${Number(j) + 1}`)
    .replace(/\b(expiries|strikes)\[(\d+)\]/g, (_, list, i) =>
      list === 'expiries' ? `the expiry of row ${Number(i) + 1}` : `the strike of column ${Number(i) + 1}`,
    )
    .replace(/\bpoints\[(\d+)\]/g, (_, i) => `point ${Number(i) + 1}`)
    .replace(
      /\b(volatility|volatilities|volatility to at (?:least|most)) (-?\d+(?:\.\d+)?(?:e-?\d+)?)\b(?! years)/g,
      (_, words, value) => `${words} ${percent(value)}`,
    );
}
