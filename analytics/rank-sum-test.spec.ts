import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { AnalyticsInputError } from './analytics-input-error';
import { rankSumDistribution, rankSumTest } from './rank-sum-test';

/** Brute force: every way to pick which m of the m + n ranks belong to the first sample. */
function enumerateW(m: number, n: number): number[] {
  const counts = new Array<number>(m * n + 1).fill(0);
  const total = m + n;
  for (let mask = 0; mask < 1 << total; mask++) {
    let chosen = 0;
    let rankSum = 0;
    for (let bit = 0; bit < total; bit++) {
      if (mask & (1 << bit)) {
        chosen++;
        rankSum += bit + 1;
      }
    }
    if (chosen === m) counts[rankSum - (m * (m + 1)) / 2]++;
  }
  const sum = counts.reduce((a, b) => a + b, 0);
  return counts.map((count) => count / sum);
}

describe('rankSumTest', () => {
  it('sleep data (ties): W = 25.5, p = 0.06933 by the normal approximation', () => {
    // Source: R `sleep` dataset (Cushny & Peebles 1905, as shipped with R); R `wilcox.test`
    // with tie and continuity correction, as listed in REFERENCES.md A3.
    const result = rankSumTest(
      [0.7, -1.6, -0.2, -1.2, -0.1, 3.4, 3.7, 0.8, 0.0, 2.0],
      [1.9, 0.8, 1.1, 0.1, -0.1, 4.4, 5.5, 1.6, 4.6, 3.4],
    );
    expect(result.w).toBe(25.5);
    expect(result.p).toBeCloseTo(0.06933, 5);
    expect(result.method).toBe('normal');
  });

  it('small samples without ties use the exact distribution (Hollander & Wolfe example)', () => {
    // Source: Hollander M, Wolfe DA, Nonparametric Statistical Methods, 1973, p. 69, as used in
    // R's `wilcox.test` help: one-sided ("greater") W = 35, p = 0.1272, so two-sided 0.2544 (from memory).
    const x = [0.8, 0.83, 1.89, 1.04, 1.45, 1.38, 1.91, 1.64, 0.73, 1.46];
    const y = [1.15, 0.88, 0.9, 0.74, 1.21];
    const result = rankSumTest(x, y);
    expect(result.method).toBe('exact');
    expect(result.w).toBe(35);
    expect(result.p).toBeCloseTo(0.2544, 4);
  });

  it('complete separation, 3 vs 3: exact p = 2/C(6,3) = 0.1', () => {
    // Computed (hand calculation): W = 0 is 1 of C(6, 3) = 20 equally likely rank sets, two-sided 2/20.
    expect(rankSumTest([1, 2, 3], [4, 5, 6])).toEqual({ w: 0, p: 0.1, method: 'exact' });
    expect(rankSumTest([4, 5, 6], [1, 2, 3])).toEqual({ w: 9, p: 0.1, method: 'exact' });
  });

  it('n = 1 against n = 1: W is 0 or 1, p = 1', () => {
    expect(rankSumTest([1], [2])).toEqual({ w: 0, p: 1, method: 'exact' });
  });

  it('all values tied: no evidence of a difference, p = 1', () => {
    expect(rankSumTest([2, 2, 2], [2, 2])).toEqual({ w: 3, p: 1, method: 'normal' });
  });

  it('50 or more values switch to the normal approximation, as R', () => {
    const a = Array.from({ length: 50 }, (_, i) => i);
    const b = Array.from({ length: 5 }, (_, i) => 100 + i);
    expect(rankSumTest(a, b).method).toBe('normal');
  });

  it('exact distribution equals brute-force enumeration (computed)', () => {
    for (const [m, n] of [[1, 1], [2, 3], [4, 4], [5, 3], [3, 7]]) {
      const exact = rankSumDistribution(m, n);
      const brute = enumerateW(m, n);
      expect(exact.length).toBe(brute.length);
      brute.forEach((probability, w) => expect(exact[w]).toBeCloseTo(probability, 14));
    }
  });

  it('throws on empty samples and NaN', () => {
    expect(() => rankSumTest([], [1])).toThrow(AnalyticsInputError);
    expect(() => rankSumTest([1], [Number.NaN])).toThrow(/finite number/);
  });

  it('property: p in [0, 1] and symmetric under swapping the samples', () => {
    const sample = fc.array(fc.integer({ min: 0, max: 20 }), { minLength: 1, maxLength: 15 });
    fc.assert(
      fc.property(sample, sample, (a, b) => {
        const forward = rankSumTest(a, b);
        const backward = rankSumTest(b, a);
        return (
          forward.p >= 0 && forward.p <= 1 &&
          Math.abs(forward.p - backward.p) < 1e-12 &&
          forward.w + backward.w === a.length * b.length
        );
      }),
    );
  });
});
