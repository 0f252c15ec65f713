import { AnalyticsInputError } from './analytics-input-error';
import { assertCount } from './assert-count';
import { wilsonInterval } from './wilson-interval';

/** A difference of two proportions with its confidence interval. */
export interface NewcombeInterval {
  /** p1 − p2. */
  readonly difference: number;
  readonly lower: number;
  readonly upper: number;
}

/**
 * Newcombe's hybrid score interval for the difference of two independent proportions,
 * method 10 of Newcombe RG, Stat Med 1998;17:873–890, built from the two Wilson score
 * intervals (l₁, u₁) for p₁ = x₁/n₁ and (l₂, u₂) for p₂ = x₂/n₂ ({@link wilsonInterval}):
 * θ̂ = p₁ − p₂;
 * L = θ̂ − √((p₁ − l₁)² + (u₂ − p₂)²), U = θ̂ + √((u₁ − p₁)² + (p₂ − l₂)²),
 * truncated to [−1, 1] against rounding.
 *
 * @param x1 successes in group 1 (integer, 0 ≤ x1 ≤ n1)
 * @param n1 trials in group 1 (integer ≥ 1)
 * @param x2 successes in group 2 (integer, 0 ≤ x2 ≤ n2)
 * @param n2 trials in group 2 (integer ≥ 1)
 * @param confidence confidence level in (0, 1); default 0.95
 * @returns { difference: p1 − p2, lower, upper }
 * @throws {AnalyticsInputError} on negative or fractional counts, n = 0, x > n, confidence outside (0, 1)
 * @example
 * newcombeDifferenceInterval(56, 70, 48, 80); // { difference: 0.2, lower: 0.0524, upper: 0.3339 } (Newcombe 1998, Table II)
 */
export function newcombeDifferenceInterval(x1: number, n1: number, x2: number, n2: number, confidence = 0.95): NewcombeInterval {
  for (const [name, value] of Object.entries({ x1, n1, x2, n2 })) assertCount(value, `newcombeDifferenceInterval: ${name}`);
  if (n1 === 0 || n2 === 0) {
    throw new AnalyticsInputError(`newcombeDifferenceInterval: n1 and n2 must be at least 1, got ${n1} and ${n2}`);
  }
  if (x1 > n1 || x2 > n2) {
    throw new AnalyticsInputError(`newcombeDifferenceInterval: successes cannot exceed trials (${x1}/${n1}, ${x2}/${n2})`);
  }
  const first = wilsonInterval(x1, n1, { confidence });
  const second = wilsonInterval(x2, n2, { confidence });
  const difference = first.p - second.p;
  const lower = difference - Math.hypot(first.p - first.lower, second.upper - second.p);
  const upper = difference + Math.hypot(first.upper - first.p, second.p - second.lower);
  return { difference, lower: Math.max(-1, lower), upper: Math.min(1, upper) };
}
