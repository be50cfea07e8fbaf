// Hedgeleaf page: a market snapshot (docs/market.md: spot, smile, curves, dividends, borrow and
// the time it was taken, `as_of`) imported once and used by every trade on the page.
//
// Precedence, as the engine has it: a trade carries its own market and that market wins. The
// page never gives the engine a trade and a snapshot at once: importing a snapshot (a file or
// pasted JSON) writes it into the trade on screen as the trade's own market, with its as_of
// (Undo brings the old market back), and remembers it in this browser, so that New starts in
// it and an opened trade without a market is priced in it. The page shows how old the market
// is and warns, visibly and announced politely, once it is older than a limit the user sets
// (remembered in this browser).
import { byId, field, make } from './dom.js';
import { EngineError } from './engine.js';
import { formatNumber, parseNumber } from './format.js';
import { notice } from './messages.js';
import { browserStore } from './state.js';

const snapshotKey = 'hedgeleaf.market.snapshot';
const limitKey = 'hedgeleaf.market.maxAgeHours';
const defaultLimitHours = 24;
const isObject = (value) => value !== null && typeof value === 'object' && !Array.isArray(value);

/** "2026-12-03T16:30:00Z (Quillmoor Textiles)": the market's as_of as written, with its underlying. */
export function marketAsOfText(market) {
  if (typeof market?.as_of !== 'string') return null;
  return typeof market.underlying === 'string' && market.underlying
    ? `${market.as_of} (${market.underlying})`
    : market.as_of;
}

/** The snapshot remembered in this browser (a market object), or null. */
export function rememberedMarket() {
  try {
    const text = browserStore('localStorage')?.getItem(snapshotKey);
    const market = text ? JSON.parse(text) : null;
    return isObject(market) ? market : null;
  } catch {
    return null;
  }
}

/** Hours from `asOf` (ISO 8601; without a zone, this computer's) to `now`, or null if it does not read. */
export function ageHours(asOf, now = Date.now()) {
  const taken = Date.parse(asOf);
  return Number.isFinite(taken) ? (now - taken) / 3.6e6 : null;
}

/** 0.5 -> "30 min", 26 -> "1 day 2 h". */
function ageText(hours) {
  const minutes = Math.max(0, Math.round(hours * 60));
  if (minutes < 60) return `${minutes} min`;
  const h = Math.floor(minutes / 60);
  if (h < 48) return `${h} h ${minutes % 60} min`;
  return `${Math.floor(h / 24)} days ${h % 24} h`;
}

/**
 * The snapshot tools over `state.doc`: import (file or paste), the market's age and the
 * warning. `live` checks a snapshot with the engine before it is used; `refill` redraws,
 * `changed` recomputes.
 */
export function snapshotTools({ state, live, refill, changed }) {
  const store = browserStore('localStorage');
  const limitInput = make('input', {
    id: 'market-age-limit',
    inputMode: 'decimal',
    autocomplete: 'off',
    'aria-describedby': 'market-age-limit-error',
  });
  // a page setting, not a trade field: its own message line (the trade's messages are messages.js's)
  const limitError = make('span', { id: 'market-age-limit-error', className: 'field-error', role: 'alert' });
  const pasteBox = make('textarea', { id: 'snapshot-text', rows: 4, spellcheck: false });
  const fileInput = make('input', {
    type: 'file',
    id: 'snapshot-file',
    className: 'visually-hidden',
    accept: '.json,application/json',
  });

  function limitHours() {
    let stored = null;
    try {
      stored = store?.getItem(limitKey);
    } catch {
      stored = null;
    }
    const value = stored === null || stored === undefined ? NaN : Number(stored);
    return value > 0 ? value : defaultLimitHours;
  }

  /** Offer the snapshot kept in this browser to a trade that is not priced in it (another tab's, an opened file's). */
  function offerKept(market) {
    const kept = rememberedMarket();
    const offer = byId('snapshot-again');
    if (!offer) return;
    offer.hidden = !kept || JSON.stringify(kept) === JSON.stringify(market);
    if (!offer.hidden) offer.textContent = `Use the market as of ${marketAsOfText(kept)}`;
  }

  /** Show the market's as_of and age; warn when it is older than the limit (the warning is a polite live region). */
  function showAge() {
    const market = state.doc?.market;
    offerKept(market);
    const written = marketAsOfText(market);
    byId('market-age').hidden = !written;
    const stale = byId('market-stale');
    if (!written) {
      if (stale.textContent) stale.textContent = '';
      return;
    }
    const hours = ageHours(market.as_of);
    const limit = limitHours();
    byId('market-age-text').textContent =
      `Market as of ${written}` +
      (hours === null ? '' : hours < 0 ? ', taken later than now' : `, ${ageText(hours)} old`);
    const warning =
      hours !== null && hours > limit
        ? `This market is older than your limit of ${formatNumber(limit, limit % 1 ? 1 : 0)} h: check it before quoting.`
        : '';
    if (stale.textContent !== warning) stale.textContent = warning;
    byId('market-age').classList.toggle('too-old', Boolean(warning));
  }

  /** Take the snapshot `text` (from a file or pasted) as the market of the trade on screen, if the engine prices it. */
  async function useSnapshot(text, from) {
    let market;
    try {
      market = JSON.parse(text);
    } catch {
      return notice(`The market snapshot ${from} was not used: it is not JSON.`, 'warning', null, 'snapshot');
    }
    if (!isObject(market) || typeof market.as_of !== 'string')
      return notice(
        `The market snapshot ${from} was not used: it must be a JSON object with an as_of time (docs/market.md).`,
        'warning',
        null,
        'snapshot',
      );
    const before = structuredClone(state.doc);
    const trial = structuredClone(state.doc);
    const asOfDate = market.as_of.slice(0, 10);
    const moved = typeof trial.valuation_date === 'string' && trial.valuation_date < asOfDate;
    if (moved) trial.valuation_date = asOfDate; // a market taken on a day values the trade from that day on
    trial.market = market;
    try {
      await live.call('price', trial);
    } catch (err) {
      const why = err instanceof EngineError ? err.message : `the engine failed (${err.message})`;
      return notice(`The market snapshot ${from} was not used: ${why}.`, 'warning', null, 'snapshot');
    }
    state.doc = Object.assign(state.doc, trial);
    try {
      store?.setItem(snapshotKey, JSON.stringify(market));
    } catch {
      // storage off or full: the trade still carries the market
    }
    refill();
    changed(0);
    const undo = () => {
      for (const key of Object.keys(state.doc)) delete state.doc[key];
      Object.assign(state.doc, before);
      refill();
      changed(0);
      notice('The trade’s own market is back.', 'info', null, 'snapshot');
    };
    notice(
      `The trade is priced in the market as of ${marketAsOfText(market)}` +
        (moved ? `; its valuation date moved to the market’s date, ${asOfDate}` : '') +
        '. New trades on this page start in it.',
      'info',
      { label: 'Undo', run: undo },
      'snapshot',
    );
  }

  function build() {
    // (the message beside the label, not in it: the label's text is the input's name)
    const limitField = make('div', {}, [field('Warn when the market is older than (hours)', limitInput), limitError]);
    const pasteField = field('Or paste a market snapshot (JSON)', pasteBox, 'field wide');
    byId('snapshot-tools').replaceChildren(
      make('p', {
        className: 'hint',
        text: 'A market snapshot is the desk’s market in one JSON file, with the time it was taken: importing it prices this trade in it, and new trades start in it.',
      }),
      make('div', { className: 'row' }, [
        fileInput,
        make('label', { className: 'button', htmlFor: 'snapshot-file', text: 'Import market file…' }),
        limitField,
      ]),
      pasteField,
      make('div', { className: 'list-head' }, [
        make('button', { type: 'button', className: 'small', id: 'snapshot-use', text: 'Use pasted market' }),
        make('button', { type: 'button', className: 'small', id: 'snapshot-again', hidden: true }),
      ]),
    );
  }

  function wire() {
    build();
    limitInput.value = formatNumber(limitHours(), limitHours() % 1 ? 1 : 0);
    limitInput.addEventListener('input', () => {
      const value = parseNumber(limitInput.value);
      const good = typeof value === 'number' && value > 0;
      // what is typed stays; the last good limit applies until it is mended, and the line says so
      limitError.textContent = good
        ? ''
        : `The age limit must be a number of hours above 0, got “${limitInput.value.trim().slice(0, 40)}”; ` +
          `the last one, ${formatNumber(limitHours(), limitHours() % 1 ? 1 : 0)} h, applies.`;
      limitError.classList.toggle('shown', !good);
      limitInput.setAttribute('aria-invalid', String(!good));
      if (!good) return;
      try {
        store?.setItem(limitKey, String(value));
      } catch {
        // storage off: the limit applies to this page until it is closed
      }
      showAge();
    });
    fileInput.addEventListener('change', async () => {
      const file = fileInput.files?.[0];
      fileInput.value = '';
      if (file) await useSnapshot(await file.text(), `in ${file.name}`);
    });
    byId('snapshot-use').addEventListener('click', () => useSnapshot(pasteBox.value, 'pasted'));
    byId('snapshot-again').addEventListener('click', () =>
      useSnapshot(JSON.stringify(rememberedMarket()), 'kept in this browser'),
    );
    showAge();
    setInterval(showAge, 60000); // the market ages while the page is open
  }

  return { wire, showAge };
}
