import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { AnalyticsInputError } from './analytics-input-error';
import { funnelLimits } from './funnel-limits';

describe('funnelLimits', () => {
  // Source: Spiegelhalter DJ, Stat Med 2005;24:1185–1202, normal approximation θ₀ ± z√(θ₀(1 − θ₀)/n),
  // truncated to [0, 1]; values computed for θ₀ = 0.10 as listed in REFERENCES.md A6.
  it.each([
    { n: 50, low998: 0, low95: 0.0168, high95: 0.1832, high998: 0.2311 },
    { n: 100, low998: 0.0073, low95: 0.0412, high95: 0.1588, high998: 0.1927 },
  ])('normal limits for θ₀ = 0.10, n = $n', ({ n, low998, low95, high95, high998 }) => {
    const limits95 = funnelLimits(0.1, n, 0.95);
    const limits998 = funnelLimits(0.1, n, 0.998);
    expect(limits998.lower).toBeCloseTo(low998, 4);
    expect(limits95.lower).toBeCloseTo(low95, 4);
    expect(limits95.upper).toBeCloseTo(high95, 4);
    expect(limits998.upper).toBeCloseTo(high998, 4);
  });

  it('exact binomial limits converge to the normal ones for large n', () => {
    // Source: Spiegelhalter 2005 — the exact limits approach the normal approximation as n grows.
    for (const confidence of [0.95, 0.998]) {
      const normal = funnelLimits(0.1, 100_000, confidence);
      const exact = funnelLimits(0.1, 100_000, confidence, { method: 'exact' });
      expect(Math.abs(exact.lower - normal.lower)).toBeLessThan(2e-5);
      expect(Math.abs(exact.upper - normal.upper)).toBeLessThan(2e-5);
    }
    const gapAt = (n: number): number => {
      const exact = funnelLimits(0.1, n, 0.998, { method: 'exact' });
      return Math.abs(exact.upper - funnelLimits(0.1, n, 0.998).upper);
    };
    expect(gapAt(10_000)).toBeLessThan(gapAt(100));
  });

  it('exact limits interpolate between binomial quantiles', () => {
    // Computed (hand calculation of the interpolation rule): for θ₀ = 0.5, n = 2 the CDF is
    // 0.25, 0.75, 1; at tail 0.975 the quantile is r = 2, α = (1 − 0.975)/(1 − 0.75) = 0.1,
    // limit = (2 − 0.1)/2 = 0.95; at tail 0.025, r = 0, α = (0.25 − 0.025)/0.25 = 0.9 → −0.45 → 0.
    expect(funnelLimits(0.5, 2, 0.95, { method: 'exact' })).toEqual({ lower: 0, upper: expect.closeTo(0.95, 12) });
  });

  it('exact limits are skewed upward for a small θ₀ and small n, as the binomial is', () => {
    const normal = funnelLimits(0.1, 50, 0.998);
    const exact = funnelLimits(0.1, 50, 0.998, { method: 'exact' });
    expect(exact.upper).toBeGreaterThan(normal.upper);
  });

  it('θ₀ = 0 and 1 give degenerate limits inside [0, 1]', () => {
    expect(funnelLimits(0, 30, 0.95)).toEqual({ lower: 0, upper: 0 });
    expect(funnelLimits(0, 30, 0.95, { method: 'exact' })).toEqual({ lower: 0, upper: 0 });
    expect(funnelLimits(1, 30, 0.95)).toEqual({ lower: 1, upper: 1 });
  });

  it('throws on bad θ₀, n, confidence or method', () => {
    expect(() => funnelLimits(1.2, 50, 0.95)).toThrow(/theta0/);
    expect(() => funnelLimits(0.1, 0, 0.95)).toThrow(/positive number/);
    expect(() => funnelLimits(0.1, 10.5, 0.95, { method: 'exact' })).toThrow(/integer/);
    expect(() => funnelLimits(0.1, 50, 95)).toThrow(AnalyticsInputError);
    expect(() => funnelLimits(0.1, 50, 0.95, JSON.parse('{"method":"bayes"}'))).toThrow(/method/);
  });

  it('property: 0 ≤ lower ≤ θ₀ ≤ upper ≤ 1, both methods', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.001, max: 0.999, noNaN: true }),
        fc.integer({ min: 1, max: 5000 }),
        fc.constantFrom(0.95, 0.998),
        fc.constantFrom<'normal' | 'exact'>('normal', 'exact'),
        (theta0, n, confidence, method) => {
          const { lower, upper } = funnelLimits(theta0, n, confidence, { method });
          return lower >= 0 && lower <= theta0 + 1e-12 && theta0 <= upper + 1e-12 && upper <= 1;
        },
      ),
    );
  });
});
