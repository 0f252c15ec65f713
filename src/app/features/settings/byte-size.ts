/** Decimal (SI) units, as file managers show sizes: 1 kB = 1000 bytes (IEC 80000-13). */
const UNITS: ReadonlyArray<readonly [unit: string, bytes: number]> = [
  ['terabyte', 1e12],
  ['gigabyte', 1e9],
  ['megabyte', 1e6],
  ['kilobyte', 1e3],
];

/**
 * A file size in the locale's words, one decimal at most: `formatByteSize(48_300_000, 'en-GB')`
 * → "48.3 MB"; below 1 kB in whole bytes ("512 bytes").
 *
 * @param bytes a size in bytes (negative or non-finite values read as 0)
 * @param locale a BCP 47 tag (Angular's `LOCALE_ID`)
 */
export function formatByteSize(bytes: number, locale: string): string {
  const size = Number.isFinite(bytes) && bytes > 0 ? bytes : 0;
  const found = UNITS.find(([, factor]) => size >= factor);
  if (!found) return new Intl.NumberFormat(locale, { style: 'unit', unit: 'byte', unitDisplay: 'long', maximumFractionDigits: 0 }).format(size);
  const [unit, factor] = found;
  return new Intl.NumberFormat(locale, { style: 'unit', unit, unitDisplay: 'short', maximumFractionDigits: 1 }).format(size / factor);
}
