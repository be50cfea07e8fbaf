// Hedgeleaf page: start-up and wiring; each part's work is in its own file.
//
// Flow: an input writes one field of state.doc (edits.js) -> a debounced
// recompute sends the document to the engine workers (recompute.js) -> results
// are drawn (render.js, chart.js and each card), or the engine's message is put
// beside the field it names while the last good figures stay on screen, greyed
// (messages.js). terms.js draws the terms form; saving.js moves the trade in
// and out of the page; the cards (hedge.js, simulate.js, desk.js) get what they
// use passed in here.
import { comparisonPanel, openDocument } from './compare.js';
import { pairForm } from './currency.js';
import { EngineChannel, delay } from './compute.js';
import { ladderPanel, solvePanel } from './desk.js';
import { byId, inWindowWatch } from './dom.js';
import { listenForEdits } from './edits.js';
import { formatDate, formatNumber, formatStamp } from './format.js';
import { hedgePanel } from './hedge.js';
import { localePicker } from './locale.js';
import { marketEditor } from './market-editor.js';
import { clearErrors, notice, pageProblems, setStale, showError, syncErrorPaths } from './messages.js';
import { fillProfileRange } from './profile.js';
import { recomputeCycle } from './recompute.js';
import { describeWork, recentMenu } from './recent.js';
import { fileActions, openingTrade, pageSeed } from './saving.js';
import { simulatePanel } from './simulate.js';
import { snapshotTools } from './snapshot.js';
import { browserStore, commandsFrom, pageState } from './state.js';
import { termsForm } from './terms.js';
import { engineWorkers } from './workers.js';
import { workStore } from './work.js';

const scope = document.querySelector('main'); // the terms form and every card
const state = pageState(commandsFrom(byId('engine-commands').textContent));

// The engine's WebAssembly is compiled once, by the first worker, and every later
// worker gets the compiled module (workers.js engineWorkers). Two engines on two
// workers share an edit's calls, so that the slower of them, not the sum, sets how
// long a recompute takes: `live` prices and then runs the hedge schedule (it takes
// the trade's premium from the price just made: analytics/pricing.cpp), `desk` runs
// the profile, ladder, solve and comparison. The simulation has a worker of its own.
// The first worker was started from the page's <head> (boot.js), before the body was parsed.
const workers =
  globalThis.hedgeleafWorkers ??
  engineWorkers(byId('engine-js').textContent, byId('worker-js').textContent, byId('engine-wasm').textContent);
const makeWorker = workers.make;
const mainThreadFactory = workers.mainThread;
const live = new EngineChannel(makeWorker, mainThreadFactory);
const desk = new EngineChannel(makeWorker, mainThreadFactory);
live.start(); // the engine loads on its worker while this thread builds the page

/** Error lines for every bound input, pointed at the fields they write now. */
const bindControls = () => syncErrorPaths(scope, state.doc);
// The cards ask for a recompute and the recompute asks the cards for their figures:
// the cards are made first, with this forward call into the cycle made after them.
const changed = (delay, since) => cycle.changed(delay, since);
const shared = { state, showError, setStale, changed, bindControls };
const hedge = hedgePanel({ ...shared, live });
const simulate = simulatePanel({ ...shared, makeWorker, mainThreadFactory, clearErrors });
const ladder = ladderPanel({ ...shared, live: desk });
const solve = solvePanel({ ...shared, live: desk, notice, refill: fillForm });
const compare = comparisonPanel({ state, desk, refill: fillForm, changed, setStale });
const cards = [hedge, simulate, ladder, solve];
// Work is kept per tab and in a list of recent work (work.js).
const work = workStore({
  session: browserStore('sessionStorage'),
  local: browserStore('localStorage'),
  seed: pageSeed(),
  describe: describeWork,
  reloaded: performance.getEntriesByType('navigation')[0]?.type === 'reload',
});
// the cards whose figures the price waits for when they are in the window (recompute.js)
const cardOf = (panel) => document.querySelector(`.card[data-panel="${panel}"]`);
const cardsInWindow = inWindowWatch(['profile', 'hedge', 'ladder'].map(cardOf));
const cycle = recomputeCycle({
  state,
  live,
  desk,
  cards: { hedge, ladder, solve, simulate, compare },
  save: () => files.keep(),
  keepFigures: (figures) => work.keepFigures(figures),
  scope,
  inWindow: (panel) => cardsInWindow(cardOf(panel)),
});
const terms = termsForm({ form: byId('terms'), state, refill: fillForm, changed });
const pair = pairForm({ state, refill: fillForm, changed });
const market = marketEditor({
  state,
  refill: fillForm,
  changed,
  announce: (text) => notice(text, 'info', null, 'paste'),
});
const snapshot = snapshotTools({ state, live, refill: fillForm, changed });
const files = fileActions({ state, work, live, refill: fillForm, changed });
const recent = recentMenu({ work, state, adopt: files.adopt });

/** Show the whole trade document: the terms form, every card's controls and their error lines. */
function fillForm() {
  market.fill(); // before the terms: the grid's and curves' cells are filled with the rest of the form
  pair.fill(); // the pair's choices and where its rates write, before the terms fill them
  terms.fill();
  snapshot.showAge();
  fillProfileRange(state.doc);
  for (const card of cards) card.render();
  compare.render();
  bindControls();
}

/**
 * The printed sheet is the client's unless the internal switch is on; the choice is the desk's
 * and is remembered in this browser (never in the trade file, so a shared trade prints client-safe).
 */
function wireInternalSwitch() {
  rememberedSwitch('sheet-internal', 'hedgeleaf.sheet.internal', () => {
    if (state.price) cycle.refreshSheet(structuredClone(state.doc), state.price);
  });
}

/** A checkbox the desk sets once for this browser (never in the trade file); `apply` runs on every change. */
function rememberedSwitch(id, key, apply) {
  const store = browserStore('localStorage');
  const box = byId(id);
  try {
    box.checked = store?.getItem(key) === 'on';
  } catch {
    box.checked = false;
  }
  box.addEventListener('change', () => {
    try {
      store?.setItem(key, box.checked ? 'on' : 'off');
    } catch {
      // storage switched off or full: the switch still applies to this page
    }
    apply(box.checked);
  });
  apply(box.checked);
}

/** Show to client: the presentation view (larger type, the desk's figures hidden), remembered. */
function wirePresentSwitch() {
  rememberedSwitch('present-view', 'hedgeleaf.view.present', (on) => document.body.classList.toggle('presenting', on));
}

async function start() {
  // The first worker's packed engine, posted from the <head>, reaches it only once this thread
  // has had a turn after the worker started (Chromium holds a message to a worker that has not
  // run its script yet on the page's thread): the page waits for the worker to say it has the
  // engine (workers.js `started`, at most 250 ms) before building the form, so that the worker
  // unpacks and compiles while this thread works, not after.
  await Promise.race([workers.started, delay(250)]);
  // the page as delivered, before anything is drawn: a copy of its nodes (the big texts are
  // shared, not copied), written out as HTML only when a copy of the page is saved
  state.pristine = document.documentElement.cloneNode(true);
  document.querySelector('.card[data-panel="profile"]').hidden = !state.commands.includes('profile');
  const locales = localePicker({ store: browserStore('localStorage'), redraw: () => (fillForm(), changed(0)) });
  const first = await openingTrade(state, work, live);
  openDocument(state, first.doc);
  // The price is asked for first, before the form is drawn, so that the engine worker
  // prices while this thread builds the page. The cards' calls wait for the price (on a
  // slow laptop they would compete with it for the cores: they show soon after it); the
  // cards below the terms, off screen at first, are built once the first figures are in
  // (at once when figures kept from before a reload are shown); the engine warms up last.
  const setUpCards = () => {
    for (const card of cards) card.setup();
    fillProfileRange(state.doc);
    bindControls();
  };
  desk.holdUntil(live.answered);
  cycle.recompute().finally(() => {
    if (!first.figures) setUpCards();
    desk.warmUp(state.doc);
    // the format picker's other choices (each loads its locale's data) once the browser is idle
    (globalThis.requestIdleCallback ?? setTimeout)(() => locales.fillChoices());
  });
  if (first.figures) setUpCards();
  market.fill();
  pair.fill();
  terms.fill();
  compare.render();
  snapshot.showAge();
  fillProfileRange(state.doc);
  bindControls();
  // A trade opened with text in a number field (a half-typed one, from a link, a file or this
  // tab): the first price was asked for before the form held it, so the engine's first refusal
  // is all it could say; once the form is drawn, the page's own words beside every such field.
  if (pageProblems(scope).length) changed(0);
  // The browser's number and date formats take some 10-30 ms each to make the first time:
  // make those the first figures use (premium, expiry, the sheet's time stamp) while the
  // engine prices, in a task after this one so that the form is drawn first.
  setTimeout(() => {
    formatNumber(0, 2);
    formatNumber(0, 4);
    formatDate('2000-01-01');
    formatStamp(new Date());
  }, 0);
  listenForEdits({
    scope,
    state,
    terms,
    redraws: new Map([
      ['ladder.kind', ladder.kindChanged],
      ['hedge.path.shape', hedge.render],
      ['quote.margin_type', terms.updateMarginField],
    ]),
    syncErrors: bindControls,
    changed,
  });
  byId('terms').addEventListener('submit', (event) => event.preventDefault());
  terms.wire();
  pair.wire();
  market.wire();
  snapshot.wire();
  files.wire();
  compare.wire();
  recent.wire();
  if (first.message) notice(first.message.text, first.message.kind, null, first.message.topic);
  if (first.keep) files.keep(); // a link's trade is kept at once, not only once edited
  if (first.figures) cycle.showKept(first.figures);
  if (first.fresh && !first.message) recent.offerLatest();
  wireInternalSwitch();
  wirePresentSwitch();
  byId('action-print').addEventListener('click', () => window.print());
  window.addEventListener('beforeprint', () => {
    if (state.price) cycle.refreshSheet(structuredClone(state.doc), state.price);
    compare.refreshSheet();
  });
  document.body.classList.add('ready');
}

start();
