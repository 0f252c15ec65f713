import { formatLocalDate } from './local-date';

// Expected strings are CLDR's patterns as Node's full ICU renders them (Intl.DateTimeFormat, ECMA-402).
describe('formatLocalDate', () => {
  it('lays a date out the way each locale writes it', () => {
    expect(formatLocalDate('2026-03-14', 'date', 'en-GB')).toBe('14 Mar 2026');
    expect(formatLocalDate('2026-03-14', 'date', 'en-US')).toBe('Mar 14, 2026');
    expect(formatLocalDate('2026-03-14', 'date', 'de')).toBe('14.03.2026');
  });

  it('keeps a calendar date on its day in any time zone', () => {
    // new Date('2026-03-14') is midnight UTC: shown in New York it would be the 13th.
    expect(formatLocalDate('2026-03-14', 'date', 'en-GB', 'America/New_York')).toBe('14 Mar 2026');
    expect(formatLocalDate('2026-03-14', 'date', 'en-GB', 'UTC')).toBe('14 Mar 2026');
    expect(formatLocalDate('2026-03-14', 'date', 'en-GB', 'Pacific/Auckland')).toBe('14 Mar 2026');
  });

  it('shows a timestamp in the given zone with the locale’s clock', () => {
    const sent = '2026-03-14T13:05:00Z';
    expect(formatLocalDate(sent, 'date-time', 'en-GB', 'UTC')).toBe('14 Mar 2026, 13:05');
    expect(formatLocalDate(sent, 'date-time', 'en-US', 'UTC')).toBe('Mar 14, 2026, 1:05 PM');
    expect(formatLocalDate(sent, 'day-month-time', 'en-GB', 'Europe/Berlin')).toBe('14 Mar, 14:05');
  });

  it('writes months and weekdays in full where the style asks', () => {
    expect(formatLocalDate('2026-03', 'month', 'en-GB')).toBe('Mar 2026');
    expect(formatLocalDate('2026-03-14', 'month-long', 'fr')).toBe('mars 2026');
    expect(formatLocalDate('2026-12-02', 'weekday-date', 'en-GB')).toBe('Wednesday, 2 December 2026');
  });

  it('leaves a missing or unreadable value empty', () => {
    expect(formatLocalDate(null, 'date', 'en-GB')).toBe('');
    expect(formatLocalDate('', 'date', 'en-GB')).toBe('');
    expect(formatLocalDate('not a date', 'date', 'en-GB')).toBe('');
  });
});
