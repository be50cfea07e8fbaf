// Hedgeleaf page: an edit anywhere on the workbench writes its one field of the
// trade document, redraws what depends on it, and asks for a recompute.
//
// One listener on <main> serves the terms form and every card: inputs say what
// they write with data-path (or data-role for fields that move with the
// contract), so nothing is wired input by input.
import { inputProblem } from './checks.js';
import { fillInput, writeInput } from './form.js';
import { showWarning } from './messages.js';

/**
 * Listen for edits in `scope`. `terms` is the terms form (terms.js); `redraws` (a Map) takes
 * a path to what must be drawn again when it changes (a choice that changes which fields
 * a card shows); `syncErrors` points the error lines at the fields the inputs now write;
 * `changed(delay, since)` recomputes soon (the pause counted from the event).
 */
export function listenForEdits({ scope, state, terms, redraws, syncErrors, changed }) {
  function onInput(event) {
    const input = event.target;
    if (input.name === 'expiry-mode') {
      if (input.checked && event.type === 'change') terms.switchExpiry(input.value); // (a radio fires input and change)
      return;
    }
    if (!input.dataset.path && !input.dataset.role) return;
    writeInput(state.doc, input);
    showWarning(input);
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
    changed(undefined, event.timeStamp);
  }

  /** Tidy a number once the cursor leaves it (25000 -> 25,000), if it reads as one (else it stays as typed). */
  function onBlur(event) {
    const input = event.target;
    if (!['number', 'percent'].includes(input.dataset?.kind) || input.getAttribute('aria-invalid') === 'true') return;
    if (inputProblem(input)) return; // refused by the page (checks.js): what was typed stays to be fixed
    fillInput(state.doc, input);
  }

  scope.addEventListener('input', onInput);
  scope.addEventListener('change', (event) => {
    const { tagName, type } = event.target;
    if (tagName === 'SELECT' || type === 'checkbox' || type === 'radio' || type === 'date') onInput(event);
  });
  scope.addEventListener('focusout', onBlur);
}
