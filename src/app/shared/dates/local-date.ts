/** How much of a date to show; each style is laid out by the locale's own rules (CLDR, through `Intl.DateTimeFormat`). */
export type DateStyle = 'date' | 'date-time' | 'day-month' | 'day-month-time' | 'month' | 'month-long' | 'weekday-date';

/** The parts each style shows; order, punctuation, month names and 12/24-hour clock come from the locale. */
export const DATE_STYLES: Readonly<Record<DateStyle, Intl.DateTimeFormatOptions>> = {
  // The locale's own medium date and short time, e.g. "14 Mar 2026, 09:30" (en-GB), "Mar 14, 2026, 9:30 AM" (en-US).
  date: { dateStyle: 'medium' },
  'date-time': { dateStyle: 'medium', timeStyle: 'short' },
  'day-month': { day: 'numeric', month: 'short' },
  'day-month-time': { day: 'numeric', month: 'short', hour: '2-digit', minute: '2-digit' },
  month: { month: 'short', year: 'numeric' },
  'month-long': { month: 'long', year: 'numeric' },
  'weekday-date': { weekday: 'long', day: 'numeric', month: 'long', year: 'numeric' },
};

/** A calendar date or month as the API sends it: `2026-03-14` or `2026-03`. */
const CALENDAR_DATE = /^(\d{4})-(\d{2})(?:-(\d{2}))?$/;

/**
 * The instant to format and the zone to show it in. A calendar date (`2026-03-14`, no time) is
 * that day wherever the browser is: it is built at midnight UTC and shown in UTC, so it never
 * slips to the 13th west of Greenwich or the 15th far to the east.
 */
function instantOf(value: string | number | Date, timeZone: string | undefined): { instant: Date; timeZone: string | undefined } {
  const calendar = typeof value === 'string' ? CALENDAR_DATE.exec(value) : null;
  if (!calendar) return { instant: new Date(value), timeZone };
  const [year, month, day] = [Number(calendar[1]), Number(calendar[2]) - 1, Number(calendar[3] ?? 1)];
  return { instant: new Date(Date.UTC(year, month, day)), timeZone: 'UTC' };
}

/**
 * A date in the given locale, e.g. style `'date'`: "14 Mar 2026" (en-GB), "Mar 14, 2026" (en-US),
 * "14.03.2026" (de). Empty for a missing or unreadable value.
 *
 * @param value an ISO 8601 date or timestamp, epoch milliseconds or a Date
 * @param style how much of the date to show
 * @param locale a BCP 47 tag (Angular's `LOCALE_ID`)
 * @param timeZone an IANA zone for timestamps, e.g. `'UTC'`; the browser's own when left out (calendar dates have no zone)
 */
export function formatLocalDate(value: string | number | Date | null | undefined, style: DateStyle, locale: string, timeZone?: string): string {
  if (value === null || value === undefined || value === '') return '';
  const shown = instantOf(value, timeZone);
  if (Number.isNaN(shown.instant.getTime())) return '';
  return new Intl.DateTimeFormat(locale, { ...DATE_STYLES[style], timeZone: shown.timeZone }).format(shown.instant);
}
