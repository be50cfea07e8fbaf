// Hedgeleaf page: what the page knows, in one object, and where it keeps the
// trade between visits.
//
// The trade document (`doc`) is the source of truth: every input writes one
// field of it, the engines get copies of it. `generation` counts recomputes, so
// a result that comes back after a newer edit is dropped rather than drawn.

/**
 * The page's state. `commands` are the engine's commands (a card shows only when
 * its command is there); `price` is the last good price result; `seed` tells this
 * page file's autosave from another's; `pristineHtml` is the page as delivered
 * (for "Save page with trade"); `storageWarning` is the autosave problem on show.
 */
export function pageState(commands) {
  return {
    doc: null,
    price: null,
    generation: 0,
    commands,
    seed: '',
    pristineHtml: '',
    storageWarning: null,
  };
}

/** The engine's commands as the build wrote them into the page ("price,profile,..."). */
export function commandsFrom(text) {
  const list = text.trim();
  return list ? list.split(',') : ['price'];
}

/** The browser's local storage, or null where it is switched off (reading it may throw). */
export function localStore() {
  try {
    return globalThis.localStorage ?? null;
  } catch {
    return null;
  }
}
