// Hedgeleaf page: what the page tells the user besides figures.
//
// A notice line at the top (file actions, autosave trouble, with an Undo where
// it helps); the engine's message beside the field it names (data-error holds
// the field path, the input gets aria-invalid); and cards marked stale while
// their figures are for an earlier version of the trade.
import { inputProblem, inputWarning } from './checks.js';
import { button, byId, make } from './dom.js';
import { EngineError } from './engine.js';
import { errorPathOf } from './form.js';
import { pageLocale } from './numbers.js';
import { pathAncestors } from './paths.js';
import { fieldName, screenMessage } from './wording.js';

/**
 * Show a line at the top; `action` = {label, run} adds a button to it (e.g. Undo). Every
 * notice can be dismissed (✕); `topic` names what it is about, so that it can be taken
 * away when that is over (clearNotice).
 */
export function notice(text, kind = 'info', action = null, topic = '') {
  const banner = byId('notice');
  banner.textContent = text;
  banner.dataset.kind = kind;
  banner.dataset.topic = topic;
  banner.hidden = !text;
  if (!text) return;
  if (action) banner.append(' ', button(action.label, action.run, { className: 'small' }));
  const dismiss = () => {
    banner.hidden = true;
  };
  banner.append(button('✕', dismiss, { className: 'small dismiss', 'aria-label': 'Dismiss', title: 'Dismiss' }));
}

/** Take the notice away if it is about `topic`. */
export function clearNotice(topic) {
  const banner = byId('notice');
  if (banner.dataset.topic === topic) banner.hidden = true;
}

/** Empty the error lines (only those for `prefixes` and the fields below them, when given). */
export function clearErrors(prefixes) {
  for (const node of document.querySelectorAll('[data-error]')) {
    const path = node.dataset.error;
    if (prefixes && !prefixes.some((p) => path === p || path.startsWith(`${p}.`) || path.startsWith(`${p}[`))) continue;
    if (!node.classList.contains('shown') && node.textContent === '') continue; // nothing to clear: leave the DOM alone
    node.textContent = '';
    node.classList.remove('shown');
    delete node.dataset.engineMessage;
    const input = node.errorInput;
    if (input) input.removeAttribute('aria-invalid');
  }
}

/** Write `text` into an error line and mark its input invalid. */
function markError(node, text) {
  node.textContent = text;
  node.classList.add('shown');
  if (node.errorInput) node.errorInput.setAttribute('aria-invalid', 'true');
}

/**
 * Put the engine's refusal beside the field it names (or its nearest shown parent), in the
 * field's own words and units (wording.js); the engine's line stays in data-engine-message.
 */
export function showError(field, message, detail) {
  for (const path of pathAncestors(field)) {
    const node = [...document.querySelectorAll('[data-error]')].find(
      (n) => n.dataset.error === path && !n.closest('[hidden]'),
    );
    if (!node) continue;
    const input = path === field ? node.errorInput : null; // a parent's line keeps the engine's path
    markError(node, screenMessage(input, field, message, detail));
    node.dataset.engineMessage = message;
    return node;
  }
  return null;
}

/** Say why a call failed: the engine's message at its field, anything else at the top of the form. */
export function showFailure(err) {
  if (err instanceof EngineError) showError(err.field, err.message, err.detail);
  else showError('', `The engine could not run: ${err.message}. Reload the page to start it again.`);
}

/** The page's own refusals of what is typed in `scope` (checks.js): [{input, problem}]. */
export function pageProblems(scope) {
  const out = [];
  const locale = pageLocale();
  for (const input of scope.querySelectorAll('[data-kind]')) {
    if (!input.errorNode) continue;
    // each field's check is kept until its text, kind or the locale changes (a smile grid
    // holds dozens of fields, and one edit changes one of them)
    const key = `${locale}\u0000${input.dataset.kind}\u0000${input.value}`;
    if (input.checkedFor !== key) {
      input.checkedFor = key;
      input.checkedProblem = inputProblem(input);
    }
    if (input.checkedProblem && !input.closest('[hidden]')) out.push({ input, problem: input.checkedProblem });
  }
  return out;
}

/** Show the page's own refusals beside their fields, in the field's name. */
export function showPageProblems(problems) {
  for (const { input, problem } of problems) markError(input.errorNode, `${fieldName(input)} ${problem}`);
}

/** Show (or clear) the warning under `input`: a value that reads but is probably not what was meant. */
export function showWarning(input) {
  const node = input.warningNode;
  if (!node) return;
  const text = inputWarning(input) ?? '';
  if (node.textContent !== text) node.textContent = text;
  node.hidden = !text;
}

/** Grey (or ungrey) the cards of `panels` (their data-panel names); fresh figures are no longer "restored". */
export function setStale(panels, stale) {
  for (const node of document.querySelectorAll('[data-panel]')) {
    if (!panels.includes(node.dataset.panel)) continue;
    node.classList.toggle('stale', stale);
    for (const use of node.querySelectorAll('[data-uses-result]')) if (use.disabled !== stale) use.disabled = stale;
    if (!stale) node.classList.toggle('restored', false); // fresh figures: no longer the ones kept from before a reload
  }
}

let errorId = 0;
/**
 * Give a bound input its error line (data-error follows the path it writes) and, for a percent
 * field, a line for warnings.
 */
function attachError(input) {
  if (input.errorNode || input.type === 'radio') return;
  const holder = input.closest('.field, .cell') ?? input.parentElement;
  const node = make('span', { className: 'field-error', role: 'alert', id: `error-${(errorId += 1)}` });
  node.errorInput = input;
  input.errorNode = node;
  const ids = [node.id];
  if (input.dataset.kind === 'percent' || input.id === 'margin-input') {
    input.warningNode = make('span', { className: 'field-warning', role: 'status', id: `warning-${errorId}` });
    input.warningNode.hidden = true;
    ids.push(input.warningNode.id);
    holder.append(input.warningNode);
  }
  input.setAttribute('aria-describedby', ids.join(' '));
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
    showWarning(input);
  }
}
