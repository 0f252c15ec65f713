import type { ProportionEstimate } from '../shared/types/outcome-record';
import { wilsonInterval } from './wilson-interval';

/**
 * A count out of n with its Wilson 95% interval ({@link wilsonInterval}); p and the
 * bounds are null when n = 0 so that an empty subgroup still has a row to show.
 *
 * @param count successes (integer, 0 ≤ count ≤ n)
 * @param n trials (integer ≥ 0)
 * @returns { count, n, p, lower, upper }
 * @throws {AnalyticsInputError} on negative or fractional counts, or count > n
 * @example
 * proportionEstimate(81, 263); // { count: 81, n: 263, p: 0.308, lower: 0.2553, upper: 0.3662 }
 */
export function proportionEstimate(count: number, n: number): ProportionEstimate {
  if (n === 0 && count === 0) return { count, n, p: null, lower: null, upper: null };
  const { p, lower, upper } = wilsonInterval(count, n);
  return { count, n, p, lower, upper };
}
