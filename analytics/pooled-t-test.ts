import tCdf from '@stdlib/stats-base-dists-t-cdf';
import tQuantile from '@stdlib/stats-base-dists-t-quantile';
import { mean, sampleVariance } from 'simple-statistics';
import { AnalyticsInputError } from './analytics-input-error';
import { assertFiniteSample } from './assert-finite-sample';
import type { TTestResult } from './welch-t-test';

/**
 * Student's two-sample t-test with pooled variance (equal variances assumed),
 * as R's `t.test(a, b, var.equal = TRUE)`:
 * sp² = ((na − 1)sa² + (nb − 1)sb²) / (na + nb − 2); SE = sp·√(1/na + 1/nb);
 * t = (x̄a − x̄b) / SE; df = na + nb − 2; p = 2·F_t(−|t|; df).
 * Prefer {@link welchTTest} unless the variances are known to be equal.
 *
 * @param a first sample (≥ 2 finite values)
 * @param b second sample (≥ 2 finite values)
 * @returns { t, df, p, difference, ci95 } with difference = mean(a) − mean(b)
 * @throws {AnalyticsInputError} when a sample has fewer than 2 values, holds NaN, or both samples are constant
 */
export function pooledTTest(a: readonly number[], b: readonly number[]): TTestResult {
  assertFiniteSample(a, 'pooledTTest: a', 2);
  assertFiniteSample(b, 'pooledTTest: b', 2);
  const sampleA = [...a];
  const sampleB = [...b];
  const df = a.length + b.length - 2;
  const pooledVariance =
    ((a.length - 1) * sampleVariance(sampleA) + (b.length - 1) * sampleVariance(sampleB)) / df;
  const se = Math.sqrt(pooledVariance * (1 / a.length + 1 / b.length));
  if (se === 0) {
    throw new AnalyticsInputError('pooledTTest: both samples are constant, so the t statistic is undefined');
  }
  const difference = mean(sampleA) - mean(sampleB);
  const t = difference / se;
  const p = Math.min(1, 2 * tCdf(-Math.abs(t), df));
  const halfWidth = tQuantile(0.975, df) * se;
  return { t, df, p, difference, ci95: [difference - halfWidth, difference + halfWidth] };
}
