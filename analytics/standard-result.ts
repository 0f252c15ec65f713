import type { StandardView } from '../shared/schemas/standard';
import type { AuditDataset } from '../shared/types/audit-dataset';
import type { StandardResult } from '../shared/types/audit-results';
import { STANDARD_METRIC_INFO } from '../shared/types/standard-metrics';
import { AnalyticsInputError } from './analytics-input-error';
import { evaluateStandard } from './evaluate-standard';
import { observedStandardValue } from './observed-standard-value';
import { standardSample } from './standard-sample';

/**
 * An audit standard's result (REFERENCES.md §C: a criterion with a target, measured):
 * the metric computed as STANDARD_METRIC_INFO[metric].explanation says ({@link standardSample}),
 * its observed value with 95% CI ({@link observedStandardValue}: shares in % with Wilson
 * limits ×100, means of per-patient means with t limits), and the verdict of
 * {@link evaluateStandard} (met / not met / inconclusive when the CI straddles the target).
 * 'no-data' when the denominator is 0, or fewer than 2 patients for a mean.
 *
 * @param standard the standard (metric, parameters, comparator, target in the metric's unit)
 * @param dataset the audit dataset
 * @returns { standard, unit, observed, verdict }
 * @throws {AnalyticsInputError} on an unknown metric, a missing parameter, an unknown interval key,
 *   an invalid comparator or target, or an implausible row
 * @example
 * standardResult({ metric: 'mean-rebound', intervalKey: '6m', comparator: '<=', target: 1, … }, dataset);
 * // { unit: 'mm', observed: { value: 0.8, ci95: [0.6, 1.0], n: 40, count: null }, verdict: 'met', … }
 */
export function standardResult(standard: StandardView, dataset: AuditDataset): StandardResult {
  const sample = standardSample(standard, dataset, 'standardResult');
  const { comparator, target } = standard;
  if (comparator !== '>=' && comparator !== '<=') {
    throw new AnalyticsInputError(`standardResult: comparator must be '>=' or '<=', got ${String(comparator)}`);
  }
  if (typeof target !== 'number' || !Number.isFinite(target)) {
    throw new AnalyticsInputError(`standardResult: target must be a finite number, got ${String(target)}`);
  }
  const unit = STANDARD_METRIC_INFO[standard.metric].unit;
  const observed = observedStandardValue(sample);
  if (observed === null) return { standard, unit, observed: null, verdict: 'no-data' };
  return { standard, unit, observed, verdict: evaluateStandard({ comparator, target }, observed).verdict };
}
