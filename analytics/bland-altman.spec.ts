import { describe, expect, it } from 'vitest';
import { AnalyticsInputError } from './analytics-input-error';
import { blandAltman } from './bland-altman';

// Source: Bland JM, Altman DG, Lancet 1986;i:307–310 — peak expiratory flow, Wright vs mini Wright,
// first readings, 17 subjects (data from memory; the recomputed mean and SD match the paper), REFERENCES.md A8.
const WRIGHT = [494, 395, 516, 434, 476, 557, 413, 442, 650, 433, 417, 656, 267, 478, 178, 423, 427];
const MINI_WRIGHT = [512, 430, 520, 428, 500, 600, 364, 380, 658, 445, 432, 626, 260, 477, 259, 350, 451];

describe('blandAltman', () => {
  it('Wright − mini Wright: bias −2.1, SD 38.8', () => {
    const result = blandAltman(WRIGHT, MINI_WRIGHT);
    expect(result.n).toBe(17);
    expect(result.bias).toBeCloseTo(-2.1, 1);
    expect(result.sd).toBeCloseTo(38.8, 1);
  });

  it('with ±1.96 SD (default): −78.1 to 73.9 (computed)', () => {
    const { lower, upper } = blandAltman(WRIGHT, MINI_WRIGHT);
    expect(lower).toBeCloseTo(-78.1, 1);
    expect(upper).toBeCloseTo(73.9, 1);
  });

  it("with ±2 SD as in the paper: −79.7 to 75.5", () => {
    // The paper computed −2.1 ± 2 × 38.8 from rounded figures; unrounded (−2.1176 ± 2 × 38.7651)
    // gives −79.65 to 75.41, so agreement is within 0.1.
    const { lower, upper } = blandAltman(WRIGHT, MINI_WRIGHT, { z: 2 });
    expect(Math.abs(lower - -79.7)).toBeLessThan(0.1);
    expect(Math.abs(upper - 75.5)).toBeLessThan(0.1);
  });

  it('identical methods: bias 0, SD 0, limits 0', () => {
    expect(blandAltman([1, 2, 3], [1, 2, 3])).toEqual({ n: 3, bias: 0, sd: 0, lower: 0, upper: 0 });
  });

  it('throws on mismatched lengths, n < 2, NaN and a bad z', () => {
    expect(() => blandAltman([1, 2, 3], [1, 2])).toThrow(/same length/);
    expect(() => blandAltman([1], [1])).toThrow(/at least 2 values/);
    expect(() => blandAltman([1, Number.NaN], [1, 2])).toThrow(AnalyticsInputError);
    expect(() => blandAltman([1, 2], [1, 2], { z: -1 })).toThrow(/z must be a positive number/);
  });
});
