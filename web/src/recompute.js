// Hedgeleaf page: the recompute cycle.
//
// An edit calls changed(): the page autosaves and, after a short pause (so that
// typing is not priced key by key), recompute() posts every call the edit needs
// at once to the two engine channels: the price and then the hedge schedule on
// `live`, the profile and the other cards' calls on `desk` (main.js). Results are drawn as they come back, each only if no
// newer edit came first (state.generation): the price's own figures at once, the cards
// below together after them. If the price fails, the engine's
// message goes beside its field and the last good figures stay, greyed.
// <body data-computing> is set while the figures catch up with the inputs (the
// page's automation contract).
import { Cancelled, delay, readyTime, started } from './compute.js';
import { EngineError } from './engine.js';
import { clearErrors, pageProblems, setStale, showError, showFailure, showPageProblems } from './messages.js';
import { drawProfile, missedBreakEvens, profileRequest } from './profile.js';
import { amountCurrency, renderPrice, setResult } from './render.js';
import { renderSheet } from './sheet.js';
import { fingerprint } from './share.js';
import { formatStamp } from './format.js';
import { showMarketFigures } from './smile-chart.js';

const allPanels = ['price', 'profile', 'hedge', 'ladder', 'solve', 'simulate', 'compare'];
// the cards drawn from calls that follow the price's (their order in `cardCalls` below)
const followingPanels = ['profile', 'hedge', 'ladder'];

/**
 * The cycle over `live` and `desk` (EngineChannel) for the cards {hedge, ladder, solve,
 * simulate}; `save` keeps the edited trade (autosave) and `keepFigures` the last good
 * figures with it; `scope` holds the inputs the page checks itself before anything is
 * priced; `inWindow(panel)` says whether the card showing `panel` ('profile', 'hedge', 'ladder')
 * is in the window now. Returns changed(delay) for edits, recompute() to run one now, showKept(figures)
 * to show figures kept from before a reload, and refreshSheet(doc, price) for the print view.
 */
export function recomputeCycle({ state, live, desk, cards, save, keepFigures, scope, inWindow = () => true }) {
  const { hedge, ladder, solve, simulate, compare } = cards;
  let pending = false; // an edit waits for its recompute
  let timer = null;
  let busyTimer = null;
  let liveStarted = 0;
  // How long after the price the cards' results were ready last time, by the workers' clocks
  // (null: not known yet). The price waits for them when that was at most 8 ms.
  let cardsLag = null;

  /** Note, once they are in, how long after the price's the cards' results were ready. */
  function measureCards(price, following) {
    const priceReady = readyTime(price);
    if (!priceReady || !following.length) return;
    Promise.allSettled(following).then((settled) => {
      const ready = settled.map((s) => (s.status === 'fulfilled' ? readyTime(s.value) : null));
      if (ready.every((t) => t !== null)) cardsLag = Math.max(0, Math.max(...ready) - priceReady);
    });
  }

  /**
   * How long the price waits for the cards below it this time (ms), `began` ms into the
   * recompute: never past 10 ms into it (a price that came late is shown at once).
   */
  function cardsWait(began) {
    const wait = cardsLag === null ? 5 : cardsLag <= 8 ? Math.ceil(cardsLag) + 1 : 0;
    return Math.min(wait, Math.max(0, 10 - began));
  }

  /**
   * An edit: autosave, then recompute `delay` ms after it (after the keystroke, when `since`,
   * an event's timeStamp, says when that was) unless another edit comes first.
   */
  function changed(delay = 250, since = performance.now()) {
    markComputing();
    clearTimeout(timer);
    pending = true;
    // the pause counts from the edit, not from the end of the work its input did or the save below
    // (a time stamp that is not a moment of the last `delay` ms is not trusted)
    const waited = performance.now() - since;
    timer = setTimeout(recompute, waited > 0 && waited < delay ? delay - waited : delay);
    save();
  }

  /** Automation contract: the figures are catching up with the inputs (written only when it was not yet so). */
  function markComputing() {
    if (document.body.dataset.computing !== 'true') document.body.dataset.computing = 'true';
  }

  /** The figures are all in (unless another edit is waiting). */
  function caughtUp() {
    if (!pending) delete document.body.dataset.computing;
  }

  function notBusy() {
    clearTimeout(busyTimer);
    document.body.classList.toggle('busy', false); // (remove() would rewrite the attribute, and restyle, even when absent)
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
  function post(doc, hold) {
    const pricing = live.call('price', doc);
    if (hold) {
      live.holdUntil(hold);
      desk.holdUntil(hold);
    }
    return {
      pricing,
      profiling: state.commands.includes('profile') ? started(desk.call('profile', profileRequest(doc))) : null,
      hedging: hedge.request(doc),
      laddering: ladder.request(doc),
      solving: solve.request(doc),
      comparing: compare.request(doc),
      fingerprinting: fingerprint(doc).catch(() => null), // hashed by the browser while the engines run
    };
  }

  async function recompute() {
    pending = false;
    markComputing();
    const began = performance.now();
    const generation = (state.generation += 1);
    const current = () => generation === state.generation;
    // what the page cannot read (or could read two ways) is refused beside its field: nothing is priced
    const refused = pageProblems(scope);
    if (refused.length) {
      notBusy();
      clearErrors();
      showPageProblems(refused);
      setStale(allPanels, true);
      caughtUp();
      return;
    }
    const doc = structuredClone(state.doc);
    stopStaleWork();
    // Dim the premium only when the price takes a while: a class change on every edit
    // would make the browser restyle the page while the engines run.
    clearTimeout(busyTimer);
    busyTimer = setTimeout(() => document.body.classList.add('busy'), 120);
    // With no card in the window, the cards' calls wait until the price is drawn (at most 50 ms):
    // on a two-core laptop they would share the cores with the price and its drawing.
    let priceDrawn = null;
    const cardsSeen = followingPanels.some((panel) => inWindow(panel));
    const hold = cardsSeen ? null : Promise.race([new Promise((resolve) => (priceDrawn = resolve)), delay(50)]);
    const release = () => priceDrawn?.();
    const calls = post(doc, hold);
    let price;
    try {
      price = await calls.pricing;
    } catch (err) {
      release();
      if (!current() || err instanceof Cancelled) return;
      notBusy();
      clearErrors();
      showFailure(err);
      setStale(allPanels, true);
      caughtUp();
      return;
    }
    if (!current()) return release();
    // The cards below the price that are in the window (profile, schedule, ladder: a few
    // milliseconds behind it on their worker) are waited for, as long as they took last time if
    // that was at most 8 ms and never past 10 ms into the recompute, so that what the user sees
    // changes in one go: one layout, one frame, no frame where the premium has moved and the
    // chart has not. A card out of the window is not waited for (the price would only show
    // later). When they came later (a structure on a smile), when the price itself came late,
    // or when the cards are held back until the price is in (on opening, main.js), the price is
    // shown at once and the cards as they come.
    const cardCalls = [calls.profiling, calls.hedging, calls.laddering]
      .map((call, i) => [call, followingPanels[i]])
      .filter(([call]) => call);
    const following = cardCalls.map(([call]) => call);
    const seen = cardCalls.filter(([, panel]) => inWindow(panel)).map(([call]) => call);
    let cardsIn = false;
    Promise.allSettled(following).then(() => {
      cardsIn = true;
    });
    const held = desk.held !== null;
    const wait = held || !seen.length ? 0 : cardsWait(performance.now() - began);
    if (wait > 0) await Promise.race([Promise.allSettled([...seen, calls.fingerprinting]), delay(wait)]);
    if (!held) measureCards(price, seen); // (held back, their lag says nothing about the next edit)
    if (!current()) return release();
    notBusy();
    clearErrors();
    state.price = price;
    renderPrice(doc, price);
    showMarketFigures(doc, price);
    setStale(['price'], false);
    renderCurrency(doc);
    release();
    // The print-only sheet (printing fills it again anyway): with the price when the cards are
    // in too (one frame), else in a task of its own after this frame, while the cards are
    // awaited (on opening, it is not drawn with the first figures).
    const sheet = started(
      cardsIn
        ? refreshSheet(doc, price, calls.fingerprinting, current)
        : delay(0).then(() => refreshSheet(doc, price, calls.fingerprinting, current)),
    );
    const profile = calls.profiling ? await showProfile(doc, price, calls.profiling, current) : null;
    if (!current()) return;
    const schedule = await hedge.update(doc, price, generation, calls.hedging);
    await ladder.update(generation, calls.laddering, price);
    await solve.update(generation, calls.solving, price);
    await compare.update(generation, calls.comparing);
    simulate.update(doc, price);
    await sheet;
    if (!current()) return;
    caughtUp();
    // kept for a reload once this frame is drawn: storage can wait
    setTimeout(() => keepFigures({ doc, price, profile, hedge: schedule }), 0);
  }

  /**
   * Show the last good figures kept from before a reload, greyed and marked as such, until the
   * first recompute replaces them (or, if the trade is refused, stays on them).
   */
  function showKept({ doc, price, profile, hedge: schedule }) {
    try {
      renderPrice(doc, price);
      showMarketFigures(doc, price);
      renderCurrency(doc);
      if (profile) drawProfile(doc, price, profile);
      if (schedule) hedge.showSchedule(schedule);
    } catch {
      return; // figures from another version of the page: the recompute draws afresh
    }
    state.price = price;
    const panels = ['price', ...(profile ? ['profile'] : []), ...(schedule ? ['hedge'] : [])];
    setStale(panels, true);
    for (const node of document.querySelectorAll('[data-panel]'))
      if (panels.includes(node.dataset.panel)) node.classList.add('restored');
  }

  /**
   * Draw the profile `pending` brings, unless a newer edit came first (`current()` false); a
   * break-even outside the automatic range asks for the profile again over a range that has it.
   * Returns the profile drawn, or null.
   */
  async function showProfile(doc, price, pending, current) {
    try {
      let profile = await pending;
      const missed = missedBreakEvens(doc, profile);
      if (missed.length && current()) profile = await desk.call('profile', profileRequest(doc, missed));
      if (!current()) return null;
      drawProfile(doc, price, profile);
      setStale(['profile'], false);
      return profile;
    } catch (err) {
      if (!current() || err instanceof Cancelled) return null;
      setStale(['profile'], true);
      if (err instanceof EngineError) showError(err.field, err.message, err.detail);
      return null;
    }
  }

  return { changed, recompute, showKept, refreshSheet };
}

function renderCurrency(doc) {
  const ccy = amountCurrency(doc);
  for (const node of document.querySelectorAll('.ccy')) node.textContent = ccy;
}

/**
 * Fill the print-only quote sheet for `doc` priced at `price`, stamped with the time now; with
 * `current` (a recompute's), nothing if a newer edit came first.
 */
async function refreshSheet(doc, price, fingerprinting = fingerprint(doc).catch(() => null), current = () => true) {
  const valuedAt = formatStamp(new Date());
  const code = await fingerprinting;
  if (!current()) return;
  renderSheet(doc, price, {
    fingerprint: code,
    valuedAt,
    currency: amountCurrency(doc),
    internal: document.getElementById('sheet-internal')?.checked === true,
  });
  setResult('fingerprint', code ?? '–');
}
