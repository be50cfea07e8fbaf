// Hedgeleaf page: the one set of DOM and SVG builders every part of the page uses.
//
// Text is always set with textContent (never HTML), so what a client types
// stays text. Tables that a recompute refreshes are filled in place: rows and
// cells are reused and only changed text is written, which keeps a recompute
// inside one frame and the focus and scroll position where they were.

const svgNs = 'http://www.w3.org/2000/svg';

/** The element with id `id` (null if the page has none). */
export function byId(id) {
  return document.getElementById(id);
}

/** An element with properties (`text`, `dataset`, DOM properties, else attributes) and children. */
export function make(tag, props = {}, children = []) {
  const node = document.createElement(tag);
  for (const [key, value] of Object.entries(props)) {
    if (key === 'dataset') Object.assign(node.dataset, value);
    else if (key === 'text') node.textContent = value;
    else if (key in node && key !== 'list') node[key] = value;
    else node.setAttribute(key, value);
  }
  node.append(...children);
  return node;
}

/** An SVG element with attributes and, when given, text. */
export function makeSvg(tag, attrs = {}, text) {
  const node = document.createElementNS(svgNs, tag);
  for (const [key, value] of Object.entries(attrs)) node.setAttribute(key, String(value));
  if (text !== undefined) node.textContent = text;
  return node;
}

/** A push button (never a form submit) that runs `onClick`. */
export function button(text, onClick, props = {}) {
  const node = make('button', { type: 'button', text, ...props });
  if (onClick) node.addEventListener('click', onClick);
  return node;
}

/** The small ✕ that removes a row of a list; `label` says which row for screen readers. */
export function removeButton(label, onClick) {
  return button('✕', onClick, { className: 'small remove', title: label, 'aria-label': label });
}

/** A row of fields side by side. */
export function fieldRow(fields) {
  return make('div', { className: 'row' }, fields);
}

/** Labelled inputs bound to the trade document, from [label, path, kind, input properties?] entries. */
export function boundFields(entries) {
  return entries.map(([label, path, kind, props]) => field(label, bound(path, kind, props)));
}

/** A labelled field around an input. */
export function field(label, input, className = 'field') {
  return make('label', { className }, [make('span', { text: label }), input]);
}

/** A text input bound to a trade-document path (`kind` says how it reads: number, percent...). */
export function bound(path, kind, props = {}) {
  return make('input', { dataset: { path, kind }, autocomplete: 'off', inputMode: 'decimal', ...props });
}

/**
 * An input for a field that takes a date or years: it writes `<base>.<dateKey>` or
 * `<base>.<yearsKey>` (`keys` = "dateKey,yearsKey") by what is typed.
 */
export function whenInput(base, keys, props = {}) {
  return make('input', { dataset: { role: 'when', base, keys }, autocomplete: 'off', ...props });
}

/** `options` = [[value, text], ...] as <option> elements. */
export function optionList(options) {
  return options.map(([value, text]) => new Option(text, value));
}

/**
 * A choice bound to the trade document; `options` = [[value, text], ...]. `binding` is a
 * path, or the data attributes of a choice that writes by role (e.g. {role: 'exercise', base}).
 */
export function select(binding, options) {
  const dataset = typeof binding === 'string' ? { path: binding } : binding;
  return make('select', { dataset: { ...dataset, kind: 'choice' } }, optionList(options));
}

/** The line where the engine's message about `path` (or a field below it) is shown. */
export function errorLine(path) {
  return make('span', { className: 'field-error', dataset: { error: path }, role: 'alert' });
}

/** Set a node's text only if it differs (a lone text child is edited in place). */
export function setText(node, text) {
  const only = node.firstChild;
  if (only && only.nodeType === Node.TEXT_NODE && !only.nextSibling) {
    if (only.data !== text) only.data = text;
  } else if (node.textContent !== text) {
    node.textContent = text;
  }
}

/**
 * A box that scrolls `table` inside its card: a region named `label`, reachable with the
 * Tab key (tabindex 0), so that a keyboard can scroll it too.
 */
export function scrollRegion(label, table) {
  return make('div', { className: 'table-scroll', tabIndex: 0, role: 'region', 'aria-label': label }, [table]);
}

/** A table row: the first cell heads it (`th`), the rest are data cells. */
export function tableRow(cells) {
  return make(
    'tr',
    {},
    cells.map((text, i) => make(i ? 'td' : 'th', i ? { text } : { scope: 'row', text })),
  );
}

/** Make `body` (a tbody) hold `rows` (arrays of cell texts; the first cell heads its row), reusing what is there. */
export function fillRows(body, rows) {
  while (body.rows.length > rows.length) body.lastElementChild.remove();
  rows.forEach((cells, r) => {
    const tr = body.rows[r];
    if (!tr) body.append(tableRow(cells));
    else if (tr.cells.length !== cells.length) tr.replaceWith(tableRow(cells));
    else cells.forEach((text, i) => setText(tr.cells[i], text));
  });
}

/** A table head row of column titles. */
export function headRow(titles) {
  return make('thead', {}, [
    make(
      'tr',
      {},
      titles.map((h) => make('th', { scope: 'col', text: h })),
    ),
  ]);
}

/**
 * Make `table` show `head` (column titles) over `rows`, with an optional hidden
 * caption; the head is rebuilt only when its titles change.
 */
export function fillTable(table, head, rows, caption = '') {
  let body = table.tBodies[0];
  const titles = table.tHead ? [...table.tHead.rows[0].cells].map((c) => c.textContent) : null;
  if (!body || !titles || titles.join('\u0000') !== head.join('\u0000')) {
    body = make('tbody');
    const parts = [headRow(head), body];
    if (caption) parts.unshift(make('caption', { className: 'visually-hidden', text: caption }));
    table.replaceChildren(...parts);
  }
  fillRows(body, rows);
  return table;
}

/**
 * Whether each of `elements` is (partly) in the window, as an IntersectionObserver keeps it (asking
 * costs no layout). Returns (element) => boolean: true for an element the browser has not reported
 * on yet, and everywhere without an IntersectionObserver.
 */
export function inWindowWatch(elements) {
  const seen = new Map();
  if (typeof IntersectionObserver === 'function') {
    const observer = new IntersectionObserver((entries) => {
      for (const entry of entries) seen.set(entry.target, entry.isIntersecting);
    });
    for (const element of elements) if (element) observer.observe(element);
  }
  return (element) => seen.get(element) ?? true;
}
