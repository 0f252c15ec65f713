import tQuantile from '@stdlib/stats-base-dists-t-quantile';
import type { DescriptiveStatistics } from '../shared/types/outcome-record';
import { assertFiniteSample } from './assert-finite-sample';

/**
 * Type-7 quantile of an ascending array (R's default, numpy's "linear"):
 * h = (n − 1)p, Q = x[⌊h⌋] + (h − ⌊h⌋)(x[⌊h⌋ + 1] − x[⌊h⌋]).
 * Same rule as simple-statistics `quantileSorted`, written for a Float64Array.
 */
function quantileOfSorted(sorted: Float64Array, p: number): number {
  const h = (sorted.length - 1) * p;
  const lower = Math.floor(h);
  const upper = Math.ceil(h);
  return sorted[lower] + (h - lower) * (sorted[upper] - sorted[lower]);
}

/**
 * Neumaier-compensated sum (Neumaier 1974), as simple-statistics `sum` does,
 * so that large offsets (NIST NumAcc3) lose no digits.
 */
function compensatedSum(values: Float64Array, shift: number): number {
  let sum = 0;
  let correction = 0;
  for (let i = 0; i < values.length; i++) {
    const term = values[i] - shift;
    const next = sum + term;
    correction += Math.abs(sum) >= Math.abs(term) ? sum - next + term : term - next + sum;
    sum = next;
  }
  return sum + correction;
}

/**
 * Descriptive statistics of a sample.
 *
 * - mean x̄ = Σx / n; sample SD s = √(Σ(x − x̄)² / (n − 1)) by the two-pass
 *   algorithm with compensated sums (Chan, Golub & LeVeque, Am Stat 1983;37:242–247),
 *   which passes the NIST StRD univariate tests (NumAcc1–3) where the one-pass
 *   sum-of-squares formula fails;
 * - se = s / √n; 95% CI = x̄ ± t(0.975, n − 1)·se, t quantile from @stdlib;
 * - median, q1, q3 by R's default type-7 quantile (Hyndman & Fan, Am Stat 1996;50:361–365).
 *
 * Works on a copy, so the caller's array is left untouched. With n = 1, sd, se and
 * ci95 are null (no spread can be estimated from one value).
 *
 * @param values sample of finite numbers (array or Float64Array)
 * @returns { n, mean, sd, se, ci95, median, q1, q3, min, max }
 * @throws {AnalyticsInputError} when the sample is empty or holds NaN / ±Infinity
 * @example
 * describe([1, 2, 3, 4]); // mean 2.5, sd 1.290994, median 2.5, q1 1.75, q3 3.25
 */
export function describe(values: ArrayLike<number>): DescriptiveStatistics {
  assertFiniteSample(values, 'describe: values');
  const sorted = Float64Array.from(values).sort();
  const n = sorted.length;
  // Two-pass: a first estimate of the mean, then a corrected mean and the
  // squared deviations about it.
  const roughMean = compensatedSum(sorted, 0) / n;
  const min = sorted[0];
  const max = sorted[n - 1];
  // Rounding can push the mean of a constant sample a hair outside [min, max].
  const mean = Math.min(max, Math.max(min, roughMean + compensatedSum(sorted, roughMean) / n));
  const quartiles = {
    median: quantileOfSorted(sorted, 0.5),
    q1: quantileOfSorted(sorted, 0.25),
    q3: quantileOfSorted(sorted, 0.75),
  };
  if (n === 1) {
    return { n, mean, sd: null, se: null, ci95: null, ...quartiles, min, max };
  }
  let sumSquares = 0;
  let sumDeviations = 0;
  for (let i = 0; i < n; i++) {
    const deviation = sorted[i] - mean;
    sumSquares += deviation * deviation;
    sumDeviations += deviation;
  }
  // Corrected two-pass formula (Chan et al. 1983, eq. 1.7): removes the rounding
  // error left in the mean.
  const variance = Math.max(0, (sumSquares - (sumDeviations * sumDeviations) / n) / (n - 1));
  const sd = Math.sqrt(variance);
  const se = sd / Math.sqrt(n);
  const halfWidth = tQuantile(0.975, n - 1) * se;
  const ci95: readonly [number, number] = [mean - halfWidth, mean + halfWidth];
  return { n, mean, sd, se, ci95, ...quartiles, min, max };
}
