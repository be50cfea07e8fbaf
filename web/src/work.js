// Hedgeleaf page: work kept in the browser, so that a reload, a closed tab or a second tab
// never loses a trade and no tab or page copy overwrites another's.
//
// Two places (docs/page.md#saving-and-sharing says the same to users):
// - This tab's slot, in the tab's session storage ("hedgeleaf.tab.v1"): the trade on screen,
//   which page file it belongs to, and the last good figures. Each tab has its own; it lasts
//   as long as the tab (reloads included) and goes when the tab is closed.
// - Recent work, in the browser's local storage ("hedgeleaf.recent.v1"): the last
//   `recentLimit` trades worked on in any tab or page copy, each with the time it was last
//   saved and a short description, for `recentDays` days. A trade opened from a file, a link
//   or New is a new entry; edits update the tab's own entry; a trade brought back from the
//   list becomes a new entry once it is edited, so the original stays as it was.
import { autosave, parseTradeText } from './share.js';

export const recentLimit = 12;
export const recentDays = 30;
const tabKey = 'hedgeleaf.tab.v1';
const recentKey = 'hedgeleaf.recent.v1';
const legacyKey = 'hedgeleaf.autosave.v1'; // the one shared slot of earlier versions

const isTrade = (doc) => doc !== null && typeof doc === 'object' && !Array.isArray(doc);
const newId = () => `${Date.now().toString(36)}-${Math.random().toString(36).slice(2, 8)}`;

function read(storage, key) {
  try {
    const text = storage?.getItem(key);
    return text ? parseTradeText(text) : null;
  } catch {
    return null;
  }
}

/**
 * The work store of this page. `seed` tells this page file from a saved copy; `describe(doc)`
 * gives an entry's short description; `reloaded` is true when the tab was reloaded (it then
 * goes on with its own entry; a tab opened afresh or duplicated starts a new one when edited).
 */
export function workStore({ session, local, seed, describe, reloaded, now = () => new Date() }) {
  let id = null; // this tab's entry in recent work
  let untouched = null; // text of a trade brought back: it becomes a new entry only once edited
  let figures = null; // the last good figures, kept with the tab's trade
  let slotTrade = null;

  function recentList() {
    const list = read(local, recentKey);
    const oldest = now().getTime() - recentDays * 86400000;
    return (Array.isArray(list) ? list : [])
      .filter((e) => e && typeof e.id === 'string' && isTrade(e.trade) && Date.parse(e.saved) >= oldest)
      .sort((a, b) => Date.parse(b.saved) - Date.parse(a.saved))
      .slice(0, recentLimit);
  }

  /**
   * Write recent work; when the store is full, drop the oldest entries (never this tab's) and try
   * again. Returns null, {problem} or {kept} (how many entries fitted, when some had to go).
   */
  function writeRecent(list) {
    let entries = list;
    for (;;) {
      const problem = autosave(local, entries, recentKey);
      if (!problem) return entries.length < list.length ? { kept: entries.length } : null;
      if (entries.length <= 1) return { problem };
      entries = entries.slice(0, -1);
    }
  }

  function writeSlot() {
    return autosave(session, { seed, id, trade: slotTrade, saved: now().toISOString(), figures }, tabKey);
  }

  // Bring the one shared autosave of earlier versions into recent work, once.
  const legacy = read(local, legacyKey);
  if (legacy && isTrade(legacy.trade)) {
    const saved = typeof legacy.saved === 'string' ? legacy.saved : now().toISOString();
    writeRecent([{ id: newId(), saved, title: describe(legacy.trade), trade: legacy.trade }, ...recentList()]);
  }
  try {
    if (legacy) local.removeItem(legacyKey);
  } catch {
    // storage switched off: nothing to move
  }

  return {
    /** This tab's own trade and last good figures ({trade, figures}) if it belongs to this page file. */
    restore() {
      const slot = read(session, tabKey);
      if (!slot || slot.seed !== seed || !isTrade(slot.trade)) return null;
      figures = slot.figures ?? null;
      slotTrade = slot.trade;
      if (reloaded && typeof slot.id === 'string') id = slot.id;
      else untouched = JSON.stringify(slot.trade);
      return { trade: slot.trade, figures };
    },

    /** A trade opened afresh (New, a file, a link): a new entry in recent work. */
    begin() {
      id = newId();
      untouched = null;
      figures = null;
    },

    /** A trade brought back (from recent work, or by Undo): it becomes an entry of its own when edited. */
    resume(doc) {
      id = null;
      untouched = JSON.stringify(doc);
      figures = null;
    },

    /**
     * Keep `doc` in this tab's slot and in recent work. Returns null, or {tab, recent} with why
     * either could not be kept (null where it was) and, when older entries had to go, {kept}.
     */
    keep(doc) {
      slotTrade = doc;
      const tab = writeSlot();
      let recent = null;
      const text = JSON.stringify(doc);
      if (untouched === null || text !== untouched) {
        untouched = null;
        id ??= newId();
        const entry = { id, saved: now().toISOString(), title: describe(doc), trade: doc };
        recent = writeRecent([entry, ...recentList().filter((e) => e.id !== id)].slice(0, recentLimit));
      }
      return tab || recent ? { tab, recent: recent?.problem ?? null, kept: recent?.kept } : null;
    },

    /** Keep the last good figures ({doc, price, profile, hedge}) with this tab's trade. */
    keepFigures(latest) {
      figures = latest;
      if (slotTrade) writeSlot();
    },

    /** Recent work, newest first: [{id, saved, title, trade}]. */
    recent: recentList,
  };
}
