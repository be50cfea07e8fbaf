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

const tenorPattern = /^(\d{1,5})([dwmy])$/i;
const dayMs = 86400000;

/** Saturday and Sunday are the only holidays (the engine's rule, core/contract/dates). */
function isWeekend(iso) {
  const weekday = new Date(`${iso}T00:00:00Z`).getUTCDay();
  return weekday === 0 || weekday === 6;
}

function shiftDays(iso, days) {
  return new Date(dayNumber(iso) * dayMs + days * dayMs).toISOString().slice(0, 10);
}

/** Modified following: a weekend day rolls forward to Monday unless that is next month, then back to Friday. */
function modifiedFollowing(iso) {
  let forward = iso;
  while (isWeekend(forward)) forward = shiftDays(forward, 1);
  if (forward.slice(0, 7) === iso.slice(0, 7)) return forward;
  let back = iso;
  while (isWeekend(back)) back = shiftDays(back, -1);
  return back;
}

/**
 * The date a tenor ("1w", "3m", "6m", "1y", "18m"; a count of 1 to 18250 and d, w, m or y)
 * falls on from `from`, as the engine reads expiry_tenor: days and weeks as calendar days,
 * months and years as calendar months with the day clamped to the month's end, then rolled
 * by modified following (weekends only). Null for anything else.
 */
export function tenorToDate(from, tenor) {
  const match = typeof tenor === 'string' ? tenorPattern.exec(tenor) : null;
  if (!isIsoDate(from) || !match) return null;
  const count = Number(match[1]);
  if (count < 1 || count > 18250) return null;
  const unit = match[2].toLowerCase();
  let date;
  if (unit === 'd' || unit === 'w') date = shiftDays(from, unit === 'd' ? count : 7 * count);
  else date = addMonths(from, unit === 'm' ? count : 12 * count);
  return modifiedFollowing(date);
}
