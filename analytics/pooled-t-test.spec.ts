import { describe, expect, it } from 'vitest';
import { AnalyticsInputError } from './analytics-input-error';
import { pooledTTest } from './pooled-t-test';

// Source: R `sleep` dataset (Cushny & Peebles 1905, as shipped with R);
// R `t.test(extra ~ group, data = sleep, var.equal = TRUE)`: df = 18, p = 0.07919 (REFERENCES.md A3).
const GROUP_1 = [0.7, -1.6, -0.2, -1.2, -0.1, 3.4, 3.7, 0.8, 0.0, 2.0];
const GROUP_2 = [1.9, 0.8, 1.1, 0.1, -0.1, 4.4, 5.5, 1.6, 4.6, 3.4];

describe('pooledTTest', () => {
  it('matches R on the sleep data', () => {
    const result = pooledTTest(GROUP_1, GROUP_2);
    expect(result.df).toBe(18);
    expect(result.p).toBeCloseTo(0.07919, 5);
    // Equal group sizes: the pooled and Welch standard errors coincide, so t is the same −1.8608.
    expect(result.t).toBeCloseTo(-1.8608, 4);
  });

  it('throws on n < 2 and constant samples', () => {
    expect(() => pooledTTest([1], [1, 2])).toThrow(AnalyticsInputError);
    expect(() => pooledTTest([5, 5], [5, 5])).toThrow(/constant/);
  });
});
