import { AnalyticsInputError } from './analytics-input-error';
import { assertArray } from './assert-array';

/** An audit standard: the observed value should be `comparator` the target. */
export interface AuditStandard {
  readonly comparator: '>=' | '<=';
  readonly target: number;
}

/** An observed value with its 95% CI (a proportion with its Wilson interval, a mean with its t CI, …). */
export interface ObservedValue {
  readonly value: number;
  readonly ci95: readonly [number, number];
}

/** Verdict of an audit standard. */
export type StandardVerdict = 'met' | 'not-met' | 'inconclusive';

/** The verdict and the numbers behind it. */
export interface StandardEvaluation {
  readonly verdict: StandardVerdict;
  readonly value: number;
  readonly ci95: readonly [number, number];
  readonly target: number;
  readonly comparator: '>=' | '<=';
}

/**
 * Evaluates an audit standard against an observed value and its 95% CI
 * (common practice for audit criteria measured with uncertainty):
 * - 'met' when the whole CI lies on the good side of the target
 *   ('>=': lower ≥ target; '<=': upper ≤ target);
 * - 'not-met' when the whole CI lies on the bad side
 *   ('>=': upper < target; '<=': lower > target);
 * - 'inconclusive' when the CI straddles the target: the sample cannot tell.
 * A CI that touches the target from the good side counts as met.
 *
 * @param standard { comparator: '>=' | '<=', target }
 * @param observed { value, ci95: [lower, upper] } with lower ≤ value ≤ upper
 * @returns { verdict, value, ci95, target, comparator }
 * @throws {AnalyticsInputError} on an unknown comparator, non-finite numbers, or a CI that does not contain the value
 * @example
 * evaluateStandard({ comparator: '>=', target: 0.8 }, { value: 0.9, ci95: [0.85, 0.94] }); // verdict 'met'
 */
export function evaluateStandard(standard: AuditStandard, observed: ObservedValue): StandardEvaluation {
  const { comparator, target } = standard ?? {};
  if (comparator !== '>=' && comparator !== '<=') {
    throw new AnalyticsInputError(`evaluateStandard: comparator must be '>=' or '<=', got ${String(comparator)}`);
  }
  if (typeof target !== 'number' || !Number.isFinite(target)) {
    throw new AnalyticsInputError(`evaluateStandard: target must be a finite number, got ${String(target)}`);
  }
  const { value, ci95 } = observed ?? {};
  assertArray(ci95, 'evaluateStandard: observed.ci95');
  if (ci95.length !== 2) {
    throw new AnalyticsInputError('evaluateStandard: observed.ci95 must be [lower, upper]');
  }
  const [lower, upper] = ci95;
  if (![value, lower, upper].every((x) => typeof x === 'number' && Number.isFinite(x))) {
    throw new AnalyticsInputError('evaluateStandard: observed value and CI must be finite numbers');
  }
  if (!(lower <= value && value <= upper)) {
    throw new AnalyticsInputError(`evaluateStandard: CI [${lower}, ${upper}] must contain the value ${value}`);
  }
  const isGoodSide = comparator === '>=' ? lower >= target : upper <= target;
  const isBadSide = comparator === '>=' ? upper < target : lower > target;
  const verdict: StandardVerdict = isGoodSide ? 'met' : isBadSide ? 'not-met' : 'inconclusive';
  return { verdict, value, ci95: [lower, upper], target, comparator };
}
