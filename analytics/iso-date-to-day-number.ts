import { AnalyticsInputError } from './analytics-input-error';

const DIGIT_0 = 48;
const DAYS_IN_MONTH = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];

/** Value of `count` decimal digits of `text` from `start`, or −1 if one is not a digit. */
function digitsAt(text: string, start: number, count: number): number {
  let value = 0;
  for (let i = start; i < start + count; i++) {
    const digit = text.charCodeAt(i) - DIGIT_0;
    if (digit < 0 || digit > 9) return -1;
    value = value * 10 + digit;
  }
  return value;
}

function isLeapYear(year: number): boolean {
  return (year % 4 === 0 && year % 100 !== 0) || year % 400 === 0;
}

/**
 * Days from 1970-01-01 to a proleptic Gregorian date: Hinnant H, "chrono-compatible
 * low-level date algorithms" (days_from_civil), 2013 — integer arithmetic only.
 */
function daysFromCivil(year: number, month: number, day: number): number {
  const y = month <= 2 ? year - 1 : year;
  const era = Math.floor(y / 400);
  const yearOfEra = y - era * 400;
  const dayOfYear = Math.floor((153 * (month + (month > 2 ? -3 : 9)) + 2) / 5) + day - 1;
  const dayOfEra = yearOfEra * 365 + Math.floor(yearOfEra / 4) - Math.floor(yearOfEra / 100) + dayOfYear;
  return era * 146_097 + dayOfEra - 719_468;
}

/**
 * Converts an ISO calendar date 'YYYY-MM-DD' to whole days since 1970-01-01, so that
 * recall windows are plain integer arithmetic, free of time zones and daylight saving.
 * Parsed by hand rather than through `Date` because recall completion converts a few
 * hundred thousand visit dates per audit.
 *
 * @param date ISO date, e.g. '2024-02-29'
 * @param label name used in the error message
 * @returns days since the Unix epoch
 * @throws {AnalyticsInputError} when the text is not a real calendar date in that form
 * @example
 * isoDateToDayNumber('1970-01-02'); // 1
 */
export function isoDateToDayNumber(date: string, label = 'date'): number {
  if (typeof date === 'string' && date.length === 10 && date[4] === '-' && date[7] === '-') {
    const year = digitsAt(date, 0, 4);
    const month = digitsAt(date, 5, 2);
    const day = digitsAt(date, 8, 2);
    if (year >= 0 && month >= 1 && month <= 12 && day >= 1) {
      const monthLength = month === 2 && isLeapYear(year) ? 29 : DAYS_IN_MONTH[month - 1];
      if (day <= monthLength) return daysFromCivil(year, month, day);
    }
  }
  throw new AnalyticsInputError(`${label} must be an ISO date YYYY-MM-DD, got ${String(date)}`);
}
