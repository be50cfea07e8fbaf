// Hedgeleaf page: what the page knows, in one object, and where it keeps the
// trade between visits.
//
// The trade document (`doc`) is the source of truth: every input writes one
// field of it, the engines get copies of it. `generation` counts recomputes, so
// a result that comes back after a newer edit is dropped rather than drawn.

/**
 * The page's state. `commands` are the engine's commands (a card shows only when
 * its command is there); `price` is the last good price result; `pristine` is the page as delivered
 * (its <html> element, copied before anything was drawn, for "Save page with trade"); `storageWarning` is the autosave problem on show; `link`
 * is the trade (JSON text) of the #trade= link in the address, until the trade is edited.
 */
export function pageState(commands) {
  return {
    doc: null,
    price: null,
    generation: 0,
    commands,
    pristine: null,
    storageWarning: null,
    link: null,
  };
}

/** The engine's commands as the build wrote them into the page ("price,profile,..."). */
export function commandsFrom(text) {
  const list = text.trim();
  return list ? list.split(',') : ['price'];
}

/** The browser's `localStorage` or `sessionStorage`, or null where it is switched off (reading it may throw). */
export function browserStore(name) {
  try {
    return globalThis[name] ?? null;
  } catch {
    return null;
  }
}

/**
 * An object kept in this tab (sessionStorage, through reloads) under `key`: `value` (empty where
 * none was kept, it cannot be read or storage is off) and `keep()`, which writes it back (best
 * effort: where storage is off or full it lasts this page visit only).
 */
export function tabObject(key) {
  const tab = browserStore('sessionStorage');
  let value = {};
  try {
    const kept = JSON.parse(tab?.getItem(key) ?? '{}');
    if (kept !== null && typeof kept === 'object' && !Array.isArray(kept)) value = kept;
  } catch {
    // unreadable: start empty
  }
  const keep = () => {
    try {
      tab?.setItem(key, JSON.stringify(value));
    } catch {
      // storage off or full: kept for this page visit only
    }
  };
  return { value, keep };
}
