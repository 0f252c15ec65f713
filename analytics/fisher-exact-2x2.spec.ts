import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { AnalyticsInputError } from './analytics-input-error';
import { fisherExact2x2 } from './fisher-exact-2x2';

describe('fisherExact2x2', () => {
  it("tea-tasting table [[3, 1], [1, 3]]: p = 0.4857", () => {
    // Source: Fisher RA, The Design of Experiments, 1935 (tea tasting), as in R's `fisher.test`
    // help — two-sided p = 0.4857 (from memory). Computed (hand calculation): margins 4/4/4/4,
    // P(X = 0…4) = 1, 16, 36, 16, 1 (/70); observed P(3) = 16/70; sum of P ≤ 16/70 = 34/70 = 0.485714.
    expect(fisherExact2x2([[3, 1], [1, 3]]).p).toBeCloseTo(34 / 70, 10);
    expect(fisherExact2x2([[3, 1], [1, 3]]).p).toBeCloseTo(0.4857, 4);
  });

  it('[[2, 0], [0, 2]]: p = 1/3', () => {
    // Computed (hand calculation): P(X = 0, 1, 2) = 1/6, 4/6, 1/6; observed 1/6 → p = 2/6.
    expect(fisherExact2x2([[2, 0], [0, 2]]).p).toBeCloseTo(1 / 3, 12);
  });

  it('zero events in both groups: p = 1', () => {
    expect(fisherExact2x2([[0, 10], [0, 12]]).p).toBeCloseTo(1, 12);
  });

  it('throws on negative, fractional or empty tables', () => {
    expect(() => fisherExact2x2([[-1, 2], [3, 4]])).toThrow(AnalyticsInputError);
    expect(() => fisherExact2x2([[0.5, 2], [3, 4]])).toThrow(/non-negative integer/);
    expect(() => fisherExact2x2([[0, 0], [0, 0]])).toThrow(/no observations/);
  });

  it('property: p in (0, 1] and unchanged by transposing or swapping rows', () => {
    const count = fc.integer({ min: 0, max: 30 });
    fc.assert(
      fc.property(count, count, count, count, (a, b, c, d) => {
        fc.pre(a + b + c + d > 0);
        const p = fisherExact2x2([[a, b], [c, d]]).p;
        const transposed = fisherExact2x2([[a, c], [b, d]]).p;
        const swapped = fisherExact2x2([[c, d], [a, b]]).p;
        return p > 0 && p <= 1 && Math.abs(p - transposed) < 1e-9 && Math.abs(p - swapped) < 1e-9;
      }),
    );
  });
});
