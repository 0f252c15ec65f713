import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { AnalyticsInputError } from './analytics-input-error';
import { cohenKappa } from './cohen-kappa';

/*
 * 3×3 table used for the weighted checks — computed (hand calculation), formula from
 * Cohen J, Psychol Bull 1968;70:213–220. Every disagreement is one category apart.
 *   [[10, 2, 0], [3, 8, 2], [0, 1, 4]]; N = 30; rows 12, 13, 5; columns 13, 11, 6.
 *   Diagonal: 22 observed; Σ r_i c_i = 156 + 143 + 30 = 329.
 *   One apart: 2 + 3 + 2 + 1 = 8 observed; Σ r_i c_j = 132 + 169 + 78 + 55 = 434.
 *   Unweighted: pₒ = 22/30, pₑ = 329/900 → κ = 0.579685.
 *   Linear (w = 0.5): pₒ = 26/30, pₑ = 546/900 → κ = 0.26/0.393333 = 0.661017.
 *   Quadratic (w = 0.75): pₒ = 28/30, pₑ = 654.5/900 → κ = 0.206111/0.272778 = 0.755601.
 */
const ORDINAL_TABLE = [
  [10, 2, 0],
  [3, 8, 2],
  [0, 1, 4],
];

describe('cohenKappa', () => {
  it('2×2 [[20, 5], [10, 15]]: pₒ 0.70, pₑ 0.50, κ 0.40, fair', () => {
    // Source: Cohen J, Educ Psychol Meas 1960;20:37–46 (formula); values computed, REFERENCES.md A8.
    const result = cohenKappa([[20, 5], [10, 15]]);
    expect(result.observed).toBeCloseTo(0.7, 12);
    expect(result.expected).toBeCloseTo(0.5, 12);
    expect(result.kappa).toBeCloseTo(0.4, 12);
    // Landis & Koch 1977: 0.21–0.40 fair (κ computes as 0.39999…; banding rounds before comparing).
    expect(result.band).toBe('fair');
  });

  it('unweighted, linear and quadratic kappa on an ordinal table (hand calculation above)', () => {
    expect(cohenKappa(ORDINAL_TABLE).kappa).toBeCloseTo(0.579685, 6);
    const linear = cohenKappa(ORDINAL_TABLE, 'linear');
    expect(linear.observed).toBeCloseTo(26 / 30, 12);
    expect(linear.expected).toBeCloseTo(546 / 900, 12);
    expect(linear.kappa).toBeCloseTo(0.661017, 6);
    expect(cohenKappa(ORDINAL_TABLE, 'quadratic').kappa).toBeCloseTo(0.755601, 6);
  });

  it('weighted ≥ unweighted when every disagreement is one category apart', () => {
    const plain = cohenKappa(ORDINAL_TABLE).kappa;
    expect(cohenKappa(ORDINAL_TABLE, 'linear').kappa).toBeGreaterThanOrEqual(plain);
    expect(cohenKappa(ORDINAL_TABLE, 'quadratic').kappa).toBeGreaterThanOrEqual(plain);
  });

  it('weighted kappa equals unweighted for 2 categories', () => {
    expect(cohenKappa([[20, 5], [10, 15]], 'quadratic').kappa).toBeCloseTo(0.4, 12);
  });

  it('complete disagreement gives a negative kappa, band "poor"', () => {
    expect(cohenKappa([[0, 5], [5, 0]])).toMatchObject({ kappa: -1, band: 'poor' });
  });

  it('throws on non-square, negative, empty or single-category tables', () => {
    expect(() => cohenKappa([[1, 2, 3], [4, 5, 6]])).toThrow(/square/);
    expect(() => cohenKappa([[1, -2], [3, 4]])).toThrow(AnalyticsInputError);
    expect(() => cohenKappa([[0, 0], [0, 0]])).toThrow(/no observations/);
    expect(() => cohenKappa([[7, 0], [0, 0]])).toThrow(/kappa is undefined/);
    expect(() => cohenKappa([[1]])).toThrow(/at least 2×2/);
    expect(() => cohenKappa([[1, 0], [0, 1]], JSON.parse('"cubic"'))).toThrow(/weights/);
  });

  it('property: kappa = 1 on any diagonal table (two or more categories used)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.integer({ min: 0, max: 100 }), { minLength: 2, maxLength: 6 }),
        fc.constantFrom<'none' | 'linear' | 'quadratic'>('none', 'linear', 'quadratic'),
        (diagonal, weights) => {
          fc.pre(diagonal.filter((count) => count > 0).length >= 2);
          const table = diagonal.map((count, i) => diagonal.map((_, j) => (i === j ? count : 0)));
          const result = cohenKappa(table, weights);
          return Math.abs(result.kappa - 1) < 1e-12 && result.band === 'almost perfect';
        },
      ),
    );
  });
});
