import { AnalyticsInputError } from './analytics-input-error';

const ISO_DATE = /^(\d{4})-(\d{2})-(\d{2})$/;
const MS_PER_DAY = 86_400_000;

/**
 * Converts an ISO calendar date 'YYYY-MM-DD' to whole days since 1970-01-01 (UTC),
 * so that recall windows are plain integer arithmetic, free of time zones and
 * daylight saving.
 *
 * @param date ISO date, e.g. '2024-02-29'
 * @param label name used in the error message
 * @returns days since the Unix epoch
 * @throws {AnalyticsInputError} when the text is not a real calendar date in that form
 * @example
 * isoDateToDayNumber('1970-01-02'); // 1
 */
export function isoDateToDayNumber(date: string, label = 'date'): number {
  const match = typeof date === 'string' ? ISO_DATE.exec(date) : null;
  if (match) {
    const year = Number(match[1]);
    const month = Number(match[2]);
    const day = Number(match[3]);
    const time = Date.UTC(year, month - 1, day);
    const check = new Date(time);
    // Date.UTC rolls 2023-02-30 over to March; a real date survives the round trip.
    if (check.getUTCFullYear() === year && check.getUTCMonth() === month - 1 && check.getUTCDate() === day) {
      return time / MS_PER_DAY;
    }
  }
  throw new AnalyticsInputError(`${label} must be an ISO date YYYY-MM-DD, got ${String(date)}`);
}
