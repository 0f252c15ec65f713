import tQuantile from '@stdlib/stats-base-dists-t-quantile';
import type { DescriptiveStatistics } from '../shared/types/outcome-record';
import { assertFiniteSample } from './assert-finite-sample';
import { selectKth } from './select-kth';

/**
 * Type-7 quantile (R's default, numpy's "linear"): h = (n − 1)p,
 * Q = x₍⌊h⌋₎ + (h − ⌊h⌋)(x₍⌊h⌋+1₎ − x₍⌊h⌋₎), the same rule as simple-statistics
 * `quantileSorted`, given x₍⌊h⌋₎ already in place at index ⌊h⌋ of `work` with
 * nothing smaller after it. x₍⌊h⌋+1₎ is then the smallest value after that index.
 */
function interpolateType7(work: Float64Array, p: number): number {
  const h = (work.length - 1) * p;
  const lower = Math.floor(h);
  const fraction = h - lower;
  if (fraction === 0) return work[lower];
  let next = Number.POSITIVE_INFINITY;
  for (let i = lower + 1; i < work.length; i++) if (work[i] < next) next = work[i];
  return work[lower] + fraction * (next - work[lower]);
}

/**
 * Median, q1 and q3 by selection ({@link selectKth}) instead of a full sort: the
 * median's order statistic first, then q3's among the values after it and q1's
 * among those before it. The three ranges never overlap, so each selection leaves
 * the others' order statistics where they are.
 */
function quartilesBySelection(work: Float64Array): { median: number; q1: number; q3: number } {
  const last = work.length - 1;
  const medianIndex = Math.floor(last * 0.5);
  selectKth(work, medianIndex, 0, last);
  const q3Index = Math.floor(last * 0.75);
  if (q3Index > medianIndex) selectKth(work, q3Index, medianIndex + 1, last);
  const q1Index = Math.floor(last * 0.25);
  if (q1Index < medianIndex) selectKth(work, q1Index, 0, medianIndex - 1);
  return { median: interpolateType7(work, 0.5), q1: interpolateType7(work, 0.25), q3: interpolateType7(work, 0.75) };
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
 * - median, q1, q3 by R's default type-7 quantile (Hyndman & Fan, Am Stat 1996;50:361–365),
 *   found by selection ({@link selectKth}) in linear time instead of sorting.
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
  const work = Float64Array.from(values);
  const n = work.length;
  let min = work[0];
  let max = work[0];
  for (let i = 1; i < n; i++) {
    if (work[i] < min) min = work[i];
    else if (work[i] > max) max = work[i];
  }
  // Two-pass: a first estimate of the mean, then a corrected mean and the
  // squared deviations about it.
  const roughMean = compensatedSum(work, 0) / n;
  // Rounding can push the mean of a constant sample a hair outside [min, max].
  const mean = Math.min(max, Math.max(min, roughMean + compensatedSum(work, roughMean) / n));
  const quartiles = quartilesBySelection(work);
  if (n === 1) {
    return { n, mean, sd: null, se: null, ci95: null, ...quartiles, min, max };
  }
  let sumSquares = 0;
  let sumDeviations = 0;
  for (let i = 0; i < n; i++) {
    const deviation = work[i] - mean;
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
