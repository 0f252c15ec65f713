import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { AnalyticsInputError } from './analytics-input-error';
import { wilsonInterval } from './wilson-interval';

describe('wilsonInterval', () => {
  // Source: Newcombe RG, Stat Med 1998;17:857–872, Table I (methods 3 and 4), to 4 decimals.
  it.each([
    { r: 81, n: 263, lower: 0.2553, upper: 0.3662, lowerCc: 0.2535, upperCc: 0.3682 },
    { r: 15, n: 148, lower: 0.0624, upper: 0.1605, lowerCc: 0.0598, upperCc: 0.1644 },
  ])('$r/$n matches Newcombe 1998 Table I', ({ r, n, lower, upper, lowerCc, upperCc }) => {
    const plain = wilsonInterval(r, n);
    expect(plain.p).toBeCloseTo(r / n, 12);
    expect(plain.lower).toBeCloseTo(lower, 4);
    expect(plain.upper).toBeCloseTo(upper, 4);
    const corrected = wilsonInterval(r, n, { continuityCorrection: true });
    expect(corrected.lower).toBeCloseTo(lowerCc, 4);
    expect(corrected.upper).toBeCloseTo(upperCc, 4);
  });

  it('zero successes: lower bound exactly 0', () => {
    // Computed (hand calculation): r = 0, n = 10, z = 1.959964 → upper = z²/(n + z²) = 3.841459/13.841459 = 0.277533.
    const result = wilsonInterval(0, 10);
    expect(result).toMatchObject({ p: 0, lower: 0 });
    expect(result.upper).toBeCloseTo(0.277533, 6);
    expect(wilsonInterval(0, 10, { continuityCorrection: true }).lower).toBe(0);
  });

  it('all successes: upper bound exactly 1, mirror of zero successes', () => {
    const result = wilsonInterval(10, 10);
    expect(result).toMatchObject({ p: 1, upper: 1 });
    expect(result.lower).toBeCloseTo(1 - 0.277533, 6);
    expect(wilsonInterval(10, 10, { continuityCorrection: true }).upper).toBe(1);
  });

  it('n = 1 gives a valid, wide interval', () => {
    const { lower, upper } = wilsonInterval(1, 1);
    expect(upper).toBe(1);
    expect(lower).toBeGreaterThan(0);
    expect(lower).toBeLessThan(0.3);
  });

  it('a higher confidence widens the interval', () => {
    const narrow = wilsonInterval(30, 100, { confidence: 0.9 });
    const wide = wilsonInterval(30, 100, { confidence: 0.99 });
    expect(wide.lower).toBeLessThan(narrow.lower);
    expect(wide.upper).toBeGreaterThan(narrow.upper);
  });

  it('throws on bad counts and confidence', () => {
    expect(() => wilsonInterval(-1, 10)).toThrow(AnalyticsInputError);
    expect(() => wilsonInterval(1.5, 10)).toThrow(/non-negative integer/);
    expect(() => wilsonInterval(11, 10)).toThrow(/cannot exceed n/);
    expect(() => wilsonInterval(0, 0)).toThrow(/at least 1/);
    expect(() => wilsonInterval(Number.NaN, 10)).toThrow(AnalyticsInputError);
    expect(() => wilsonInterval(1, 10, { confidence: 95 })).toThrow(/between 0 and 1/);
  });

  it('property: bounds lie within [0, 1] and contain p, with or without correction', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 5000 }).chain((n) => fc.tuple(fc.integer({ min: 0, max: n }), fc.constant(n))),
        fc.boolean(),
        ([r, n], continuityCorrection) => {
          const { p, lower, upper } = wilsonInterval(r, n, { continuityCorrection });
          return lower >= 0 && upper <= 1 && lower <= p && p <= upper;
        },
      ),
    );
  });
});
