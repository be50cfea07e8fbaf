// Hedgeleaf page: the trade in and out of the page.
//
// The trade the page opens with (a link, this tab's own trade, the trade embedded in a saved
// page copy, the example); keeping every edit (work.js); and the file actions: open a file,
// save a file, copy a link, save the page with the trade, start a new trade, open a link typed
// into the address. Whatever comes from outside (a file, a link) is checked the same way, by
// the engine, before it replaces the trade on screen. The formats themselves are share.js's.
import { comparisonProblem, comparisonTitle, isComparison, openDocument, pageDocument } from './compare.js';
import { addYears, todayIso } from './dates.js';
import { byId } from './dom.js';
import { EngineError } from './engine.js';
import { contractKey } from './form.js';
import { getPath } from './paths.js';
import { clearNotice, notice } from './messages.js';
import { download, parseTradeText, slug, toBase64Url, tradeFileText, tradeFromHash } from './share.js';
import { rememberedMarket } from './snapshot.js';

const isTrade = (doc) => doc !== null && typeof doc === 'object' && !Array.isArray(doc);
const pageAddress = () => location.href.split('#')[0];

/**
 * A trade the engine refuses that still opens, as this page saves a half-typed one (Save file,
 * Copy link): it has a market and a contract, and the refusal is of one input the form shows as
 * typed or empty (a number, a date, a cell: not a list or a section, not a choice from a list, not
 * a field the page does not have or a misspelt one), so the recompute puts the engine's message
 * beside it and nothing typed is lost. (The trade it replaces stays in recent work, with Undo.)
 */
function openableDraft(doc, err) {
  if (!(err instanceof EngineError) || (err.kind && err.kind !== 'input') || !err.field) return false;
  if (!isTrade(doc.market) || (doc.option === undefined && doc.structure === undefined && doc.legs === undefined))
    return false;
  let value;
  try {
    value = getPath(doc, err.field);
  } catch {
    return false;
  }
  if (value !== null && typeof value === 'object') return false;
  return !/must be one of|unknown field|misspell/.test(err.message);
}

/**
 * Check trade text from outside the page (a file's or a link's, `what` says which) as an opened
 * file is checked: JSON, an object, and a trade the engine prices, or a draft with one input
 * still to mend (openableDraft). Returns {doc, draft?} or {why}.
 */
export async function checkTradeText(text, live, what) {
  let doc;
  try {
    doc = parseTradeText(text);
  } catch (err) {
    return { why: err instanceof SyntaxError ? `it is not a JSON trade ${what}` : err.message };
  }
  if (!isTrade(doc)) return { why: 'it does not hold a trade (a JSON object)' };
  // a comparison opens whatever its alternatives hold (drafts too): the engine's refusal of one
  // is said beside the comparison once it is on the page, and nothing typed is lost
  if (isComparison(doc)) return comparisonProblem(doc) ? { why: comparisonProblem(doc) } : { doc };
  const market = doc.market === undefined ? rememberedMarket() : null; // a trade without a market of its own
  if (market) {
    doc.market = market; // is priced in the snapshot imported on this page (snapshot.js)
    text = JSON.stringify(doc);
  }
  try {
    await live.call('price', text); // the text itself: the engine's checks (nesting, size) come first
  } catch (err) {
    if (openableDraft(doc, err)) return { doc, draft: true };
    return { why: err instanceof EngineError ? err.message : `the engine failed (${err.message})` };
  }
  return { doc };
}

/** The trade in the address (#trade=...): {text}, {why} when it is damaged, or null when there is none. */
function linkInAddress() {
  try {
    const text = tradeFromHash(location.hash);
    return text === null ? null : { text };
  } catch (err) {
    return { why: err.message };
  }
}

/** Which page file this is: the page as built, or a saved copy (told apart by the trade it holds). */
export function pageSeed() {
  const embedded = byId('embedded-trade').textContent.trim();
  return embedded ? `copy:${embedded.length}:${embedded.slice(0, 64)}` : 'page';
}

/**
 * The trade the page opens with: a #trade= link in the address (checked, and kept there until
 * the trade is edited), else this tab's own trade with its last good figures, else the trade
 * embedded in a saved page copy, else the example. Sets `state.link`. Returns
 * {doc, figures?, message?, keep?, fresh?} (`keep`: keep it now; `fresh`: nothing of this tab's).
 */
export async function openingTrade(state, work, live) {
  const embedded = byId('embedded-trade').textContent.trim();
  const own = work.restore();
  const link = linkInAddress();
  let message = null;
  if (link) {
    const checked = link.why ? link : await checkTradeText(link.text, live, 'link');
    if (checked.doc) {
      state.link = JSON.stringify(checked.doc);
      if (own && JSON.stringify(own.trade) === state.link) return { ...ownTrade(own), message: linkMessage };
      work.begin();
      return { doc: checked.doc, message: checked.draft ? draftLinkMessage : linkMessage, keep: true };
    }
    history.replaceState(null, '', pageAddress());
    message = {
      text: `The trade in the link could not be read (${checked.why}); showing the last trade instead.`,
      kind: 'warning',
    };
  }
  if (own) return { ...ownTrade(own), message };
  const doc = JSON.parse(embedded || byId('example-trade').textContent);
  return { doc, message, fresh: true };
}

const linkMessage = { text: 'Opened the trade from the link.', kind: 'info', topic: 'link' };
const draftNote = 'it still has an input to mend, shown beside its field';
const draftLinkMessage = { text: `Opened the trade from the link; ${draftNote}.`, kind: 'warning', topic: 'link' };
const ownTrade = (own) => ({ doc: own.trade, figures: own.figures });

/**
 * Say once what autosave could not keep, and that Save file keeps the trade; a failure's warning
 * goes when all is kept again, the one about recent work running short of room stays until dismissed.
 */
function storageNotice(state, problem) {
  const full = (why) => why.replace('storage', 'local storage');
  let text = '';
  if (problem?.tab && problem.recent)
    text = `Autosave failed: ${problem.tab}, so neither this tab nor recent work keeps the trade. Use Save file to keep it.`;
  else if (problem?.recent)
    text = `Recent work is not kept: ${full(problem.recent)}. This tab keeps its trade until it is closed; use Save file to keep it.`;
  else if (problem?.tab)
    text = `This tab’s trade is not kept: ${problem.tab}. Recent work still has it; use Save file to keep it.`;
  else if (problem?.kept)
    text = `This browser’s local storage is full, so recent work now holds only the latest ${problem.kept} trade${problem.kept > 1 ? 's' : ''}; use Save file to keep it.`;
  if (text === (state.storageWarning?.text ?? '')) return;
  if (!text && state.storageWarning?.stays) return;
  state.storageWarning = text ? { text, stays: !problem.tab && !problem.recent } : null;
  if (text) notice(text, 'warning', null, 'storage');
  else clearNotice('storage');
}

/**
 * The file actions on `state.doc`. `work` keeps edits (work.js); `live` checks what is opened
 * with the engine first; `refill` draws every input again and `changed` recomputes.
 */
export function fileActions({ state, work, live, refill, changed }) {
  /** An edit (or any change of the trade): keep it; an edited link is a link no more. */
  function keep() {
    const doc = pageDocument(state);
    if (state.link !== null && JSON.stringify(doc) !== state.link) {
      state.link = null;
      history.replaceState(null, '', pageAddress());
      clearNotice('link');
    }
    storageNotice(state, work.keep(doc));
  }

  /**
   * Replace the trade on screen; the one it replaces can be brought back once with Undo.
   * `from` is 'new' (a new entry in recent work), 'recent' (an entry brought back) or 'link'.
   */
  function adopt(doc, message, from = 'new') {
    const previous = state.doc ? pageDocument(state) : null;
    openDocument(state, doc);
    state.link = from === 'link' ? JSON.stringify(doc) : null;
    if (from === 'link') history.replaceState(null, '', `${pageAddress()}#trade=${toBase64Url(state.link)}`);
    else if (location.hash) history.replaceState(null, '', pageAddress());
    if (from === 'recent') work.resume(doc);
    else work.begin();
    refill();
    changed(0);
    if (message)
      notice(
        message,
        'info',
        previous && { label: 'Undo', run: () => adopt(previous, 'Brought back the previous trade.', 'recent') },
        from === 'link' ? 'link' : '',
      );
  }

  function describeShort() {
    const key = contractKey(state.doc);
    if (key === 'option') return `${state.doc.option?.type ?? 'option'}-${state.doc.option?.strike ?? ''}`;
    if (key === 'structure') return state.doc.structure?.shape ?? 'structure';
    return 'legs';
  }

  function fileName(ext) {
    if (state.comparison) return `${slug(comparisonTitle(state.comparison.doc), 'comparison')}${ext}`;
    const client = slug(state.doc.quote?.client, '');
    return `${client ? `${client}-` : ''}${slug(describeShort(), 'trade')}${ext}`;
  }

  async function importFile(file) {
    const refuse = (why) => notice(`“${file.name}” was not opened: ${why}. The current trade is unchanged.`, 'warning');
    if (file.size > 1 << 20) return refuse('it is larger than 1 MB');
    let text;
    try {
      text = await file.text();
    } catch (err) {
      return refuse(`it could not be read (${err.message})`);
    }
    const checked = await checkTradeText(text, live, 'file');
    if (checked.why) return refuse(checked.why);
    adopt(checked.doc, checked.draft ? `Opened “${file.name}”; ${draftNote}.` : `Opened “${file.name}”.`);
  }

  async function copyLink() {
    const link = `${pageAddress()}#trade=${toBase64Url(JSON.stringify(pageDocument(state)))}`;
    try {
      await navigator.clipboard.writeText(link);
      notice(
        'A link to this page with the trade in it is on the clipboard. It works where the same page file sits at the same place.',
      );
    } catch {
      history.replaceState(null, '', link);
      state.link = JSON.stringify(pageDocument(state));
      notice('The address bar now holds a link with this trade in it; copy it from there.', 'info', null, 'link');
    }
  }

  /** The page as delivered, with this trade in its embedded-trade block. */
  function pageWithTrade(doc) {
    const json = JSON.stringify(doc).replace(/</g, '\\u003c');
    return `<!DOCTYPE html>\n${state.pristine.outerHTML}`.replace(
      /(<script type="application\/json" id="embedded-trade">)[\s\S]*?(<\/script>)/,
      (_, open, close) => `${open}${json}${close}`,
    );
  }

  function savePageCopy() {
    download(fileName('.html'), pageWithTrade(pageDocument(state)), 'text/html');
    notice('Saved a copy of this page that opens with this trade.');
  }

  /** A fresh trade at the money, six months, European, valued today, at the spot on screen. */
  function newTrade() {
    const today = todayIso();
    const snapshot = rememberedMarket(); // the market imported on this page, when there is one
    const spotNow = snapshot?.spot ?? state.doc.market?.spot;
    const spot = typeof spotNow === 'number' ? spotNow : 100;
    adopt(
      {
        valuation_date: today,
        market: snapshot ?? { spot, volatility: 0.25, rate: 0.03 },
        option: { type: 'call', strike: spot, expiry_date: addYears(today, 0.5) },
        quantity: 1000,
        side: 'buy',
      },
      'Started a new trade: at the money, six months, European, valued today.',
    );
  }

  /** A link typed or pasted into the address bar of the open page: checked like an opened file. */
  async function openLinkInAddress() {
    const link = linkInAddress();
    if (!link || (!link.why && link.text === state.link)) return;
    const checked = link.why ? link : await checkTradeText(link.text, live, 'link');
    if (checked.doc)
      return adopt(
        checked.doc,
        checked.draft ? `Opened the trade from the link; ${draftNote}.` : 'Opened the trade from the link.',
        'link',
      );
    history.replaceState(null, '', state.link ? `${pageAddress()}#trade=${toBase64Url(state.link)}` : pageAddress());
    notice(`The trade in the link could not be read (${checked.why}). The current trade is unchanged.`, 'warning');
  }

  /** The buttons of the trade-file bar and the address bar's #trade= links. */
  function wire() {
    byId('import-file').addEventListener('change', (event) => {
      const file = event.target.files?.[0];
      event.target.value = '';
      if (file) importFile(file);
    });
    byId('action-export').addEventListener('click', () =>
      download(fileName('.json'), tradeFileText(pageDocument(state)), 'application/json'),
    );
    byId('action-link').addEventListener('click', copyLink);
    byId('action-copy-page').addEventListener('click', savePageCopy);
    byId('action-new').addEventListener('click', newTrade);
    window.addEventListener('hashchange', openLinkInAddress);
  }

  return { wire, keep, adopt };
}
