import { formatByteSize } from './byte-size';

// Decimal prefixes per IEC 80000-13 (kilo = 10^3, mega = 10^6); words and separators from CLDR through Intl.
describe('formatByteSize', () => {
  it('writes whole bytes below a kilobyte', () => {
    expect(formatByteSize(0, 'en-GB')).toBe('0 bytes');
    expect(formatByteSize(1, 'en-GB')).toBe('1 byte');
    expect(formatByteSize(999, 'en-GB')).toBe('999 bytes');
  });

  it('switches to the largest decimal unit the size reaches, with one decimal at most', () => {
    expect(formatByteSize(1000, 'en-GB')).toBe('1 kB');
    expect(formatByteSize(48_300_000, 'en-GB')).toBe('48.3 MB');
    expect(formatByteSize(1_250_000_000, 'en-GB')).toBe('1.3 GB');
    expect(formatByteSize(2e12, 'en-GB')).toBe('2 TB');
  });

  it("follows the locale's decimal separator", () => {
    expect(formatByteSize(48_300_000, 'de')).toBe('48,3 MB');
  });

  it('reads a negative or unreadable size as nothing', () => {
    expect(formatByteSize(-5, 'en-GB')).toBe('0 bytes');
    expect(formatByteSize(Number.NaN, 'en-GB')).toBe('0 bytes');
  });
});
