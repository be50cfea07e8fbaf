// Hedgeleaf page: the trade in and out of the page.
//
// Autosave after every edit; the trade the page opens with (a link, this page
// file's autosave, the trade embedded in a saved page copy, the example); and
// the file actions: open a file, save a file, copy a link, save the page with
// the trade, start a new trade. The formats themselves are share.js's.
import { addYears, todayIso } from './dates.js';
import { byId } from './dom.js';
import { EngineError } from './engine.js';
import { contractKey } from './form.js';
import { notice } from './messages.js';
import {
  autosave,
  download,
  loadAutosave,
  parseTradeText,
  slug,
  toBase64Url,
  tradeFileText,
  tradeFromHash,
} from './share.js';

/** Keep the trade in local storage; a failure, and its end, are said once at the top. */
export function saveLocally(state, storage) {
  const problem = autosave(storage, { seed: state.seed, trade: state.doc, saved: new Date().toISOString() });
  if (problem !== state.storageWarning) {
    state.storageWarning = problem;
    notice(problem ?? '', problem ? 'warning' : 'info');
  }
}

const isTrade = (doc) => doc && typeof doc === 'object' && !Array.isArray(doc);
const pageAddress = () => location.href.split('#')[0];

/**
 * The trade the page opens with: from a #trade= link, else this page file's autosave,
 * else the trade embedded in a saved page copy, else the example. Sets `state.seed`
 * (which page file this is). Returns {doc, message?}.
 */
export function initialTrade(state, storage) {
  const embedded = byId('embedded-trade').textContent.trim();
  state.seed = embedded ? `copy:${embedded.length}:${embedded.slice(0, 64)}` : 'page';
  try {
    const fromLink = tradeFromHash(location.hash);
    if (fromLink !== null) {
      const doc = parseTradeText(fromLink);
      if (!isTrade(doc)) throw new Error('it does not hold a trade');
      history.replaceState(null, '', pageAddress()); // from now on autosave keeps the edits
      return { doc, message: 'Opened the trade from the link.' };
    }
  } catch (err) {
    notice(`The trade in the link could not be read (${err.message}); showing the last trade instead.`, 'warning');
  }
  const saved = loadAutosave(storage);
  if (saved && saved.seed === state.seed && saved.trade && typeof saved.trade === 'object') return { doc: saved.trade };
  if (embedded) return { doc: JSON.parse(embedded) };
  return { doc: JSON.parse(byId('example-trade').textContent) };
}

/**
 * The file actions on `state.doc`. `live` checks an opened file with the engine first;
 * `refill` draws every input again and `changed` recomputes after a trade is replaced.
 */
export function fileActions({ state, live, refill, changed }) {
  /** Replace the trade on screen; the one it replaces can be brought back once with Undo. */
  function adopt(doc, message) {
    const previous = state.doc;
    state.doc = doc;
    refill();
    changed(0);
    if (message)
      notice(
        message,
        'info',
        previous && { label: 'Undo', run: () => adopt(previous, 'Brought back the previous trade.') },
      );
  }

  function describeShort() {
    const key = contractKey(state.doc);
    if (key === 'option') return `${state.doc.option?.type ?? 'option'}-${state.doc.option?.strike ?? ''}`;
    if (key === 'structure') return state.doc.structure?.shape ?? 'structure';
    return 'legs';
  }

  function fileName(ext) {
    const client = slug(state.doc.quote?.client, '');
    return `${client ? `${client}-` : ''}${slug(describeShort(), 'trade')}${ext}`;
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
    if (!isTrade(doc)) return refuse('it does not hold a trade (a JSON object).');
    try {
      await live.call('price', text); // the file's own text: the engine's checks (nesting, size) come first
    } catch (err) {
      return refuse(err instanceof EngineError ? `${err.message}.` : `the engine failed (${err.message}).`);
    }
    adopt(doc, `Opened “${file.name}”.`);
  }

  async function copyLink() {
    const link = `${pageAddress()}#trade=${toBase64Url(JSON.stringify(state.doc))}`;
    try {
      await navigator.clipboard.writeText(link);
      notice(
        'A link to this page with the trade in it is on the clipboard. It works where the same page file sits at the same place.',
      );
    } catch {
      history.replaceState(null, '', link);
      notice('The address bar now holds a link with this trade in it; copy it from there.');
    }
  }

  /** The page as delivered, with this trade in its embedded-trade block. */
  function pageWithTrade(doc) {
    const json = JSON.stringify(doc).replace(/</g, '\\u003c');
    return state.pristineHtml.replace(
      /(<script type="application\/json" id="embedded-trade">)[\s\S]*?(<\/script>)/,
      (_, open, close) => `${open}${json}${close}`,
    );
  }

  function savePageCopy() {
    download(fileName('.html'), pageWithTrade(state.doc), 'text/html');
    notice('Saved a copy of this page that opens with this trade.');
  }

  function newTrade() {
    const today = todayIso();
    const spot = typeof state.doc.market?.spot === 'number' ? state.doc.market.spot : 100;
    adopt(
      {
        valuation_date: today,
        market: { spot, volatility: 0.25, rate: 0.03 },
        option: { type: 'call', strike: spot, expiry_date: addYears(today, 0.5), exercise: 'american' },
        quantity: 1000,
        side: 'buy',
      },
      'Started a new trade: at the money, six months, valued today.',
    );
  }

  /** A link pasted into the address bar of the open page. */
  function openFromHash() {
    try {
      const text = tradeFromHash(location.hash);
      if (text !== null) {
        history.replaceState(null, '', pageAddress());
        adopt(parseTradeText(text), 'Opened the trade from the link.');
      }
    } catch (err) {
      notice(`The trade in the link could not be read (${err.message}).`, 'warning');
    }
  }

  /** The buttons of the trade-file bar and the address bar's #trade= links. */
  function wire() {
    byId('import-file').addEventListener('change', (event) => {
      const file = event.target.files?.[0];
      event.target.value = '';
      if (file) importFile(file);
    });
    byId('action-export').addEventListener('click', () =>
      download(fileName('.json'), tradeFileText(state.doc), 'application/json'),
    );
    byId('action-link').addEventListener('click', copyLink);
    byId('action-copy-page').addEventListener('click', savePageCopy);
    byId('action-new').addEventListener('click', newTrade);
    window.addEventListener('hashchange', openFromHash);
  }

  return { wire };
}
