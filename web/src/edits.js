// Hedgeleaf page: an edit anywhere on the workbench writes its one field of the
// trade document, redraws what depends on it, and asks for a recompute.
//
// One listener on <main> serves the terms form and every card: inputs say what
// they write with data-path (or data-role for fields that move with the
// contract), so nothing is wired input by input.
import { fillInput, switchExpiryMode, writeInput } from './form.js';

/**
 * Listen for edits in `scope`. `terms` is the terms form (terms.js); `redraws` (a Map) takes
 * a path to what must be drawn again when it changes (a choice that changes which fields
 * a card shows); `refill` draws every input again; `syncErrors` points the error lines
 * at the fields the inputs now write; `changed` recomputes soon.
 */
export function listenForEdits({ scope, state, terms, redraws, refill, syncErrors, changed }) {
  function onInput(event) {
    const input = event.target;
    if (input.name === 'expiry-mode') {
      switchExpiryMode(state.doc, input.value);
      refill();
      changed();
      return;
    }
    if (!input.dataset.path && !input.dataset.role) return;
    writeInput(state.doc, input);
    const structural =
      input.dataset.kind === 'choice' && (input.dataset.path?.endsWith('.type') || input.dataset.role === 'exercise');
    if (structural) terms.reshaped(input);
    // choices that change which fields a card shows: redraw the card, keep the focus
    const redraw = redraws.get(input.dataset.path);
    if (redraw) {
      redraw();
      scope.querySelector(`[data-path="${input.dataset.path}"]`)?.focus();
    }
    syncErrors();
    changed();
  }

  /** Tidy a number once the cursor leaves it (25000 -> 25,000), if it reads as one. */
  function onBlur(event) {
    const input = event.target;
    if (!['number', 'percent'].includes(input.dataset?.kind) || input.getAttribute('aria-invalid') === 'true') return;
    fillInput(state.doc, input);
  }

  scope.addEventListener('input', onInput);
  scope.addEventListener('change', (event) => {
    const { tagName, type } = event.target;
    if (tagName === 'SELECT' || type === 'checkbox' || type === 'radio' || type === 'date') onInput(event);
  });
  scope.addEventListener('focusout', onBlur);
}
