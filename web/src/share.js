// Hedgeleaf page: the trade outside the page (fragment links, autosave, files).
//
// The trade always travels as the same JSON document the CLI reads.
import { make } from './dom.js';

/** UTF-8 JSON text -> base64url (no padding), for #trade=... */
export function toBase64Url(text) {
  const bytes = new TextEncoder().encode(text);
  let binary = '';
  for (let i = 0; i < bytes.length; i += 0x8000) binary += String.fromCharCode(...bytes.subarray(i, i + 0x8000));
  return btoa(binary).replace(/\+/g, '-').replace(/\//g, '_').replace(/=+$/, '');
}

/** base64url -> text; throws Error on bad input. */
export function fromBase64Url(code) {
  if (!/^[A-Za-z0-9_-]*$/.test(code)) throw new Error('the link is damaged (not base64url)');
  const padded = code.replace(/-/g, '+').replace(/_/g, '/') + '='.repeat((4 - (code.length % 4)) % 4);
  const binary = atob(padded);
  const bytes = Uint8Array.from(binary, (c) => c.charCodeAt(0));
  return new TextDecoder('utf-8', { fatal: true }).decode(bytes);
}

/** The trade text in a location hash "#trade=...", or null. */
export function tradeFromHash(hash) {
  const match = /^#?(?:.*&)?trade=([^&]*)/.exec(hash || '');
  return match ? fromBase64Url(match[1]) : null;
}

/** Deepest nesting of objects and arrays a trade may have (max_document_depth in core/trade.hpp). */
export const maxDocumentDepth = 64;

/**
 * Parse trade text from outside the page (link, file, autosave). Throws SyntaxError
 * for text that is not JSON and Error for nesting deeper than any trade, which the
 * page could not even copy (the engine refuses it the same way).
 */
export function parseTradeText(text) {
  let depth = 0;
  let inString = false;
  let escaped = false;
  for (const c of text) {
    if (inString) {
      if (escaped) escaped = false;
      else if (c === '\\') escaped = true;
      else if (c === '"') inString = false;
    } else if (c === '"') inString = true;
    else if (c === '{' || c === '[') {
      if (++depth > maxDocumentDepth)
        throw new Error(`it is nested more than ${maxDocumentDepth} levels deep, which no trade is`);
    } else if (c === '}' || c === ']') depth -= 1;
  }
  return JSON.parse(text);
}

/** The file text for a trade document (what Export writes and the CLI reads). */
export function tradeFileText(doc) {
  return `${JSON.stringify(doc, null, 2)}\n`;
}

/**
 * Short fingerprint of the inputs: the first 12 hex digits of SHA-256 over the
 * trade file exactly as Save file writes it (so `sha256sum trade.json` agrees).
 */
export async function fingerprint(doc) {
  const data = new TextEncoder().encode(tradeFileText(doc));
  if (!globalThis.crypto?.subtle) return null;
  const digest = new Uint8Array(await crypto.subtle.digest('SHA-256', data));
  return [...digest.slice(0, 6)].map((b) => b.toString(16).padStart(2, '0')).join('');
}

const storageKey = 'hedgeleaf.autosave.v1';

/** Save {seed, trade, extras}; returns null or the reason it failed (quota full, storage off). */
export function autosave(storage, record) {
  try {
    if (!storage) throw new Error('no storage');
    storage.setItem(storageKey, JSON.stringify(record));
    return null;
  } catch (err) {
    const full = err && (err.name === 'QuotaExceededError' || err.code === 22 || err.code === 1014);
    return full
      ? 'Autosave failed: this browser’s local storage is full. Export the trade to keep it.'
      : 'Autosave is unavailable in this browser. Export the trade to keep it.';
  }
}

/** The autosaved record, or null. */
export function loadAutosave(storage) {
  try {
    const text = storage?.getItem(storageKey);
    return text ? parseTradeText(text) : null;
  } catch {
    return null;
  }
}

/** Offer `text` as a download named `name`. */
export function download(name, text, type) {
  const url = URL.createObjectURL(new Blob([text], { type }));
  const link = make('a', { href: url, download: name });
  document.body.append(link);
  link.click();
  link.remove();
  setTimeout(() => URL.revokeObjectURL(url), 10000);
}

/** A file name from free text: "Aldane Foods put" -> "aldane-foods-put". */
export function slug(text, fallback) {
  const s = String(text || '')
    .toLowerCase()
    .normalize('NFKD')
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 40);
  return s || fallback;
}
