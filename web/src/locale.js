// Hedgeleaf page: the number and date format the user picks, remembered in this browser.
//
// The formats themselves are format.js's and numbers.js's (one place); this file only offers the
// choice, keeps it and has the page drawn again in it. Each choice is shown by an example written
// in it by the browser (1,234.56 · 31/12/2027), so the list says what it does. Files, links, the
// CLI and the engine never see it: numbers stay JSON numbers and dates ISO dates.
import { byId, make } from './dom.js';
import { setPageLocale } from './numbers.js';

const storeKey = 'hedgeleaf.locale';

/** The locales offered, each writing numbers or dates its own way; '' is the browser's own. */
const offered = ['', 'en-GB', 'en-US', 'de-DE', 'fr-FR', 'de-CH', 'nl-NL', 'ja-JP'];

/** "1,234.56 · 31/12/2027" in `tag` (the browser's locale for ''). */
function example(tag) {
  const locale = tag || undefined;
  const number = new Intl.NumberFormat(locale, { minimumFractionDigits: 2, numberingSystem: 'latn' }).format(1234.56);
  const date = new Intl.DateTimeFormat(locale, {
    day: '2-digit',
    month: '2-digit',
    year: 'numeric',
    timeZone: 'UTC',
    numberingSystem: 'latn',
  }).format(Date.UTC(2027, 11, 31));
  return `${number} · ${date}`;
}

/**
 * Wire the format picker (`select#number-format`): the remembered choice applies before anything is
 * drawn; a new one is kept in `store` (localStorage, may be null) and `redraw` shows the page in it.
 * Writing each choice's example makes the browser load that locale's data (some 30-90 ms for all
 * of them on a fast machine), so the list starts with the current choice alone and is filled once
 * the first figures are in (the returned fillChoices()), or as soon as the picker is reached.
 */
export function localePicker({ store, redraw }) {
  const picker = byId('number-format');
  let kept = '';
  try {
    kept = store?.getItem(storeKey) ?? '';
  } catch {
    kept = '';
  }
  if (!offered.includes(kept)) kept = '';
  const option = (tag) =>
    make('option', {
      value: tag,
      text: tag ? `${example(tag)} (${tag})` : `As this browser (${new Intl.NumberFormat().resolvedOptions().locale})`,
    });
  picker.replaceChildren(option(kept));
  picker.value = kept;
  setPageLocale(kept || null);
  let filled = false;
  function fillChoices() {
    if (filled) return;
    filled = true;
    const current = picker.value;
    picker.replaceChildren(...offered.map(option));
    picker.value = current;
  }
  for (const reached of ['focus', 'pointerdown', 'mousedown']) picker.addEventListener(reached, fillChoices);
  picker.addEventListener('change', () => {
    try {
      store?.setItem(storeKey, picker.value);
    } catch {
      // storage off or full: the choice still applies to this page
    }
    setPageLocale(picker.value || null);
    redraw();
  });
  return { fillChoices };
}
