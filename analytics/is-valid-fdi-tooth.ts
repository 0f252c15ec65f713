/** Highest tooth number per FDI quadrant digit (1–4 permanent: 8 teeth; 5–8 primary: 5). */
const TEETH_PER_QUADRANT: Readonly<Record<number, number>> = { 1: 8, 2: 8, 3: 8, 4: 8, 5: 5, 6: 5, 7: 5, 8: 5 };

/**
 * Whether a code is a valid FDI two-digit tooth number (ISO 3950): permanent
 * 11–18, 21–28, 31–38, 41–48; primary 51–55, 61–65, 71–75, 81–85. Accepts an
 * integer or a string of exactly two digits ("11"); rejects 10, 19, 49, 00, 91,
 * "011", " 11", "1", fractions and anything else. Never throws: it is a predicate.
 *
 * @param code tooth code as number or string
 * @returns true when the code names a tooth in ISO 3950
 * @example
 * isValidFdiTooth('21'); // true
 * isValidFdiTooth(19);   // false
 */
export function isValidFdiTooth(code: string | number): boolean {
  let value: number;
  if (typeof code === 'number') {
    if (!Number.isInteger(code)) return false;
    value = code;
  } else if (typeof code === 'string' && /^[0-9]{2}$/.test(code)) {
    value = Number(code);
  } else {
    return false;
  }
  const quadrant = Math.floor(value / 10);
  const tooth = value % 10;
  const teeth = TEETH_PER_QUADRANT[quadrant];
  return teeth !== undefined && tooth >= 1 && tooth <= teeth;
}
