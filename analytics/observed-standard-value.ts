import type { ObservedStandardValue } from '../shared/types/audit-results';
import { describe } from './describe';
import type { StandardSample } from './standard-sample';
import { wilsonInterval } from './wilson-interval';

/**
 * The observed value of a standard from its sample:
 * - a share: p = count / n as a percentage (0–100) with the Wilson 95% interval ×100
 *   ({@link wilsonInterval}; Newcombe, Stat Med 1998;17:857–872, method 3); null when n = 0;
 * - a mean: the mean of the per-patient values with its t-based 95% CI ({@link describe}),
 *   n = patients; null with fewer than 2 patients (no CI from one value).
 *
 * @param sample the standard's sample ({@link standardSample})
 * @returns { value, ci95, n, count } or null when there is too little data
 * @throws {AnalyticsInputError} on an invalid count or a non-finite value
 */
export function observedStandardValue(sample: StandardSample): ObservedStandardValue | null {
  if (sample.kind === 'share') {
    if (sample.n === 0) return null;
    const { p, lower, upper } = wilsonInterval(sample.count, sample.n);
    return { value: p * 100, ci95: [lower * 100, upper * 100], n: sample.n, count: sample.count };
  }
  if (sample.values.length < 2) return null;
  const { mean, ci95, n } = describe(sample.values);
  return ci95 === null ? null : { value: mean, ci95, n, count: null };
}
