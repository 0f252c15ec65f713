import { describe, expect, it } from 'vitest';
import { AnalyticsInputError } from './analytics-input-error';
import { welchTTest } from './welch-t-test';

// Source: R `sleep` dataset (Cushny & Peebles 1905, as shipped with R);
// R `t.test(extra ~ group, data = sleep)` as listed in REFERENCES.md A3.
const GROUP_1 = [0.7, -1.6, -0.2, -1.2, -0.1, 3.4, 3.7, 0.8, 0.0, 2.0];
const GROUP_2 = [1.9, 0.8, 1.1, 0.1, -0.1, 4.4, 5.5, 1.6, 4.6, 3.4];

describe('welchTTest', () => {
  it('matches R on the sleep data: t, df, p and the CI of the difference', () => {
    const result = welchTTest(GROUP_1, GROUP_2);
    expect(result.t).toBeCloseTo(-1.8608, 4);
    expect(result.df).toBeCloseTo(17.776, 3);
    expect(result.p).toBeCloseTo(0.07939, 5);
    expect(result.difference).toBeCloseTo(-1.58, 12);
    expect(result.ci95[0]).toBeCloseTo(-3.3654832, 7);
    expect(result.ci95[1]).toBeCloseTo(0.2054832, 7);
  });

  it('is antisymmetric in its arguments', () => {
    const forward = welchTTest(GROUP_1, GROUP_2);
    const backward = welchTTest(GROUP_2, GROUP_1);
    expect(backward.t).toBeCloseTo(-forward.t, 12);
    expect(backward.p).toBeCloseTo(forward.p, 12);
    expect(backward.ci95[0]).toBeCloseTo(-forward.ci95[1], 12);
  });

  it('identical samples: t = 0, p = 1', () => {
    const result = welchTTest([1, 2, 3], [1, 2, 3]);
    expect(result.t).toBe(0);
    expect(result.p).toBeCloseTo(1, 12);
  });

  it('throws on n < 2, NaN and constant samples', () => {
    expect(() => welchTTest([1], [1, 2])).toThrow(/at least 2 values/);
    expect(() => welchTTest([1, Number.NaN], [1, 2])).toThrow(AnalyticsInputError);
    expect(() => welchTTest([2, 2], [3, 3])).toThrow(/both samples are constant/);
  });
});
