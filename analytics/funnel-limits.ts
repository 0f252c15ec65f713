import binomialCdf from '@stdlib/stats-base-dists-binomial-cdf';
import binomialQuantile from '@stdlib/stats-base-dists-binomial-quantile';
import { AnalyticsInputError } from './analytics-input-error';
import { assertConfidence } from './assert-confidence';
import { twoSidedZ } from './two-sided-z';

/** Options of {@link funnelLimits}. */
export interface FunnelLimitsOptions {
  /** 'normal' (default) or 'exact' binomial limits with interpolation. */
  readonly method?: 'normal' | 'exact';
}

/** Control limits of a funnel plot at one sample size. */
export interface FunnelLimits {
  readonly lower: number;
  readonly upper: number;
}

/**
 * Exact binomial limit at tail probability `tail` (Spiegelhalter DJ, Stat Med
 * 2005;24:1185–1202, Appendix A.1.1, as we recall it): r = smallest integer with
 * P(R ≤ r) ≥ tail (binomial quantile), α = (P(R ≤ r) − tail) / (P(R ≤ r) − P(R ≤ r − 1)),
 * limit = (r − α) / n. The interpolation makes the limits smooth in n instead of
 * jumping by 1/n.
 */
function exactLimit(tail: number, theta0: number, n: number): number {
  const r = binomialQuantile(tail, n, theta0);
  const atR = binomialCdf(r, n, theta0);
  const belowR = r > 0 ? binomialCdf(r - 1, n, theta0) : 0;
  const alpha = atR > belowR ? (atR - tail) / (atR - belowR) : 0;
  return (r - alpha) / n;
}

/**
 * Funnel-plot control limits for a proportion around a target θ₀
 * (Spiegelhalter DJ, Stat Med 2005;24:1185–1202):
 * - 'normal': θ₀ ± z·√(θ₀(1 − θ₀)/n), z = Φ⁻¹(1 − (1 − confidence)/2)
 *   (1.960 for 95%, 3.090 for 99.8%);
 * - 'exact': binomial quantiles with the paper's interpolation (see `exactLimit`),
 *   preferred for small n; quantile and CDF from @stdlib.
 * Both are truncated to [0, 1]. Exact limits are also kept from crossing θ₀, which the
 * interpolation can do when nθ₀ is tiny (our choice; such funnels carry no information).
 *
 * @param theta0 target proportion in [0, 1]
 * @param n sample size (> 0; a positive integer for 'exact')
 * @param confidence e.g. 0.95 or 0.998
 * @param options method: 'normal' (default) | 'exact'
 * @returns { lower, upper }
 * @throws {AnalyticsInputError} on θ₀ outside [0, 1], n ≤ 0, fractional n with 'exact', confidence outside (0, 1)
 * @example
 * funnelLimits(0.1, 100, 0.95); // { lower: 0.0412, upper: 0.1588 }
 */
export function funnelLimits(
  theta0: number,
  n: number,
  confidence: number,
  { method = 'normal' }: FunnelLimitsOptions = {},
): FunnelLimits {
  if (typeof theta0 !== 'number' || !(theta0 >= 0 && theta0 <= 1)) {
    throw new AnalyticsInputError(`funnelLimits: theta0 must lie in [0, 1], got ${String(theta0)}`);
  }
  if (typeof n !== 'number' || !Number.isFinite(n) || n <= 0) {
    throw new AnalyticsInputError(`funnelLimits: n must be a positive number, got ${String(n)}`);
  }
  assertConfidence(confidence, 'funnelLimits: confidence');
  if (method === 'exact') {
    if (!Number.isInteger(n)) {
      throw new AnalyticsInputError(`funnelLimits: n must be an integer for exact limits, got ${n}`);
    }
    const tail = (1 - confidence) / 2;
    // With a tiny expected count (e.g. n = 1, θ₀ = 0.001) the interpolation can put a
    // limit on the wrong side of θ₀; a limit is never allowed to cross the target.
    return {
      lower: clampToUnit(Math.min(theta0, exactLimit(tail, theta0, n))),
      upper: clampToUnit(Math.max(theta0, exactLimit(1 - tail, theta0, n))),
    };
  }
  if (method !== 'normal') {
    throw new AnalyticsInputError(`funnelLimits: method must be 'normal' or 'exact', got ${String(method)}`);
  }
  const halfWidth = twoSidedZ(confidence) * Math.sqrt((theta0 * (1 - theta0)) / n);
  return { lower: clampToUnit(theta0 - halfWidth), upper: clampToUnit(theta0 + halfWidth) };
}

/** Limits of a proportion are truncated to [0, 1]. */
function clampToUnit(value: number): number {
  return Math.min(1, Math.max(0, value));
}
