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

  it('agrees with Date.UTC on every day from 1899 to 2101 (computed)', () => {
    for (let day = Date.UTC(1899, 0, 1) / 86_400_000; day <= Date.UTC(2101, 11, 31) / 86_400_000; day++) {
      const text = new Date(day * 86_400_000).toISOString().slice(0, 10);
      if (isoDateToDayNumber(text) !== day) throw new Error(`${text}: expected ${day}`);
    }
  });

  it('knows leap years: 2000 and 2024 have 29 February, 1900 and 2023 do not', () => {
    expect(() => isoDateToDayNumber('2000-02-29')).not.toThrow();
    expect(() => isoDateToDayNumber('2024-02-29')).not.toThrow();
    expect(() => isoDateToDayNumber('1900-02-29')).toThrow(AnalyticsInputError);
    expect(() => isoDateToDayNumber('2023-02-29')).toThrow(AnalyticsInputError);
  });

  it('rejects impossible dates and other formats', () => {
    for (const text of ['2023-02-29', '2024-13-01', '2024-00-10', '2024-01-00', '2024-04-31', '2024-1-5', '2024-01-5x', '+024-01-05', '05/01/2024', '2024-01-05T10:00', '']) {
      expect(() => isoDateToDayNumber(text, 'visitDate')).toThrow(AnalyticsInputError);
    }
    expect(() => isoDateToDayNumber('2023-02-30', 'visitDate')).toThrow(/visitDate must be an ISO date YYYY-MM-DD/);
  });
});
