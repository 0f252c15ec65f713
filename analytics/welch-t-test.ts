import tCdf from '@stdlib/stats-base-dists-t-cdf';
import tQuantile from '@stdlib/stats-base-dists-t-quantile';
import { mean, sampleVariance } from 'simple-statistics';
import { AnalyticsInputError } from './analytics-input-error';
import { assertFiniteSample } from './assert-finite-sample';

/** Result of a two-sample t-test (two-sided). */
export interface TTestResult {
  readonly t: number;
  readonly df: number;
  readonly p: number;
  /** mean(a) − mean(b). */
  readonly difference: number;
  /** 95% CI of the difference. */
  readonly ci95: readonly [number, number];
}

/**
 * Welch's two-sample t-test, unequal variances (Welch BL, Biometrika 1947;34:28–35),
 * as R's `t.test(a, b)`:
 * t = (x̄a − x̄b) / √(sa²/na + sb²/nb);
 * df = (sa²/na + sb²/nb)² / ((sa²/na)²/(na − 1) + (sb²/nb)²/(nb − 1)) (Welch–Satterthwaite);
 * p = 2·F_t(−|t|; df); 95% CI = difference ± t(0.975, df)·SE.
 * Means and variances from simple-statistics, t CDF and quantile from @stdlib.
 *
 * @param a first sample (≥ 2 finite values)
 * @param b second sample (≥ 2 finite values)
 * @returns { t, df, p, difference, ci95 } with difference = mean(a) − mean(b)
 * @throws {AnalyticsInputError} when a sample has fewer than 2 values, holds NaN, or both samples are constant
 * @example
 * welchTTest([0.7, -1.6, ...], [1.9, 0.8, ...]); // R sleep data: t −1.8608, df 17.776, p 0.07939
 */
export function welchTTest(a: readonly number[], b: readonly number[]): TTestResult {
  assertFiniteSample(a, 'welchTTest: a', 2);
  assertFiniteSample(b, 'welchTTest: b', 2);
  const sampleA = [...a];
  const sampleB = [...b];
  const varianceOfMeanA = sampleVariance(sampleA) / a.length;
  const varianceOfMeanB = sampleVariance(sampleB) / b.length;
  const se = Math.sqrt(varianceOfMeanA + varianceOfMeanB);
  if (se === 0) {
    throw new AnalyticsInputError('welchTTest: both samples are constant, so the t statistic is undefined');
  }
  const difference = mean(sampleA) - mean(sampleB);
  const t = difference / se;
  const df =
    (varianceOfMeanA + varianceOfMeanB) ** 2 /
    (varianceOfMeanA ** 2 / (a.length - 1) + varianceOfMeanB ** 2 / (b.length - 1));
  const p = Math.min(1, 2 * tCdf(-Math.abs(t), df));
  const halfWidth = tQuantile(0.975, df) * se;
  return { t, df, p, difference, ci95: [difference - halfWidth, difference + halfWidth] };
}
