import normalCdf from '@stdlib/stats-base-dists-normal-cdf';
import { describe, expect, it } from 'vitest';
import { AnalyticsInputError } from './analytics-input-error';
import { chiSquare2x2 } from './chi-square-2x2';

/*
 * Computed (hand calculation) for [[20, 5], [10, 15]]:
 * N = 50; row totals 25, 25; column totals 30, 20; expected [[15, 10], [15, 10]]; |O − E| = 5 everywhere.
 * Without correction: X² = 25/15 + 25/10 + 25/15 + 25/10 = 8.333333.
 * With Yates: (5 − 0.5)² = 20.25 → 20.25/15·2 + 20.25/10·2 = 2.7 + 4.05 = 6.75.
 * With 1 df, X² = Z², so p = 2(1 − Φ(√X²)) — checked against the normal CDF, an independent route.
 */
describe('chiSquare2x2', () => {
  it('without continuity correction', () => {
    const result = chiSquare2x2([[20, 5], [10, 15]], { continuityCorrection: false });
    expect(result.statistic).toBeCloseTo(8.333333, 6);
    expect(result.df).toBe(1);
    expect(result.p).toBeCloseTo(2 * (1 - normalCdf(Math.sqrt(25 / 3), 0, 1)), 10);
    expect(result.p).toBeCloseTo(0.00389, 5);
    expect(result.hasSmallExpected).toBe(false);
  });

  it("with Yates' correction (the default, as R's chisq.test)", () => {
    const result = chiSquare2x2([[20, 5], [10, 15]]);
    expect(result.statistic).toBeCloseTo(6.75, 10);
    expect(result.p).toBeCloseTo(2 * (1 - normalCdf(Math.sqrt(6.75), 0, 1)), 10);
  });

  it('the correction never over-corrects: c = min(0.5, |O − E|)', () => {
    // Computed (hand calculation): [[5, 5], [5, 5]] has O = E, so X² = 0 with or without correction, p = 1.
    expect(chiSquare2x2([[5, 5], [5, 5]])).toMatchObject({ statistic: 0, p: 1 });
  });

  it('flags expected counts below 5', () => {
    expect(chiSquare2x2([[1, 3], [3, 1]]).hasSmallExpected).toBe(true);
  });

  it('throws when a margin is zero or the table is invalid', () => {
    expect(() => chiSquare2x2([[0, 5], [0, 7]])).toThrow(/expected count is 0/);
    expect(() => chiSquare2x2([[1, -5], [0, 7]])).toThrow(AnalyticsInputError);
  });
});
