import { describe, expect, it } from 'vitest';
import { AnalyticsInputError } from './analytics-input-error';
import { isoDateToDayNumber } from './iso-date-to-day-number';

describe('isoDateToDayNumber', () => {
  it('counts days from 1970-01-01', () => {
    // Computed (hand calculation): 2024 is a leap year, so 2024-03-01 − 2024-02-28 = 2 days;
    // 1970-01-01 + 365 days = 1971-01-01.
    expect(isoDateToDayNumber('1970-01-01')).toBe(0);
    expect(isoDateToDayNumber('1971-01-01')).toBe(365);
    expect(isoDateToDayNumber('2024-03-01') - isoDateToDayNumber('2024-02-28')).toBe(2);
  });

  it('rejects impossible dates and other formats', () => {
    for (const text of ['2023-02-29', '2024-13-01', '2024-1-5', '05/01/2024', '2024-01-05T10:00', '']) {
      expect(() => isoDateToDayNumber(text, 'visitDate')).toThrow(AnalyticsInputError);
    }
    expect(() => isoDateToDayNumber('2023-02-30', 'visitDate')).toThrow(/visitDate must be an ISO date YYYY-MM-DD/);
  });
});
