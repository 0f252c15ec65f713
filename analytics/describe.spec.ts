import fc from 'fast-check';
import { quantile, sampleStandardDeviation } from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import nist from '../test/fixtures/nist-strd-univariate.json';
import { AnalyticsInputError } from './analytics-input-error';
import { describe as describeValues } from './describe';

function relativeError(actual: number, expected: number): number {
  return Math.abs(actual - expected) / Math.abs(expected);
}

/** NIST construction: the centre value, then 500 pairs (centre − 0.1, centre + 0.1) as given. */
function numAcc(first: number, low: number, high: number): number[] {
  const values = [first];
  for (let i = 0; i < 500; i++) values.push(low, high);
  return values;
}

describe('describe', () => {
  // Source: NIST Statistical Reference Datasets, univariate summary statistics (public domain),
  // certified mean and SD (n − 1); data copied to test/fixtures/nist-strd-univariate.json.
  describe('NIST StRD certified values', () => {
    it('Michelso: mean and SD to 9 significant digits', () => {
      const { values, certifiedMean, certifiedSd } = nist.datasets.Michelso;
      const result = describeValues(values);
      expect(result.n).toBe(100);
      expect(relativeError(result.mean, certifiedMean)).toBeLessThan(1e-9);
      expect(relativeError(result.sd ?? Number.NaN, certifiedSd)).toBeLessThan(1e-9);
    });

    it('Mavro: mean and SD to 9 significant digits', () => {
      const { values, certifiedMean, certifiedSd } = nist.datasets.Mavro;
      const result = describeValues(values);
      expect(result.n).toBe(50);
      expect(relativeError(result.mean, certifiedMean)).toBeLessThan(1e-9);
      expect(relativeError(result.sd ?? Number.NaN, certifiedSd)).toBeLessThan(1e-9);
    });

    it('NumAcc1: mean 10000002, SD 1 (to 1e-6 relative)', () => {
      const { values, certifiedMean, certifiedSd } = nist.datasets.NumAcc1;
      const result = describeValues(values);
      expect(relativeError(result.mean, certifiedMean)).toBeLessThan(1e-6);
      expect(relativeError(result.sd ?? Number.NaN, certifiedSd)).toBeLessThan(1e-6);
    });

    it('NumAcc2: 1001 values, mean 1.2, SD 0.1 (to 1e-6 relative)', () => {
      const { certifiedMean, certifiedSd } = nist.datasets.NumAcc2;
      const result = describeValues(numAcc(1.2, 1.1, 1.3));
      expect(result.n).toBe(1001);
      expect(relativeError(result.mean, certifiedMean)).toBeLessThan(1e-6);
      expect(relativeError(result.sd ?? Number.NaN, certifiedSd)).toBeLessThan(1e-6);
    });

    it('NumAcc3: 1001 values, mean 1000000.2, SD 0.1 (to 1e-6 relative; defeats the naive formula)', () => {
      const { certifiedMean, certifiedSd } = nist.datasets.NumAcc3;
      const result = describeValues(numAcc(1000000.2, 1000000.1, 1000000.3));
      expect(relativeError(result.mean, certifiedMean)).toBeLessThan(1e-6);
      expect(relativeError(result.sd ?? Number.NaN, certifiedSd)).toBeLessThan(1e-6);
    });
  });

  it('gives SE, t-based CI and type-7 quartiles for 1, 2, 3, 4', () => {
    // Computed (hand calculation): mean 2.5; SD √(5/3) = 1.290994; SE = 1.290994/2 = 0.645497;
    // t(0.975, 3) = 3.182446 (t table, common practice) → 2.5 ± 2.054260 = [0.445740, 4.554260].
    // Type 7 (R's default quantile): h = 3p → q1 = 1 + 0.75·1 = 1.75, median 2.5, q3 = 3.25.
    const result = describeValues([4, 2, 1, 3]);
    expect(result.mean).toBe(2.5);
    expect(result.sd).toBeCloseTo(1.290994, 6);
    expect(result.se).toBeCloseTo(0.645497, 6);
    expect(result.ci95?.[0]).toBeCloseTo(0.44574, 5);
    expect(result.ci95?.[1]).toBeCloseTo(4.55426, 5);
    expect([result.q1, result.median, result.q3]).toEqual([1.75, 2.5, 3.25]);
    expect([result.min, result.max]).toEqual([1, 4]);
  });

  it('n = 1: no SD, SE or CI, but location statistics', () => {
    expect(describeValues([3.5])).toEqual({
      n: 1, mean: 3.5, sd: null, se: null, ci95: null, median: 3.5, q1: 3.5, q3: 3.5, min: 3.5, max: 3.5,
    });
  });

  it('identical values: SD 0 and a zero-width CI at the value', () => {
    const result = describeValues([0.5, 0.5, 0.5, 0.5, 0.5]);
    expect(result.sd).toBe(0);
    expect(result.ci95).toEqual([0.5, 0.5]);
  });

  it('accepts a Float64Array and leaves the input untouched', () => {
    const input = Float64Array.of(3, 1, 2);
    expect(describeValues(input).median).toBe(2);
    expect([...input]).toEqual([3, 1, 2]);
  });

  it('throws a clear error on empty input, NaN and infinities', () => {
    expect(() => describeValues([])).toThrow(AnalyticsInputError);
    expect(() => describeValues([])).toThrow(/at least 1 value/);
    expect(() => describeValues([1, Number.NaN])).toThrow(/values\[1\] must be a finite number/);
    expect(() => describeValues([Number.NEGATIVE_INFINITY])).toThrow(AnalyticsInputError);
  });

  describe('properties', () => {
    const sample = fc.array(fc.double({ min: -1e6, max: 1e6, noNaN: true }), { minLength: 2, maxLength: 200 });

    it('the 95% CI contains the mean; min ≤ q1 ≤ median ≤ q3 ≤ max', () => {
      fc.assert(
        fc.property(sample, (values) => {
          const r = describeValues(values);
          const [lo, hi] = r.ci95 ?? [Number.NaN, Number.NaN];
          return lo <= r.mean && r.mean <= hi && r.min <= r.q1 && r.q1 <= r.median && r.median <= r.q3 && r.q3 <= r.max;
        }),
      );
    });

    it('agrees with simple-statistics (SD and sort-based type-7 quantiles), with and without ties', () => {
      const withTies = fc.array(fc.integer({ min: 0, max: 12 }).map((steps) => steps / 2), { minLength: 1, maxLength: 2000 });
      const anyValues = fc.array(fc.double({ min: -1e6, max: 1e6, noNaN: true }), { minLength: 1, maxLength: 2000 });
      fc.assert(
        fc.property(fc.oneof(withTies, anyValues), (values) => {
          const r = describeValues(values);
          const tolerance = 1e-9 * (1 + Math.max(...values.map(Math.abs)));
          const sd = values.length > 1 ? sampleStandardDeviation(values) : null;
          return (
            (sd === null ? r.sd === null : Math.abs((r.sd ?? Number.NaN) - sd) <= tolerance) &&
            Math.abs(r.median - quantile(values, 0.5)) <= tolerance &&
            Math.abs(r.q1 - quantile(values, 0.25)) <= tolerance &&
            Math.abs(r.q3 - quantile(values, 0.75)) <= tolerance
          );
        }),
        { numRuns: 300 },
      );
    });
  });
});
