// Hedgeleaf page: the small DOM builders the cards share.
//
// Text is always set with textContent (never HTML), so what a client types
// stays text. Tables that a recompute refreshes are filled in place: rows and
// cells are reused and only changed text is written, which keeps a recompute
// inside one frame and the focus and scroll position where they were.

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

/** A labelled field around an input. */
export function field(label, input, className = 'field') {
  return make('label', { className }, [make('span', { text: label }), input]);
}

/** A text input bound to a trade-document path (`kind` says how it reads: number, percent...). */
export function bound(path, kind, props = {}) {
  return make('input', { dataset: { path, kind }, autocomplete: 'off', inputMode: 'decimal', ...props });
}

/** A choice bound to a trade-document path; `options` = [[value, text], ...]. */
export function select(path, options) {
  const node = make('select', { dataset: { path, kind: 'choice' } });
  for (const [value, text] of options) node.append(new Option(text, value));
  return node;
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

function row(cells) {
  return make('tr', {}, cells.map((text, i) => make(i ? 'td' : 'th', i ? { text } : { scope: 'row', text })));
}

/** Make `body` (a tbody) hold `rows` (arrays of cell texts; the first cell heads its row), reusing what is there. */
export function fillRows(body, rows) {
  while (body.rows.length > rows.length) body.lastElementChild.remove();
  rows.forEach((cells, r) => {
    const tr = body.rows[r];
    if (!tr) body.append(row(cells));
    else if (tr.cells.length !== cells.length) tr.replaceWith(row(cells));
    else cells.forEach((text, i) => setText(tr.cells[i], text));
  });
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
    const parts = [make('thead', {}, [make('tr', {}, head.map((h) => make('th', { scope: 'col', text: h })))]), body];
    if (caption) parts.unshift(make('caption', { className: 'visually-hidden', text: caption }));
    table.replaceChildren(...parts);
  }
  fillRows(body, rows);
  return table;
}
