// Hedgeleaf page: the Recent work menu, the trades kept in this browser (work.js), newest
// first, each with when it was last saved and a short description. Picking one brings it
// back (the trade on screen can be brought back with Undo). A tab opened afresh points at
// the latest work when it is not what the tab shows.
import { comparisonTitle, isComparison } from './compare.js';
import { byId } from './dom.js';
import { inputText } from './format.js';
import { notice } from './messages.js';
import { pageLocale } from './numbers.js';
import { describeContract } from './render.js';

/** "American put, strike 46 · spot 48.2 · Kestrel Mill": what a recent-work entry is. */
export function describeWork(doc) {
  if (isComparison(doc)) return `Side by side: ${comparisonTitle(doc)}`.slice(0, 120);
  const spot = typeof doc.market?.spot === 'number' ? ` · spot ${inputText(doc.market.spot)}` : '';
  const client =
    typeof doc.quote?.client === 'string' && doc.quote.client.trim() ? ` · ${doc.quote.client.trim()}` : '';
  return `${describeContract(doc)}${spot}${client}`.slice(0, 120);
}

let clock = null;
function when(iso) {
  clock ??= new Intl.DateTimeFormat(pageLocale(), {
    day: 'numeric',
    month: 'short',
    hour: '2-digit',
    minute: '2-digit',
    hourCycle: 'h23',
  });
  return clock.format(new Date(iso));
}

/** The menu over `work`; `adopt(doc, message, 'recent')` puts a trade on screen (saving.js). */
export function recentMenu({ work, state, adopt }) {
  const menu = byId('recent-work');
  let shownFor = '';

  function bringBack(entry) {
    adopt(
      structuredClone(entry.trade),
      `Opened “${entry.title}” (saved ${when(entry.saved)}) from recent work.`,
      'recent',
    );
  }

  /** Fill the menu from the store (entries may come from other tabs). */
  function fill() {
    const entries = work.recent();
    const key = entries.map((e) => `${e.id}@${e.saved}`).join(',');
    if (key === shownFor && menu.options.length > 0) return;
    shownFor = key;
    const options = entries.map((e) => new Option(`${when(e.saved)} — ${e.title}`, e.id));
    if (!options.length) {
      options.push(new Option('nothing kept yet', 'none'));
      options[0].disabled = true;
    }
    menu.replaceChildren(new Option('Recent work…', ''), ...options);
  }

  function wire() {
    fill();
    menu.addEventListener('focus', fill);
    menu.addEventListener('pointerdown', fill);
    window.addEventListener('storage', fill); // another tab kept something
    menu.addEventListener('change', () => {
      const entry = work.recent().find((e) => e.id === menu.value);
      menu.value = '';
      if (entry) bringBack(entry);
    });
  }

  /** On a tab opened afresh: say where the latest work is, if it is not what is on screen. */
  function offerLatest() {
    const [latest] = work.recent();
    if (!latest || JSON.stringify(latest.trade) === JSON.stringify(state.doc)) return;
    notice(
      `Your latest work, “${latest.title}” (saved ${when(latest.saved)}), is under Recent work.`,
      'info',
      { label: 'Open it', run: () => bringBack(latest) },
      'recent',
    );
  }

  return { wire, fill, offerLatest };
}
