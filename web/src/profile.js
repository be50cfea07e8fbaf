// Hedgeleaf page: the "Against spot" card, profit at expiry and if valued today (the engine's
// `profile`), for the client's side.
//
// The range of spots is the user's (the trade's `profile.spot_low` / `spot_high`, so the CLI
// draws the same), else one that covers spot and every strike with room to spare and, on a
// second pass when they fall outside, the break-evens. The engine samples the range evenly;
// the payoff at expiry is straight between strikes, so its corners are put in exactly at the
// strikes (each side of a corner continued from its own straight piece, which also draws the
// step of a digital) and at the break-evens, where the profit is 0.
import { drawChart } from './chart.js';
import { byId } from './dom.js';
import { yearsBetween } from './dates.js';
import { contractKey, fillInput } from './form.js';
import { formatDate, formatNumber } from './format.js';
import { priceText, setResult } from './render.js';

/** The strikes of the trade as written. */
function strikesOf(doc) {
  const key = contractKey(doc);
  const list =
    key === 'option'
      ? [doc.option?.strike]
      : key === 'structure'
        ? doc.structure?.strikes
        : doc.legs?.map((l) => l?.strike);
  return (Array.isArray(list) ? list : []).filter((k) => typeof k === 'number' && k > 0);
}

/** Years to the trade's expiry as written (half a year when it cannot be told). */
function yearsOf(doc) {
  const key = contractKey(doc);
  const holder = key === 'legs' ? doc.legs?.find((l) => l && l.type !== 'stock') : doc[key];
  const years =
    typeof holder?.expiry_years === 'number'
      ? holder.expiry_years
      : yearsBetween(doc.valuation_date, holder?.expiry_date);
  return typeof years === 'number' && years > 0 ? years : 0.5;
}

/**
 * A range of spots that covers spot, the strikes and `more` (break-evens) with room: a quarter
 * of their span, or one standard deviation of spot to expiry, or 2 % of spot, whichever is most.
 * It stays above the dividends before expiry (the engine's lowest spot).
 */
export function autoRange(doc, more = []) {
  const spot = doc.market?.spot;
  if (!(typeof spot === 'number' && spot > 0)) return null;
  const all = [spot, ...strikesOf(doc), ...more];
  const [lo, hi] = [Math.min(...all), Math.max(...all)];
  const vol = typeof doc.market.volatility === 'number' && doc.market.volatility > 0 ? doc.market.volatility : 0.2;
  const pad = Math.max(0.25 * (hi - lo), vol * Math.sqrt(yearsOf(doc)) * spot, 0.02 * spot);
  const dividends = Array.isArray(doc.market.dividends)
    ? doc.market.dividends.reduce((sum, d) => sum + (typeof d?.amount === 'number' ? Math.max(0, d.amount) : 0), 0)
    : 0;
  return [Math.max(lo - pad, 0.01 * spot, 1.05 * dividends + 1e-9 * spot), hi + pad];
}

/** The trade as sent for its profile: the user's range, else the automatic one. */
export function profileRequest(doc, more = []) {
  const own = doc.profile && typeof doc.profile === 'object' && !Array.isArray(doc.profile) ? doc.profile : {};
  const range = autoRange(doc, more);
  if (!range) return doc;
  let [low, high] = range;
  if (typeof own.spot_low === 'number' && own.spot_low >= high) high = own.spot_low * 1.5;
  if (typeof own.spot_high === 'number' && own.spot_high <= low) low = own.spot_high / 1.5;
  return { ...doc, profile: { spot_low: low, spot_high: high, ...own } };
}

/** Break-evens the profile found outside the spots it drew (but within reason), to draw them too. */
export function missedBreakEvens(doc, profile) {
  const own = doc.profile ?? {};
  if (typeof own.spot_low === 'number' && typeof own.spot_high === 'number') return [];
  const rows = profile.rows;
  const [lo, hi] = [rows[0].spot, rows[rows.length - 1].spot];
  const spot = doc.market.spot;
  return profile.break_even.filter((x) => (x < lo || x > hi) && x > spot / 10 && x < spot * 10);
}

/** `points` with the corners at `kinks` (the strikes) and the crossings at `zeros` put in exactly. */
export function withCorners(points, kinks, zeros) {
  const xs = points.map((p) => p[0]);
  const [lo, hi] = [xs[0], xs[xs.length - 1]];
  const free = (a, b) => !kinks.some((k) => k > Math.min(a, b) && k < Math.max(a, b));
  const extend = (i, j, x) => points[i][1] + ((points[j][1] - points[i][1]) / (xs[j] - xs[i])) * (x - xs[i]);
  const extra = [];
  for (const k of kinks) {
    if (!(k > lo && k < hi) || xs.includes(k)) continue;
    const i = xs.findIndex((x) => x > k) - 1; // xs[i] < k < xs[i + 1]
    const left = i >= 1 && free(xs[i - 1], k) ? extend(i, i - 1, k) : null;
    const right = i + 2 < xs.length && free(k, xs[i + 2]) ? extend(i + 1, i + 2, k) : null;
    if (left === null && right === null) continue;
    extra.push([k, left ?? right, 0]);
    if (left !== null && right !== null && Math.abs(left - right) > 1e-9 * (1 + Math.abs(left)))
      extra.push([k, right, 1]);
  }
  for (const z of zeros) if (z > lo && z < hi && !xs.includes(z)) extra.push([z, 0, 0]);
  return [...points.map(([x, y]) => [x, y, 0]), ...extra]
    .sort((a, b) => a[0] - b[0] || a[2] - b[2])
    .map(([x, y]) => [x, y]);
}

/** The strikes where the payoff at expiry turns: every option leg's, when all expire together. */
function cornersOf(price) {
  const legs = (price.legs ?? []).filter((l) => l.type !== 'stock');
  const expiries = new Set(legs.map((l) => l.expiry_years));
  return expiries.size === 1 ? legs.map((l) => l.strike).filter((k) => typeof k === 'number') : [];
}

/**
 * The client's shares with the trade at expiry, per unit of the trade: the trade's profit plus the
 * shares' change in value from today's spot (as the engine counts a holding, never in the price),
 * or null without a holding.
 */
function withHolding(price, atExpiry) {
  const shares = price.client_price?.holding?.shares;
  const q = price.position.quantity;
  if (!(typeof shares === 'number' && shares !== 0 && q > 0)) return null;
  return {
    kind: 'holding',
    label: `Profit at expiry with the ${formatNumber(shares, 0)} shares held`,
    points: atExpiry.map(([x, y]) => [x, y + (shares / q) * (x - price.spot)]),
  };
}

/** Draw the profile of `doc` (priced at `price`) in the card and on the quote sheet; show the break-evens. */
export function drawProfile(doc, price, profile) {
  const sign = price.position.side === 'sell' ? -1 : 1;
  const rows = profile.rows.filter((r) => Number.isFinite(r.spot));
  const evens = profile.break_even;
  const atExpiry = rows.map((r) => [r.spot, sign * r.pnl_at_expiry]);
  const series = [
    { kind: 'payoff', label: 'Profit at expiry', points: withCorners(atExpiry, cornersOf(price), evens) },
    { kind: 'value', label: 'Profit if valued today', points: rows.map((r) => [r.spot, sign * r.pnl_today]) },
  ];
  const held = withHolding(price, series[0].points);
  if (held) series.push(held);
  const [lo, hi] = [rows[0].spot, rows[rows.length - 1].spot];
  const spotText = (x) => priceText(doc, x);
  const marks = [{ x: price.spot, label: `spot ${spotText(price.spot)}`, kind: 'spot' }];
  evens
    .filter((x) => x >= lo && x <= hi)
    .forEach((x, i) => marks.push({ x, label: `break-even ${spotText(x)}`, kind: 'break-even', row: i + 1 }));
  const ranges = profile.break_even_ranges.map(([a, b]) => `${spotText(a)}–${spotText(b)}`);
  const text = [...evens.map(spotText), ...ranges].join(' and ') || 'none';
  setResult('break-even', text, evens[0]);
  for (const node of document.querySelectorAll('[data-result="break-even"]'))
    node.dataset.values = JSON.stringify(evens);
  const labels = {
    xLabel: `Spot (expiry ${profile.horizon_date ? formatDate(profile.horizon_date) : `in ${formatNumber(profile.horizon_years, 2)} y`})`,
    yLabel: 'Profit per unit',
  };
  drawChart(byId('profile-chart'), { series, marks, ...labels });
  drawChart(byId('sheet-chart'), { series, marks, ...labels, height: 220 });
  // the automatic range, where the user set none, as the range fields' placeholders
  for (const [path, x] of [
    ['profile.spot_low', lo],
    ['profile.spot_high', hi],
  ]) {
    const input = document.querySelector(`[data-path="${path}"]`);
    if (input) input.placeholder = `auto: ${spotText(x)}`;
  }
}

/** Show the trade's chart range in the card's range fields. */
export function fillProfileRange(doc) {
  for (const input of byId('profile-range').querySelectorAll('[data-path]')) fillInput(doc, input);
}
