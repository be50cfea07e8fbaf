// Hedgeleaf page: what the page tells the user besides figures.
//
// A notice line at the top (file actions, autosave trouble, with an Undo where
// it helps); the engine's message beside the field it names (data-error holds
// the field path, the input gets aria-invalid); and cards marked stale while
// their figures are for an earlier version of the trade.
import { button, byId, make } from './dom.js';
import { EngineError } from './engine.js';
import { errorPathOf } from './form.js';
import { pathAncestors } from './paths.js';

/** Show a line at the top; `action` = {label, run} adds a button to it (e.g. Undo). */
export function notice(text, kind = 'info', action = null) {
  const banner = byId('notice');
  banner.textContent = text;
  banner.dataset.kind = kind;
  banner.hidden = !text;
  if (action) banner.append(' ', button(action.label, action.run, { className: 'small' }));
}

/** Empty the error lines (only those for `prefixes` and the fields below them, when given). */
export function clearErrors(prefixes) {
  for (const node of document.querySelectorAll('[data-error]')) {
    const path = node.dataset.error;
    if (prefixes && !prefixes.some((p) => path === p || path.startsWith(`${p}.`) || path.startsWith(`${p}[`))) continue;
    if (!node.classList.contains('shown') && node.textContent === '') continue; // nothing to clear: leave the DOM alone
    node.textContent = '';
    node.classList.remove('shown');
    const input = node.errorInput;
    if (input) input.removeAttribute('aria-invalid');
  }
}

/** Put the engine's message beside the field it names (or its nearest shown parent). */
export function showError(field, message) {
  for (const path of pathAncestors(field)) {
    const node = [...document.querySelectorAll('[data-error]')].find(
      (n) => n.dataset.error === path && !n.closest('[hidden]'),
    );
    if (!node) continue;
    node.textContent = message;
    node.classList.add('shown');
    if (node.errorInput) node.errorInput.setAttribute('aria-invalid', 'true');
    return node;
  }
  return null;
}

/** Say why a call failed: the engine's message at its field, anything else at the top of the form. */
export function showFailure(err) {
  if (err instanceof EngineError) showError(err.field, err.message);
  else showError('', `The engine could not run: ${err.message}. Reload the page to start it again.`);
}

/** Grey (or ungrey) the cards of `panels` (their data-panel names). */
export function setStale(panels, stale) {
  for (const node of document.querySelectorAll('[data-panel]')) {
    if (panels.includes(node.dataset.panel)) node.classList.toggle('stale', stale);
  }
}

let errorId = 0;
/** Give a bound input its error line (data-error follows the path it writes). */
function attachError(input) {
  if (input.errorNode || input.type === 'radio') return;
  const holder = input.closest('.field, .cell') ?? input.parentElement;
  const node = make('span', { className: 'field-error', role: 'alert', id: `error-${(errorId += 1)}` });
  node.errorInput = input;
  input.errorNode = node;
  input.setAttribute('aria-describedby', node.id);
  holder.append(node);
}

/**
 * Give every bound input in `scope` its error line and point the line (and the input's
 * data-path) at the field the input writes in `doc` as it stands now.
 */
export function syncErrorPaths(scope, doc) {
  for (const input of scope.querySelectorAll('[data-path], [data-role]')) {
    attachError(input);
    const path = errorPathOf(doc, input);
    // Inputs whose field moves with the contract (expiry, exercise, dividend dates) carry
    // the path they write now, so automation finds every input by data-path.
    if (input.dataset.role && input.type !== 'radio' && input.dataset.path !== path) {
      if (path) input.dataset.path = path;
      else delete input.dataset.path;
    }
    if (!input.errorNode) continue;
    if (input.errorNode.dataset.error !== path) input.errorNode.dataset.error = path;
  }
}
