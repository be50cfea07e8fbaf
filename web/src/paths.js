// Hedgeleaf page: reading and writing a trade document by field path.
//
// Paths are the engine's: "market.spot", "market.dividends[0].amount",
// "structure.strikes[1]". The page addresses its inputs and error messages
// with the same text, so an engine error lands beside the field that caused it.

/** "market.dividends[0].amount" -> ["market", "dividends", 0, "amount"] */
export function splitPath(path) {
  const parts = [];
  for (const piece of path.split('.')) {
    const match = /^([^[\]]*)((?:\[\d+\])*)$/.exec(piece);
    if (!match) throw new Error(`bad path ${path}`);
    if (match[1]) parts.push(match[1]);
    for (const index of match[2].matchAll(/\[(\d+)\]/g)) parts.push(Number(index[1]));
  }
  return parts;
}

/** The value at `path`, or undefined. */
export function getPath(doc, path) {
  let node = doc;
  for (const key of splitPath(path)) {
    if (node === null || typeof node !== 'object') return undefined;
    node = node[key];
  }
  return node;
}

/** Set the value at `path`, creating objects on the way; undefined deletes it (and empty parents). */
export function setPath(doc, path, value) {
  const parts = splitPath(path);
  const trail = [doc];
  let node = doc;
  for (let i = 0; i < parts.length - 1; i += 1) {
    const key = parts[i];
    if (node[key] === null || typeof node[key] !== 'object') {
      if (value === undefined) return;
      node[key] = typeof parts[i + 1] === 'number' ? [] : {};
    }
    node = node[key];
    trail.push(node);
  }
  const last = parts[parts.length - 1];
  if (value !== undefined) {
    node[last] = value;
    return;
  }
  if (Array.isArray(node)) return; // list entries are removed by their own button, never by emptying a field
  delete node[last];
  // drop objects the deletion left empty (an empty "lattice": {} helps nobody), but keep lists
  for (let i = parts.length - 2; i >= 0; i -= 1) {
    const holder = trail[i];
    const child = holder[parts[i]];
    if (child && !Array.isArray(child) && typeof child === 'object' && Object.keys(child).length === 0)
      delete holder[parts[i]];
    else break;
  }
}

/** Paths from the most to the least specific: "a.b[0].c", "a.b[0]", "a.b", "a", "". */
export function pathAncestors(path) {
  const out = [];
  let p = path;
  while (p) {
    out.push(p);
    const cut = Math.max(p.lastIndexOf('.'), p.lastIndexOf('['));
    p = cut > 0 ? p.slice(0, cut) : '';
  }
  out.push('');
  return out;
}
