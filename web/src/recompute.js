// Hedgeleaf page: the recompute cycle.
//
// An edit calls changed(): the page autosaves and, after a short pause (so that
// typing is not priced key by key), recompute() posts every call the edit needs
// at once to the two engine channels: the price on `live`, the profile and the
// cards' calls on `desk`. Results are drawn as they come back, each only if no
// newer edit came first (state.generation). If the price fails, the engine's
// message goes beside its field and the last good figures stay, greyed.
// <body data-computing> is set while the figures catch up with the inputs (the
// page's automation contract).
import { drawChart } from './chart.js';
import { Cancelled, started } from './compute.js';
import { byId } from './dom.js';
import { EngineError } from './engine.js';
import { formatNumber } from './format.js';
import { clearErrors, setStale, showError, showFailure } from './messages.js';
import { renderPrice, renderSheet, setResult } from './render.js';
import { fingerprint } from './share.js';

const allPanels = ['price', 'profile', 'hedge', 'ladder', 'solve', 'simulate'];

/**
 * The cycle over `live` and `desk` (EngineChannel) for the cards {hedge, ladder, solve,
 * simulate}; `save` keeps the edited trade (autosave). Returns changed(delay) for edits,
 * recompute() to run one now, and refreshSheet(doc, price) for the print view.
 */
export function recomputeCycle({ state, live, desk, cards, save }) {
  const { hedge, ladder, solve, simulate } = cards;
  let pending = false; // an edit waits for its recompute
  let timer = null;
  let busyTimer = null;
  let liveStarted = 0;

  /** An edit: autosave, then recompute after `delay` ms unless another edit comes first. */
  function changed(delay = 250) {
    document.body.dataset.computing = 'true'; // automation contract: figures are catching up with the inputs
    save();
    clearTimeout(timer);
    pending = true;
    timer = setTimeout(recompute, delay);
  }

  /** The figures are all in (unless another edit is waiting). */
  function caughtUp() {
    if (!pending) delete document.body.dataset.computing;
  }

  function notBusy() {
    clearTimeout(busyTimer);
    document.body.classList.remove('busy');
  }

  /** Work for an older trade still running after 0.8 s (a huge lattice): stop it rather than queue behind it. */
  function stopStaleWork() {
    if (!live.busy && !desk.busy) liveStarted = performance.now();
    else if (performance.now() - liveStarted > 800) {
      live.cancel();
      desk.cancel();
      liveStarted = performance.now();
    }
  }

  /** Post every call this edit needs at once: the engines work through them while this thread shows each result. */
  function post(doc) {
    return {
      pricing: live.call('price', doc),
      profiling: state.commands.includes('profile') ? started(desk.call('profile', doc)) : null,
      hedging: hedge.request(doc),
      laddering: ladder.request(doc),
      solving: solve.request(doc),
      fingerprinting: fingerprint(doc).catch(() => null), // hashed by the browser while the engines run
    };
  }

  async function recompute() {
    pending = false;
    document.body.dataset.computing = 'true';
    const generation = (state.generation += 1);
    const current = () => generation === state.generation;
    const doc = structuredClone(state.doc);
    stopStaleWork();
    // Dim the premium only when the price takes a while: a class change on every edit
    // would make the browser restyle the page while the engines run.
    clearTimeout(busyTimer);
    busyTimer = setTimeout(() => document.body.classList.add('busy'), 120);
    const calls = post(doc);
    let price;
    try {
      price = await calls.pricing;
    } catch (err) {
      if (!current() || err instanceof Cancelled) return;
      notBusy();
      clearErrors();
      showFailure(err);
      setStale(allPanels, true);
      caughtUp();
      return;
    }
    if (!current()) return;
    // The profile, schedule and ladder usually follow within a few milliseconds: wait for
    // them (up to 12 ms) so that the page shows the whole recompute in one go, one layout
    // and no half-updated state; a slower one (a big lattice), or one held back until the
    // price is in (on opening, main.js), comes in on its own later.
    const following = [calls.profiling, calls.hedging, calls.laddering].filter(Boolean);
    if (following.length && !desk.held)
      await Promise.race([Promise.allSettled(following), new Promise((r) => setTimeout(r, 12))]);
    if (!current()) return;
    notBusy();
    clearErrors();
    state.price = price;
    renderPrice(doc, price);
    setStale(['price'], false);
    renderCurrency(doc);
    refreshSheet(doc, price, calls.fingerprinting);
    if (calls.profiling) await showProfile(price, calls.profiling, current);
    if (!current()) return;
    await hedge.update(doc, price, generation, calls.hedging);
    await ladder.update(generation, calls.laddering);
    await solve.update(generation, calls.solving, price);
    simulate.update(doc, price);
    if (current()) caughtUp();
  }

  return { changed, recompute, refreshSheet };
}

/** Draw the profile `pending` brings, unless a newer edit came first (`current()` false). */
async function showProfile(price, pending, current) {
  try {
    const profile = await pending;
    if (!current()) return;
    drawProfile(price, profile);
    setStale(['profile'], false);
  } catch (err) {
    if (!current() || err instanceof Cancelled) return;
    setStale(['profile'], true);
    if (err instanceof EngineError) showError(err.field, err.message);
  }
}

function renderCurrency(doc) {
  const ccy = typeof doc.quote?.currency === 'string' ? doc.quote.currency : '';
  for (const node of document.querySelectorAll('.ccy')) node.textContent = ccy;
}

/** Profit at expiry and if valued today against spot, from the engine's `profile`, for the client's side. */
function drawProfile(price, profile) {
  const sign = price.position.side === 'sell' ? -1 : 1;
  const rows = profile.rows.filter((r) => Number.isFinite(r.spot));
  const series = [
    { kind: 'payoff', label: 'Profit at expiry', points: rows.map((r) => [r.spot, sign * r.pnl_at_expiry]) },
    { kind: 'value', label: 'Profit if valued today', points: rows.map((r) => [r.spot, sign * r.pnl_today]) },
  ];
  const [lo, hi] = [rows[0].spot, rows[rows.length - 1].spot];
  const evens = profile.break_even;
  const marks = [{ x: price.spot, label: `spot ${formatNumber(price.spot, 2)}`, kind: 'spot' }];
  evens
    .filter((x) => x >= lo && x <= hi)
    .forEach((x, i) => marks.push({ x, label: `break-even ${formatNumber(x, 2)}`, kind: 'break-even', row: i + 1 }));
  const ranges = profile.break_even_ranges.map(([a, b]) => `${formatNumber(a, 2)}–${formatNumber(b, 2)}`);
  const text = [...evens.map((x) => formatNumber(x, 2)), ...ranges].join(' and ') || 'none';
  setResult('break-even', text, evens[0]);
  for (const node of document.querySelectorAll('[data-result="break-even"]'))
    node.dataset.values = JSON.stringify(evens);
  const labels = {
    xLabel: `Spot (expiry ${profile.horizon_date ?? `in ${formatNumber(profile.horizon_years, 2)} y`})`,
    yLabel: 'Profit per unit',
  };
  drawChart(byId('profile-chart'), { series, marks, ...labels });
  drawChart(byId('sheet-chart'), { series, marks, ...labels, height: 220 });
}

const clock = new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeStyle: 'short' });

/** Fill the print-only quote sheet for `doc` priced at `price`, stamped with the time now. */
async function refreshSheet(doc, price, fingerprinting = fingerprint(doc).catch(() => null)) {
  const stamp = new Date();
  const offset = -stamp.getTimezoneOffset();
  const valuedAt = `${clock.format(stamp)} (UTC${offset >= 0 ? '+' : '−'}${String(Math.abs(offset / 60)).padStart(2, '0')})`;
  const code = await fingerprinting;
  renderSheet(doc, price, {
    fingerprint: code,
    valuedAt,
    currency: typeof doc.quote?.currency === 'string' ? doc.quote.currency : '',
  });
  setResult('fingerprint', code ?? '–');
}
