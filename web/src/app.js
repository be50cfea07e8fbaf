// Hedgeleaf page: start-up, the trade document, recomputing and the file actions.
//
// Flow: an input writes one field of state.doc -> a debounced recompute sends
// the document to the engine worker -> results are drawn, or the engine's
// message is put beside the field it names while the last good figures stay
// on screen, greyed.
import { Cancelled, EngineChannel, started } from './compute.js';
import { drawChart } from './chart.js';
import { todayIso, addYears } from './dates.js';
import { EngineError } from './engine.js';
import { formatNumber } from './format.js';
import {
  changeShape, contractExpiry, contractKey, errorPathOf, fillInput, shapes, switchExpiryMode, writeInput,
} from './form.js';
import { pathAncestors } from './paths.js';
import { renderPrice, renderSheet, setResult } from './render.js';
import {
  autosave, download, fingerprint, loadAutosave, parseTradeText, slug, toBase64Url, tradeFileText, tradeFromHash,
} from './share.js';
import { ladderPanel, solvePanel } from './desk.js';
import { hedgePanel } from './hedge.js';
import { simulatePanel } from './simulate.js';

const $ = (id) => document.getElementById(id);
const form = $('terms');
const scope = document.querySelector('main');  // the terms form and the hedge and simulation cards

/** Everything the page knows; the trade document is the source of truth. */
const state = {
  doc: null,
  price: null,
  generation: 0,
  commands: [],
  seed: '',
  pristineHtml: '',
  storageWarning: null,
};

/** The browser's local storage, or null where it is switched off (reading it may throw). */
const storage = (() => {
  try {
    return globalThis.localStorage ?? null;
  } catch {
    return null;
  }
})();

// ---------------------------------------------------------------- engine
const engineText = $('engine-js').textContent;
const workerUrl = URL.createObjectURL(new Blob([engineText, '\n', $('worker-js').textContent], { type: 'text/javascript' }));
const makeWorker = () => new Worker(workerUrl, { name: 'hedgeleaf-engine' });
const mainThreadFactory = () => globalThis.createHedgeleaf;
// Two engines on two workers: `live` prices, `desk` runs the profile, hedge schedule,
// ladder and solve for the same edit at the same time, so the slowest of them, not
// their sum, sets how long a recompute takes.
const live = new EngineChannel(makeWorker, mainThreadFactory);
const desk = new EngineChannel(makeWorker, mainThreadFactory);
let liveStarted = 0;

// ---------------------------------------------------------------- messages
/** Show a line at the top; `action` = {label, run} adds a button to it (e.g. Undo). */
function notice(text, kind = 'info', action = null) {
  const banner = $('notice');
  banner.textContent = text;
  banner.dataset.kind = kind;
  banner.hidden = !text;
  if (action) {
    const button = document.createElement('button');
    button.type = 'button';
    button.className = 'small';
    button.textContent = action.label;
    button.addEventListener('click', action.run);
    banner.append(' ', button);
  }
}

function clearErrors(prefixes) {
  for (const node of document.querySelectorAll('[data-error]')) {
    const path = node.dataset.error;
    if (prefixes && !prefixes.some((p) => path === p || path.startsWith(`${p}.`) || path.startsWith(`${p}[`))) continue;
    if (!node.classList.contains('shown') && node.textContent === '') continue;  // nothing to clear: leave the DOM alone
    node.textContent = '';
    node.classList.remove('shown');
    const input = node.errorInput;
    if (input) input.removeAttribute('aria-invalid');
  }
}

/** Put the engine's message beside the field it names (or its nearest shown parent). */
function showError(field, message) {
  for (const path of pathAncestors(field)) {
    const node = [...document.querySelectorAll('[data-error]')].find((n) => n.dataset.error === path && !n.closest('[hidden]'));
    if (!node) continue;
    node.textContent = message;
    node.classList.add('shown');
    if (node.errorInput) node.errorInput.setAttribute('aria-invalid', 'true');
    return node;
  }
  return null;
}

function setStale(panels, stale) {
  for (const node of document.querySelectorAll('[data-panel]')) {
    if (panels.includes(node.dataset.panel)) node.classList.toggle('stale', stale);
  }
}

// ---------------------------------------------------------------- form <-> document
let errorId = 0;
/** Give a bound input its error line (data-error follows the path it writes). */
function attachError(input) {
  if (input.errorNode || input.type === 'radio') return;
  const holder = input.closest('.field, .cell') ?? input.parentElement;
  const node = document.createElement('span');
  node.className = 'field-error';
  node.setAttribute('role', 'alert');
  node.id = `error-${(errorId += 1)}`;
  node.errorInput = input;
  input.errorNode = node;
  input.setAttribute('aria-describedby', node.id);
  holder.append(node);
}

function syncErrorPaths() {
  for (const input of scope.querySelectorAll('[data-path], [data-role]')) {
    attachError(input);
    const path = errorPathOf(state.doc, input);
    // Inputs whose field moves with the contract (expiry, exercise, dividend dates) carry
    // the path they write now, so automation finds every input by data-path.
    if (input.dataset.role && input.type !== 'radio' && input.dataset.path !== path) {
      if (path) input.dataset.path = path;
      else delete input.dataset.path;
    }
    if (!input.errorNode) continue;
    if (input.errorNode.dataset.error !== path) input.errorNode.dataset.error = path;
  }
}

function fillForm() {
  renderContract();
  renderDividends();
  for (const input of form.querySelectorAll('[data-path], [data-role]')) fillInput(state.doc, input);
  hedge.render();
  simulate.render();
  ladder.render();
  solve.render();
  const mode = contractExpiry(state.doc).expiry_years !== undefined ? 'tenor' : 'date';
  for (const radio of form.querySelectorAll('input[name="expiry-mode"]')) radio.checked = radio.value === mode;
  updateVisibility();
  syncErrorPaths();
}

function updateVisibility() {
  const key = contractKey(state.doc);
  const holder = key === 'legs' ? null : state.doc[key] || {};
  const mode = form.querySelector('input[name="expiry-mode"]:checked')?.value ?? 'date';
  $('single-terms').hidden = key !== 'option';
  $('structure-strikes').hidden = key !== 'structure';
  $('legs-editor').hidden = key !== 'legs';
  $('shared-terms').hidden = key === 'legs';
  $('payout-field').hidden = !(key === 'option' && String(holder?.type).startsWith('digital'));
  $('expiry-date-field').hidden = mode !== 'date';
  $('expiry-tenor-field').hidden = mode !== 'tenor';
  $('exercise-dates-field').hidden = holder?.exercise !== 'bermudan';
  updateMarginField();
  const bermudan = form.querySelector('[data-role="exercise"] option[value="bermudan"]');
  bermudan.disabled = key === 'structure';
  const shape = key === 'structure' ? holder.shape : key;
  $('shape').value = shape in shapes || shape === 'option' || shape === 'legs' ? shape : 'option';
  $('shape-hint').textContent = key === 'structure' ? shapes[holder.shape]?.[1] ?? '' : key === 'legs' ? 'Each leg is its own option with a signed quantity per unit of the structure.' : '';
}

/** The margin is typed in price units, percent of the premium or volatility points, by its type. */
function updateMarginField() {
  const type = state.doc.quote?.margin_type ?? 'absolute';
  const input = $('margin-input');
  input.dataset.kind = type === 'absolute' ? 'number' : 'percent';
  $('margin-label').textContent = { absolute: 'Margin per unit', fraction_of_premium: 'Margin, % of premium', volatility: 'Margin, vol points' }[type] ?? 'Margin';
  fillInput(state.doc, input);
}

function labelled(text, input, className = 'field') {
  const label = document.createElement('label');
  label.className = className;
  const span = document.createElement('span');
  span.textContent = text;
  label.append(span, input);
  return label;
}

function numberInput(path) {
  const input = document.createElement('input');
  input.dataset.path = path;
  input.dataset.kind = 'number';
  input.inputMode = 'decimal';
  input.autocomplete = 'off';
  return input;
}

function removeButton(text, onClick) {
  const button = document.createElement('button');
  button.type = 'button';
  button.className = 'small remove';
  button.textContent = '✕';
  button.setAttribute('aria-label', text);
  button.title = text;
  button.addEventListener('click', onClick);
  return button;
}

function renderDividends() {
  const list = Array.isArray(state.doc.market?.dividends) ? state.doc.market.dividends : [];
  $('dividend-rows').replaceChildren(...list.map((_, i) => {
    const row = document.createElement('div');
    row.className = 'row list-row';
    const when = document.createElement('input');
    when.dataset.role = 'when';
    when.dataset.base = `market.dividends[${i}]`;
    when.dataset.keys = 'date,time_years';
    when.autocomplete = 'off';
    when.placeholder = 'YYYY-MM-DD or years';
    row.append(labelled(`Dividend ${i + 1}: pay date`, when), labelled('Cash per share', numberInput(`market.dividends[${i}].amount`)),
      removeButton(`Remove dividend ${i + 1}`, () => {
        state.doc.market.dividends.splice(i, 1);
        if (state.doc.market.dividends.length === 0) delete state.doc.market.dividends;
        fillForm();
        changed();
      }));
    return row;
  }));
}

const strikeNames = { 1: ['Strike'], 2: ['Lower strike', 'Upper strike'], 3: ['Low strike', 'Middle strike', 'High strike'] };

function renderContract() {
  const key = contractKey(state.doc);
  if (key === 'structure') {
    const strikes = Array.isArray(state.doc.structure?.strikes) ? state.doc.structure.strikes : [];
    const names = strikeNames[strikes.length] ?? strikes.map((_, i) => `Strike ${i + 1}`);
    $('structure-strikes').replaceChildren(...strikes.map((_, i) => labelled(names[i], numberInput(`structure.strikes[${i}]`))));
  } else $('structure-strikes').replaceChildren();
  if (key === 'legs') renderLegs();
  else $('leg-rows').replaceChildren();
}

function choice(path, options, role) {
  const select = document.createElement('select');
  if (role) select.dataset.role = role;
  else select.dataset.path = path;
  select.dataset.kind = 'choice';
  for (const [value, text] of options) select.append(new Option(text, value));
  return select;
}

function renderLegs() {
  const legs = Array.isArray(state.doc.legs) ? state.doc.legs : [];
  $('leg-rows').replaceChildren(...legs.map((leg, i) => {
    const base = `legs[${i}]`;
    const row = document.createElement('div');
    row.className = 'row list-row leg-row';
    const type = choice(`${base}.type`, [['call', 'Call'], ['put', 'Put'], ['digital-call', 'Digital call'], ['digital-put', 'Digital put'], ['stock', 'Share']]);
    const cells = [labelled(`Leg ${i + 1}`, type), labelled('Quantity', numberInput(`${base}.quantity`))];
    if (leg && leg.type !== 'stock') {
      const when = document.createElement('input');
      when.dataset.role = 'when';
      when.dataset.base = base;
      when.dataset.keys = 'expiry_date,expiry_years';
      when.autocomplete = 'off';
      when.placeholder = 'YYYY-MM-DD or years';
      const exercise = choice('', [['european', 'European'], ['american', 'American'], ['bermudan', 'Bermudan']], 'exercise');
      exercise.dataset.base = base;
      cells.push(labelled('Strike', numberInput(`${base}.strike`)), labelled('Expiry', when), labelled('Exercise', exercise));
    }
    row.append(...cells, removeButton(`Remove leg ${i + 1}`, () => {
      state.doc.legs.splice(i, 1);
      fillForm();
      changed();
    }));
    return row;
  }));
}

/** A field was edited: write it, then recompute soon. */
function onInput(event) {
  const input = event.target;
  if (input.name === 'expiry-mode') {
    switchExpiryMode(state.doc, input.value);
    fillForm();
    changed();
    return;
  }
  if (!input.dataset.path && !input.dataset.role) return;
  writeInput(state.doc, input);
  const structural = input.dataset.kind === 'choice' && (input.dataset.path?.endsWith('.type') || input.dataset.role === 'exercise');
  if (structural) {
    // a leg turning into a share drops its option fields; a digital gains its payout field
    const path = input.dataset.path ?? '';
    const leg = /^legs\[(\d+)\]\.type$/.exec(path);
    if (leg && input.value === 'stock') state.doc.legs[Number(leg[1])] = { type: 'stock', quantity: state.doc.legs[Number(leg[1])].quantity };
    if (path === 'option.type' && !input.value.startsWith('digital')) delete state.doc.option.payout;
    if (leg) renderLegs();
    for (const node of form.querySelectorAll('[data-path], [data-role]')) {
      // leg rows, and the Bermudan dates a change of exercise style may have filled in
      if (node !== input && (node.closest('.leg-row') || node.dataset.role === 'exercise-dates')) fillInput(state.doc, node);
    }
    updateVisibility();
  }
  // choices that change which fields a card shows: redraw the card, keep the focus
  const redraw = { 'ladder.kind': () => ladder.render(), 'hedge.path.shape': () => hedge.render(), 'quote.margin_type': updateMarginField }[input.dataset.path];
  if (redraw) {
    redraw();
    scope.querySelector(`[data-path="${input.dataset.path}"]`)?.focus();
  }
  syncErrorPaths();
  changed();
}

/** Tidy a number once the cursor leaves it (25000 -> 25,000), if it reads as one. */
function onBlur(event) {
  const input = event.target;
  if (!['number', 'percent'].includes(input.dataset?.kind) || input.getAttribute('aria-invalid') === 'true') return;
  fillInput(state.doc, input);
}

function changed(delay = 250) {
  document.body.dataset.computing = 'true';  // automation contract: figures are catching up with the inputs
  saveLocally();
  clearTimeout(changed.timer);
  changed.pending = true;
  changed.timer = setTimeout(recompute, delay);
}

// ---------------------------------------------------------------- recompute
async function recompute() {
  changed.pending = false;
  document.body.dataset.computing = 'true';
  const generation = (state.generation += 1);
  const doc = structuredClone(state.doc);
  // Work for an older trade still running after 0.8 s (a huge lattice): stop it and start afresh
  // rather than queue behind it.
  if (!live.busy && !desk.busy) liveStarted = performance.now();
  else if (performance.now() - liveStarted > 800) {
    live.cancel();
    desk.cancel();
    liveStarted = performance.now();
  }
  // Dim the premium only when the price takes a while: a class change on every edit
  // would make the browser restyle the page while the engines run.
  clearTimeout(recompute.busy);
  recompute.busy = setTimeout(() => document.body.classList.add('busy'), 120);
  // Post every call this edit needs at once: the engines work through them while
  // this thread shows each result as it comes back.
  const pricing = live.call('price', doc);
  const profiling = state.commands.includes('profile') ? started(desk.call('profile', doc)) : null;
  const hedging = hedge.request(doc);
  const laddering = ladder.request(doc);
  const solving = solve.request(doc);
  const fingerprinting = fingerprint(doc).catch(() => null);  // hashed by the browser while the engines run
  let price;
  try {
    price = await pricing;
  } catch (err) {
    if (generation !== state.generation || err instanceof Cancelled) return;
    clearTimeout(recompute.busy);
    document.body.classList.remove('busy');
    clearErrors();
    reportFailure(err);
    setStale(['price', 'profile', 'hedge', 'ladder', 'solve', 'simulate'], true);
    if (!changed.pending) delete document.body.dataset.computing;
    return;
  }
  if (generation !== state.generation) return;
  // The profile, schedule and ladder usually follow within a few milliseconds: wait for
  // them (up to 12 ms) so that the page shows the whole recompute in one go, one layout
  // and no half-updated state; a slower one (a big lattice) comes in on its own later.
  const following = [profiling, hedging, laddering].filter(Boolean);
  if (following.length) await Promise.race([Promise.allSettled(following), new Promise((r) => setTimeout(r, 12))]);
  if (generation !== state.generation) return;
  clearTimeout(recompute.busy);
  document.body.classList.remove('busy');
  clearErrors();
  state.price = price;
  renderPrice(doc, price);
  setStale(['price'], false);
  renderCurrency(doc);
  refreshSheet(doc, price, fingerprinting);
  if (profiling) await runProfile(price, generation, profiling);
  if (generation !== state.generation) return;
  await hedge.update(doc, price, generation, hedging);
  await ladder.update(generation, laddering);
  await solve.update(generation, solving, price);
  simulate.update(doc, price);
  if (generation === state.generation && !changed.pending) delete document.body.dataset.computing;
}

function reportFailure(err) {
  if (err instanceof EngineError) {
    showError(err.field, err.message);
  } else {
    showError('', `The engine could not run: ${err.message}. Reload the page to start it again.`);
  }
}

async function runProfile(price, generation, pending) {
  try {
    const profile = await pending;
    if (generation !== state.generation) return;
    drawProfile(price, profile);
    setStale(['profile'], false);
  } catch (err) {
    if (generation !== state.generation || err instanceof Cancelled) return;
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
  evens.filter((x) => x >= lo && x <= hi).forEach((x, i) => marks.push({ x, label: `break-even ${formatNumber(x, 2)}`, kind: 'break-even', row: i + 1 }));
  const ranges = profile.break_even_ranges.map(([a, b]) => `${formatNumber(a, 2)}–${formatNumber(b, 2)}`);
  const text = [...evens.map((x) => formatNumber(x, 2)), ...ranges].join(' and ') || 'none';
  setResult('break-even', text, evens[0]);
  for (const node of document.querySelectorAll('[data-result="break-even"]')) node.dataset.values = JSON.stringify(evens);
  const labels = { xLabel: `Spot (expiry ${profile.horizon_date ?? `in ${formatNumber(profile.horizon_years, 2)} y`})`, yLabel: 'Profit per unit' };
  drawChart($('profile-chart'), { series, marks, ...labels });
  drawChart($('sheet-chart'), { series, marks, ...labels, height: 220 });
}

async function refreshSheet(doc, price, fingerprinting = fingerprint(doc).catch(() => null)) {
  const stamp = new Date();
  refreshSheet.clock ??= new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeStyle: 'short' });
  const valuedAt = `${refreshSheet.clock.format(stamp)} (UTC${-stamp.getTimezoneOffset() >= 0 ? '+' : '−'}${String(Math.abs(stamp.getTimezoneOffset() / 60)).padStart(2, '0')})`;
  const code = await fingerprinting;
  renderSheet(doc, price, { fingerprint: code, valuedAt, currency: typeof doc.quote?.currency === 'string' ? doc.quote.currency : '' });
  setResult('fingerprint', code ?? '–');
}

// ---------------------------------------------------------------- saving and sharing
function saveLocally() {
  const problem = autosave(storage, { seed: state.seed, trade: state.doc, saved: new Date().toISOString() });
  if (problem !== state.storageWarning) {
    state.storageWarning = problem;
    notice(problem ?? '', problem ? 'warning' : 'info');
  }
}

/** Replace the trade on screen; the one it replaces can be brought back once with Undo. */
function adopt(doc, message) {
  const previous = state.doc;
  state.doc = doc;
  fillForm();
  changed(0);
  if (message) notice(message, 'info', previous && { label: 'Undo', run: () => adopt(previous, 'Brought back the previous trade.') });
}

function fileName(ext) {
  const client = slug(state.doc.quote?.client, '');
  return `${client ? `${client}-` : ''}${slug(describeShort(), 'trade')}${ext}`;
}

function describeShort() {
  const key = contractKey(state.doc);
  if (key === 'option') return `${state.doc.option?.type ?? 'option'}-${state.doc.option?.strike ?? ''}`;
  if (key === 'structure') return state.doc.structure?.shape ?? 'structure';
  return 'legs';
}

async function importFile(file) {
  const refuse = (why) => notice(`“${file.name}” was not opened: ${why} The current trade is unchanged.`, 'warning');
  if (file.size > 1 << 20) return refuse('it is larger than 1 MB.');
  let doc;
  let text;
  try {
    text = await file.text();
    doc = parseTradeText(text);
  } catch (err) {
    return refuse(err instanceof SyntaxError ? 'it is not a JSON trade file.' : `${err.message}.`);
  }
  if (!doc || typeof doc !== 'object' || Array.isArray(doc)) return refuse('it does not hold a trade (a JSON object).');
  try {
    await live.call('price', text);  // the file's own text: the engine's checks (nesting, size) come first
  } catch (err) {
    return refuse(err instanceof EngineError ? `${err.message}.` : `the engine failed (${err.message}).`);
  }
  adopt(doc, `Opened “${file.name}”.`);
}

function exportFile() {
  download(fileName('.json'), tradeFileText(state.doc), 'application/json');
}

async function copyLink() {
  const link = `${location.href.split('#')[0]}#trade=${toBase64Url(JSON.stringify(state.doc))}`;
  try {
    await navigator.clipboard.writeText(link);
    notice('A link to this page with the trade in it is on the clipboard. It works where the same page file sits at the same place.');
  } catch {
    history.replaceState(null, '', link);
    notice('The address bar now holds a link with this trade in it; copy it from there.');
  }
}

/** The page as delivered, with this trade in its embedded-trade block. */
function pageWithTrade(doc) {
  const json = JSON.stringify(doc).replace(/</g, '\\u003c');
  return state.pristineHtml.replace(/(<script type="application\/json" id="embedded-trade">)[\s\S]*?(<\/script>)/, (_, open, close) => `${open}${json}${close}`);
}

function savePageCopy() {
  download(fileName('.html'), pageWithTrade(state.doc), 'text/html');
  notice('Saved a copy of this page that opens with this trade.');
}

function newTrade() {
  const today = todayIso();
  const spot = typeof state.doc.market?.spot === 'number' ? state.doc.market.spot : 100;
  adopt({
    valuation_date: today,
    market: { spot, volatility: 0.25, rate: 0.03 },
    option: { type: 'call', strike: spot, expiry_date: addYears(today, 0.5), exercise: 'american' },
    quantity: 1000,
    side: 'buy',
  }, 'Started a new trade: at the money, six months, valued today.');
}

// ---------------------------------------------------------------- start
function initialTrade() {
  const embedded = $('embedded-trade').textContent.trim();
  state.seed = embedded ? `copy:${embedded.length}:${embedded.slice(0, 64)}` : 'page';
  try {
    const fromLink = tradeFromHash(location.hash);
    if (fromLink !== null) {
      const doc = parseTradeText(fromLink);
      if (!doc || typeof doc !== 'object' || Array.isArray(doc)) throw new Error('it does not hold a trade');
      history.replaceState(null, '', location.href.split('#')[0]);  // from now on autosave keeps the edits
      return { doc, message: 'Opened the trade from the link.' };
    }
  } catch (err) {
    notice(`The trade in the link could not be read (${err.message}); showing the last trade instead.`, 'warning');
  }
  const saved = loadAutosave(storage);
  if (saved && saved.seed === state.seed && saved.trade && typeof saved.trade === 'object') return { doc: saved.trade };
  if (embedded) return { doc: JSON.parse(embedded) };
  return { doc: JSON.parse($('example-trade').textContent) };
}

/** Error lines for inputs a card has just drawn. */
function bindControls() {
  syncErrorPaths();
}

const hedge = hedgePanel({ live: desk, state, showError, setStale, changed, bindControls });
const simulate = simulatePanel({ makeWorker, mainThreadFactory, state, showError, clearErrors, setStale, changed, bindControls });
const ladder = ladderPanel({ live: desk, state, showError, setStale, changed, bindControls });
const solve = solvePanel({ live: desk, state, showError, setStale, changed, bindControls, notice, refill: fillForm });

function start() {
  state.pristineHtml = `<!DOCTYPE html>\n${document.documentElement.outerHTML}`;
  const commandsText = $('engine-commands').textContent.trim();
  state.commands = commandsText ? commandsText.split(',') : ['price'];
  const first = initialTrade();
  state.doc = first.doc;
  if (first.message) notice(first.message);
  document.querySelector('.card[data-panel="profile"]').hidden = !state.commands.includes('profile');
  hedge.setup();
  simulate.setup();
  ladder.setup();
  solve.setup();
  fillForm();
  scope.addEventListener('input', onInput);
  scope.addEventListener('change', (event) => {
    if (event.target.tagName === 'SELECT' || event.target.type === 'checkbox' || event.target.type === 'radio' || event.target.type === 'date') onInput(event);
  });
  scope.addEventListener('focusout', onBlur);
  form.addEventListener('submit', (event) => event.preventDefault());
  $('shape').addEventListener('change', (event) => {
    changeShape(state.doc, event.target.value, state.price?.legs);
    fillForm();
    changed(0);
  });
  $('add-dividend').addEventListener('click', () => {
    state.doc.market ??= {};
    state.doc.market.dividends ??= [];
    const when = state.doc.valuation_date ? addYears(state.doc.valuation_date, 0.25) : null;
    state.doc.market.dividends.push(when ? { date: when, amount: 0 } : { time_years: 0.25, amount: 0 });
    fillForm();
    changed();
    $('dividend-rows').lastElementChild?.querySelector('input')?.focus();
  });
  $('add-leg').addEventListener('click', () => {
    state.doc.legs ??= [];
    const spot = typeof state.doc.market?.spot === 'number' ? state.doc.market.spot : 100;
    state.doc.legs.push({ type: 'call', strike: spot, ...contractExpiry(state.doc), quantity: 1 });
    fillForm();
    changed();
  });
  $('import-file').addEventListener('change', (event) => {
    const file = event.target.files?.[0];
    event.target.value = '';
    if (file) importFile(file);
  });
  $('action-export').addEventListener('click', exportFile);
  $('action-link').addEventListener('click', copyLink);
  $('action-copy-page').addEventListener('click', savePageCopy);
  $('action-new').addEventListener('click', newTrade);
  $('action-print').addEventListener('click', () => window.print());
  window.addEventListener('beforeprint', () => state.price && refreshSheet(structuredClone(state.doc), state.price));
  window.addEventListener('hashchange', () => {
    try {
      const text = tradeFromHash(location.hash);
      if (text !== null) {
        history.replaceState(null, '', location.href.split('#')[0]);
        adopt(parseTradeText(text), 'Opened the trade from the link.');
      }
    } catch (err) {
      notice(`The trade in the link could not be read (${err.message}).`, 'warning');
    }
  });
  document.body.classList.add('ready');
  recompute();
}

start();
