// Hedgeleaf page: alternatives side by side (a comparison document, docs/trade-file.md).
//
// A comparison is {"comparison": {"title", "alternatives": [trade, ...]}}: up to four whole trade
// documents. One of them is in the normal editor at a time: state.doc IS that alternative (the
// same object), so every edit the form makes lands in it and nothing typed, valid or not, is lost
// when another is opened. The figures (the table and the curves of the chart) are the engine's
// `compare` command's, asked for on every recompute and drawn by compare-view.js; the printed
// comparison is compare-sheet.js's. Save file, Copy link, Save page and autosave carry the whole
// comparison document (pageDocument).
import { Cancelled, started } from './compute.js';
import { button, byId, make, setText } from './dom.js';
import { EngineError } from './engine.js';
import { renderComparisonSheet } from './compare-sheet.js';
import { alternativeLabel, drawComparison } from './compare-view.js';

/** The most alternatives a comparison holds (the engine's limit, schema/comparison.schema.json). */
export const maxAlternatives = 4;

/** True for a comparison document (an object with a `comparison` object in it). */
export function isComparison(doc) {
  return (
    doc !== null &&
    typeof doc === 'object' &&
    doc.comparison !== null &&
    typeof doc.comparison === 'object' &&
    !Array.isArray(doc.comparison)
  );
}

/**
 * Why `doc` cannot be opened as a comparison on the page (its alternatives are not a list of one to
 * four objects), or null. What is inside an alternative is the engine's to judge once it is open.
 */
export function comparisonProblem(doc) {
  const list = doc.comparison.alternatives;
  if (!Array.isArray(list) || list.length === 0) return 'its comparison has no list of alternatives';
  if (list.length > maxAlternatives)
    return `its comparison has ${list.length} alternatives; a comparison holds at most ${maxAlternatives}`;
  if (!list.every((a) => a !== null && typeof a === 'object' && !Array.isArray(a)))
    return 'an alternative of its comparison is not a trade (a JSON object)';
  return null;
}

/**
 * Put `doc` on the page: a comparison opens with its first alternative in the editor, a trade
 * alone closes any comparison. Sets state.doc (and state.comparison).
 */
export function openDocument(state, doc) {
  if (isComparison(doc) && !comparisonProblem(doc)) {
    state.comparison = { doc, editing: 0 };
    state.doc = doc.comparison.alternatives[0];
  } else {
    state.comparison = null;
    state.doc = doc;
  }
}

/** The document the page saves, links and keeps: the whole comparison when one is open, else the trade. */
export function pageDocument(state) {
  const c = state.comparison;
  if (!c) return state.doc;
  c.doc.comparison.alternatives[c.editing] = state.doc; // the editor may have replaced the object
  return c.doc;
}

/** A short name for the page's document (file names, recent work): the comparison's title. */
export function comparisonTitle(doc) {
  const title = typeof doc.comparison.title === 'string' ? doc.comparison.title.trim() : '';
  return title || `comparison of ${doc.comparison.alternatives?.length ?? 0}`;
}

/**
 * The "Side by side" card over `state`: start a comparison with the trade on screen, add, open,
 * duplicate and remove alternatives, name the comparison, print it. `desk` runs `compare`;
 * `refill` draws the editor again and `changed` recomputes (and autosaves).
 */
export function comparisonPanel({ state, desk, refill, changed, setStale }) {
  const card = byId('compare-card');
  const list = byId('compare-list');
  const message = byId('compare-message');
  const title = byId('compare-title');
  let last = null; // the last good comparison result, for the sheet

  const alternatives = () => state.comparison.doc.comparison.alternatives;

  function say(text) {
    setText(message, text);
    message.hidden = !text;
  }

  /** Put alternative `i` in the editor (the list as it is now; the one there was kept already). */
  function show(i) {
    state.comparison.editing = i;
    state.doc = alternatives()[i];
    refill();
    changed(0);
    byId('terms').querySelector('input:not([hidden])')?.focus({ preventScroll: true }); // the editor has it now
  }

  /** Show alternative `i` in the editor; what was typed in the one there stays in it. */
  function edit(i) {
    pageDocument(state);
    show(i);
  }

  function add(copyOf) {
    pageDocument(state);
    if (!state.comparison) {
      state.comparison = { doc: { comparison: { title: '', alternatives: [state.doc] } }, editing: 0 };
    }
    const list = alternatives();
    if (list.length >= maxAlternatives) {
      say(
        `A comparison holds at most ${maxAlternatives} alternatives: remove one before adding another. Nothing was added.`,
      );
      return;
    }
    const copy = structuredClone(list[copyOf]);
    const label = copy.quote?.label;
    if (typeof label === 'string' && label) copy.quote.label = `${label} (copy)`.slice(0, 60);
    list.splice(copyOf + 1, 0, copy);
    say('');
    show(copyOf + 1);
  }

  function remove(i) {
    pageDocument(state);
    const list = alternatives();
    list.splice(i, 1);
    say('');
    if (list.length === 0) {
      state.comparison = null;
      refill();
      changed(0);
      return;
    }
    const editing = state.comparison.editing;
    show(editing > i ? editing - 1 : Math.min(editing, list.length - 1));
  }

  /** Back to one trade: the one in the editor stays. */
  function close() {
    state.comparison = null;
    say('');
    refill();
    changed(0);
  }

  /** Draw the card's controls for the comparison as it is now (no figures). */
  function render() {
    const open = state.comparison !== null;
    card.classList.toggle('comparing', open);
    byId('compare-start').hidden = open;
    for (const node of card.querySelectorAll('.compare-open')) node.hidden = !open;
    if (!open) {
      delete list.dataset.key;
      list.replaceChildren();
      byId('compare-output').hidden = true;
      return;
    }
    const doc = state.comparison.doc.comparison;
    if (title.value !== (doc.title ?? '')) title.value = typeof doc.title === 'string' ? doc.title : '';
    // drawn again only when a name or the one in the editor changes, so a recompute keeps the focus
    const key = JSON.stringify([state.comparison.editing, ...alternatives().map(alternativeLabel)]);
    if (list.dataset.key === key) return;
    list.dataset.key = key;
    list.replaceChildren(
      ...alternatives().map((alt, i) => {
        const name = alternativeLabel(alt, i);
        const here = i === state.comparison.editing;
        return make('li', { className: here ? 'editing' : '' }, [
          make('span', { className: 'compare-name', text: `${i + 1}. ${name}` }),
          here
            ? make('span', { className: 'compare-here', text: 'in the editor' })
            : button('Edit', () => edit(i), { 'aria-label': `Edit alternative ${i + 1}: ${name}` }),
          button('Duplicate', () => add(i), { 'aria-label': `Duplicate alternative ${i + 1}: ${name}` }),
          button('Remove', () => remove(i), { 'aria-label': `Remove alternative ${i + 1}: ${name}` }),
        ]);
      }),
    );
  }

  function wire() {
    byId('compare-start').addEventListener('click', () => add(0));
    byId('compare-add').addEventListener('click', () => add(state.comparison.editing));
    byId('compare-close').addEventListener('click', close);
    byId('compare-print').addEventListener('click', () => {
      document.body.dataset.print = 'comparison';
      window.print();
    });
    window.addEventListener('afterprint', () => delete document.body.dataset.print);
    title.addEventListener('input', () => {
      state.comparison.doc.comparison.title = title.value;
      changed();
    });
  }

  /** The engine's comparison of what is on the page now, `doc` being the editor's (a copy), or null. */
  function request(doc) {
    if (!state.comparison) return null;
    const whole = structuredClone(pageDocument(state));
    whole.comparison.alternatives[state.comparison.editing] = doc;
    return started(desk.call('compare', whole));
  }

  /** Draw the comparison `pending` brings unless a newer edit came first; an engine refusal is said in the card. */
  async function update(generation, pending) {
    render();
    if (!pending) {
      last = null; // no comparison: nothing of one may stay, greyed
      setStale(['compare'], false);
      return;
    }
    try {
      const result = await pending;
      if (generation !== state.generation) return;
      last = result;
      say('');
      byId('compare-output').hidden = false;
      drawComparison(byId('compare-figures'), byId('compare-chart'), result, state.comparison.doc);
      renderComparisonSheet(result, state.comparison.doc);
      setStale(['compare'], false);
    } catch (err) {
      if (generation !== state.generation || err instanceof Cancelled) return;
      setStale(['compare'], true);
      say(err instanceof EngineError ? refusal(err) : `The comparison could not be made: ${err.message}`);
    }
  }

  /** "comparison.alternatives[1].market.volatility: …" said with the alternative's number and name. */
  function refusal(err) {
    const match = /^comparison\.alternatives\[(\d+)\]\.?/.exec(err.field ?? '');
    if (!match) return `The comparison is refused: ${err.message}`;
    const i = Number(match[1]);
    const alt = alternatives()[i];
    return `Alternative ${i + 1} (${alt ? alternativeLabel(alt, i) : 'missing'}) is refused: ${err.message}. Edit it to see the field.`;
  }

  /** Print the comparison sheet again with the time now (before printing). */
  function refreshSheet() {
    if (state.comparison && last) renderComparisonSheet(last, state.comparison.doc);
  }

  return { render, wire, request, update, refreshSheet };
}
