import { describe, expect, it } from 'vitest';
import { isValidFdiTooth } from './is-valid-fdi-tooth';

// Source: ISO 3950 (FDI two-digit notation) — permanent 11–18, 21–28, 31–38, 41–48;
// primary 51–55, 61–65, 71–75, 81–85.
describe('isValidFdiTooth', () => {
  it('accepts all 52 permanent and primary teeth, as numbers and as two-digit strings', () => {
    const valid: number[] = [];
    for (const quadrant of [1, 2, 3, 4]) for (let tooth = 1; tooth <= 8; tooth++) valid.push(quadrant * 10 + tooth);
    for (const quadrant of [5, 6, 7, 8]) for (let tooth = 1; tooth <= 5; tooth++) valid.push(quadrant * 10 + tooth);
    expect(valid).toHaveLength(52);
    for (const code of valid) {
      expect(isValidFdiTooth(code)).toBe(true);
      expect(isValidFdiTooth(String(code))).toBe(true);
    }
  });

  it('rejects every other two-digit number', () => {
    let accepted = 0;
    for (let code = 0; code <= 99; code++) if (isValidFdiTooth(code)) accepted++;
    expect(accepted).toBe(52);
  });

  it.each([10, 19, 49, 0, 91, 56, 86, 99, 9, 100, -11, 11.5, Number.NaN])('rejects %s', (code) => {
    expect(isValidFdiTooth(code)).toBe(false);
  });

  it.each(['00', '19', '10', '49', '91', '011', '1', ' 11', '11 ', '11.0', '1e1', '', 'ab'])('rejects the string "%s"', (code) => {
    expect(isValidFdiTooth(code)).toBe(false);
  });
});
