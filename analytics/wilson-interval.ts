import { AnalyticsInputError } from './analytics-input-error';
import { assertCount } from './assert-count';
import { twoSidedZ } from './two-sided-z';

/** Options of {@link wilsonInterval}. */
export interface WilsonIntervalOptions {
  /** Confidence level in (0, 1); default 0.95. */
  readonly confidence?: number;
  /** Apply the continuity correction (Newcombe's method 4); default false. */
  readonly continuityCorrection?: boolean;
}

/** A proportion with its Wilson score interval. */
export interface WilsonInterval {
  readonly p: number;
  readonly lower: number;
  readonly upper: number;
}

/**
 * Wilson score interval for a binomial proportion (Wilson EB, JASA 1927;22:209–212),
 * as set out by Newcombe RG, Stat Med 1998;17:857–872 (methods 3 and 4).
 *
 * With p = r/n, q = 1 − p and z = Φ⁻¹(1 − α/2):
 * - without correction: (2np + z² ± z√(z² + 4npq)) / (2(n + z²));
 * - with continuity correction:
 *   L = (2np + z² − 1 − z√(z² − 2 − 1/n + 4p(nq + 1))) / (2(n + z²)),
 *   U = (2np + z² + 1 + z√(z² + 2 − 1/n + 4p(nq − 1))) / (2(n + z²)),
 *   with L = 0 when r = 0 and U = 1 when r = n.
 * Bounds are clamped to [0, 1] against rounding.
 *
 * @param successes number of successes r (integer, 0 ≤ r ≤ n)
 * @param n number of trials (integer ≥ 1)
 * @param options confidence (default 0.95) and continuityCorrection (default false)
 * @returns { p, lower, upper }
 * @throws {AnalyticsInputError} on negative or fractional counts, r > n, n = 0, confidence outside (0, 1)
 * @example
 * wilsonInterval(81, 263); // { p: 0.3080, lower: 0.2553, upper: 0.3662 }
 */
export function wilsonInterval(
  successes: number,
  n: number,
  { confidence = 0.95, continuityCorrection = false }: WilsonIntervalOptions = {},
): WilsonInterval {
  assertCount(successes, 'wilsonInterval: successes');
  assertCount(n, 'wilsonInterval: n');
  if (n === 0) {
    throw new AnalyticsInputError('wilsonInterval: n must be at least 1 (no proportion from zero trials)');
  }
  if (successes > n) {
    throw new AnalyticsInputError(`wilsonInterval: successes (${successes}) cannot exceed n (${n})`);
  }
  const z = twoSidedZ(confidence);
  const z2 = z * z;
  const p = successes / n;
  const q = 1 - p;
  const denominator = 2 * (n + z2);
  let lower: number;
  let upper: number;
  if (continuityCorrection) {
    lower = successes === 0 ? 0 : (2 * n * p + z2 - 1 - z * Math.sqrt(z2 - 2 - 1 / n + 4 * p * (n * q + 1))) / denominator;
    upper = successes === n ? 1 : (2 * n * p + z2 + 1 + z * Math.sqrt(z2 + 2 - 1 / n + 4 * p * (n * q - 1))) / denominator;
  } else {
    const spread = z * Math.sqrt(z2 + 4 * n * p * q);
    lower = (2 * n * p + z2 - spread) / denominator;
    upper = (2 * n * p + z2 + spread) / denominator;
  }
  // Clamp to [0, 1] and make sure rounding never leaves p outside its own interval.
  return { p, lower: Math.max(0, Math.min(lower, p)), upper: Math.min(1, Math.max(upper, p)) };
}
