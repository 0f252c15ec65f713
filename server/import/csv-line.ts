/**
 * One CSV line (RFC 4180, CRLF): values with a comma, quote or line break are quoted. Text that a
 * spreadsheet would run as a formula (= + - @ at the start) gets a leading apostrophe, so an
 * errors file can never carry a live formula (OWASP, CSV injection).
 */
export function csvLine(values: readonly (string | number)[]): string {
  return (
    values
      .map((value) => {
        if (typeof value === 'number') return String(value);
        const safe = /^[=+\-@\t\r]/.test(value) ? `'${value}` : value;
        return /[",\r\n]/.test(safe) ? `"${safe.replace(/"/g, '""')}"` : safe;
      })
      .join(',') + '\r\n'
  );
}
