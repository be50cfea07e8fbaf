// Hedgeleaf page: calendar dates as the engine counts them (ISO text, ACT/365F).

const isoPattern = /^\d{4}-\d{2}-\d{2}$/;

/** True for "YYYY-MM-DD" text. */
export function isIsoDate(text) {
  return typeof text === 'string' && isoPattern.test(text);
}

function dayNumber(text) {
  const [y, m, d] = text.split('-').map(Number);
  return Date.UTC(y, m - 1, d) / 86400000;
}

/** Years from `from` to `to` (ACT/365F), or null if either is not a date. */
export function yearsBetween(from, to) {
  if (!isIsoDate(from) || !isIsoDate(to)) return null;
  return (dayNumber(to) - dayNumber(from)) / 365;
}

/** The date `years` (ACT/365F, rounded to a day) after `from`. */
export function addYears(from, years) {
  if (!isIsoDate(from) || !Number.isFinite(years)) return null;
  const ms = (dayNumber(from) + Math.round(years * 365)) * 86400000;
  return new Date(ms).toISOString().slice(0, 10);
}

/** The date `months` calendar months after `from` (the day clamped to the month's end), or null. */
export function addMonths(from, months) {
  if (!isIsoDate(from) || !Number.isInteger(months)) return null;
  const [y, m, d] = from.split('-').map(Number);
  const first = new Date(Date.UTC(y, m - 1 + months, 1));
  const last = new Date(Date.UTC(first.getUTCFullYear(), first.getUTCMonth() + 1, 0)).getUTCDate();
  first.setUTCDate(Math.min(d, last));
  return first.toISOString().slice(0, 10);
}

/** Today in the computer's time zone, as YYYY-MM-DD. */
export function todayIso(now = new Date()) {
  const pad = (n) => String(n).padStart(2, '0');
  return `${now.getFullYear()}-${pad(now.getMonth() + 1)}-${pad(now.getDate())}`;
}
