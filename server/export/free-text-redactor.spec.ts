import { freeTextRedactor, REDACTED_CODE } from './free-text-redactor';

// DESIGN.md §7: governance exports are de-identified (codes replaced, dates reduced to the month).
describe('freeTextRedactor', () => {
  const redact = freeTextRedactor(['HP-0042', 'AB12']);

  it('removes practice codes, in any case and inside longer hyphenated words', () => {
    expect(redact('Review hp-0042 and AB12-b before June')).toBe(`Review ${REDACTED_CODE} and ${REDACTED_CODE} before June`);
    expect(redact('HP-00421 is not a code here')).toBe('HP-00421 is not a code here');
  });

  it('cuts ISO dates to their month and other full dates to their year', () => {
    expect(redact('Seen 2024-03-05, again 05/03/2024')).toBe('Seen 2024-03, again 2024');
  });
});
