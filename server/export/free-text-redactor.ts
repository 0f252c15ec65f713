/** Marks where a patient code stood in free text. */
export const REDACTED_CODE = '[patient code removed]';

const FULL_DATE = /\b(\d{4})-(0[1-9]|1[0-2])-(0[1-9]|[12]\d|3[01])\b/g;
/** 05/03/2024, 5.3.2024: day and month order cannot be told apart, so only the year is kept. */
const SLASHED_DATE = /\b\d{1,2}[./]\d{1,2}[./](\d{4})\b/g;
const TOKEN = /[A-Za-z0-9]+(?:-[A-Za-z0-9]+)*/g;

/**
 * Makes free text fit for a de-identified export (DESIGN.md §7): any patient code of the practice
 * is removed (also inside a longer hyphenated word), ISO dates are cut to their month and other
 * full dates to their year. Free text here is written by the team (criteria, evidence, actions);
 * clinical notes never enter the workbook at all.
 */
export function freeTextRedactor(patientCodes: Iterable<string>): (text: string) => string {
  const codes = new Set<string>();
  for (const code of patientCodes) codes.add(code.toUpperCase());
  const containsCode = (token: string): boolean => {
    const parts = token.toUpperCase().split('-');
    for (let start = 0; start < parts.length; start += 1) {
      for (let end = start + 1; end <= parts.length; end += 1) {
        if (codes.has(parts.slice(start, end).join('-'))) return true;
      }
    }
    return false;
  };
  return (text) =>
    text
      .replace(FULL_DATE, '$1-$2')
      .replace(SLASHED_DATE, '$1')
      .replace(TOKEN, (token) => (containsCode(token) ? REDACTED_CODE : token));
}
