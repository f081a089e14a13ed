/**
 * Dates and times as people read them, and the calendar day as data.
 *
 * Time zone rule:
 * - A calendar day (`2026-12-02`: a quote's delivery date or validity, a run's start) is a day, not an instant: it
 *   is written as that day in every zone and never shifts.
 * - An instant (when an order was paid, a comment made) is written in the formatting zone. It is UTC unless a screen
 *   sets another: the app sets the viewer's own zone at start-up (`setFormatTimeZone`), because a person reads a
 *   time on a screen as their wall-clock time. The server never sets it, so documents, mails and CSV files are
 *   written in UTC: the zone the server stores and counts days in (quote validity, issue days, file names), and one
 *   that does not change with the machine the server happens to run on (its `TZ`) or with summer time. A studio has
 *   no zone setting yet; when it gets one, documents should pass it here instead of UTC.
 * - Data (file names, ids, form values) use the ISO 8601 day of the instant in UTC (`isoDay`).
 */
import { formatLocale } from './locale';

/** A moment or a day: a Date, an ISO 8601 text (`2026-12-02T16:48:00Z` or the day `2026-12-02`) or epoch ms. */
export type DateInput = Date | string | number;

/** The zone instants are written in until a screen sets another, and always in documents and mails. */
export const DOCUMENT_TIME_ZONE = 'UTC';

let zone = DOCUMENT_TIME_ZONE;

/**
 * Whether the runtime knows an IANA time zone (`Europe/Berlin`, `UTC`).
 * @param timeZone - IANA time zone name
 */
export function isSupportedTimeZone(timeZone: string): boolean {
  try {
    new Intl.DateTimeFormat('en', { timeZone });
    return true;
  } catch {
    return false;
  }
}

/**
 * Sets the zone instants are written in (in the browser: the viewer's zone). An unknown zone leaves the current one.
 * @param timeZone - IANA time zone name
 */
export function setFormatTimeZone(timeZone: string): void {
  if (isSupportedTimeZone(timeZone)) zone = timeZone;
}

/** The zone instants are written in. */
export function formatTimeZone(): string {
  return zone;
}

const CALENDAR_DAY = /^\d{4}-\d{2}-\d{2}$/;

function isCalendarDay(at: DateInput): at is string {
  return typeof at === 'string' && CALENDAR_DAY.test(at);
}

function toDate(at: DateInput): Date {
  return isCalendarDay(at) ? new Date(`${at}T00:00:00Z`) : new Date(at);
}

/** What is written for a date that cannot be read (never a library's "Invalid Date"). */
const UNREADABLE = '—';

/**
 * A day as people read it: `2 Dec 2026` (en-GB), `02.12.2026` (de-DE). A calendar day is written as itself; an
 * instant as its day in the formatting zone.
 * @param at - the day or instant
 * @param locale - BCP 47 language tag (default: the studio's)
 */
export function formatDate(at: DateInput, locale: string = formatLocale()): string {
  const date = toDate(at);
  if (Number.isNaN(date.getTime())) return UNREADABLE;
  const timeZone = isCalendarDay(at) ? 'UTC' : zone;
  return new Intl.DateTimeFormat(locale, { dateStyle: 'medium', timeZone }).format(date);
}

/**
 * An instant as people read it, to the minute: `2 Dec 2026, 16:48` (en-GB), `02.12.2026, 16:48` (de-DE).
 * @param at - the instant
 * @param locale - BCP 47 language tag (default: the studio's)
 */
export function formatDateTime(at: DateInput, locale: string = formatLocale()): string {
  const date = toDate(at);
  if (Number.isNaN(date.getTime())) return UNREADABLE;
  return new Intl.DateTimeFormat(locale, { dateStyle: 'medium', timeStyle: 'short', timeZone: zone }).format(date);
}

/**
 * The ISO 8601 calendar day of an instant in UTC (`2026-12-02`), for data: file names, ids, form values, day
 * comparisons. Not for people to read (use `formatDate`).
 * @param at - the instant (default now)
 */
export function isoDay(at: DateInput = new Date()): string {
  return toDate(at).toISOString().slice(0, 10);
}

/**
 * The ISO 8601 day `days` calendar days after the UTC day of `from` (`2026-12-30` for 28 days after 2 December).
 * @param from - the start
 * @param days - days to add (negative: before)
 */
export function addDays(from: DateInput, days: number): string {
  const d = toDate(from);
  return isoDay(Date.UTC(d.getUTCFullYear(), d.getUTCMonth(), d.getUTCDate() + days));
}
