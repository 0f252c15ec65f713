import type { StandardView } from '../shared/schemas/standard';
import type { AuditDataset } from '../shared/types/audit-dataset';
import type { StandardComparison } from '../shared/types/audit-results';
import { fisherExact2x2 } from './fisher-exact-2x2';
import { newcombeDifferenceInterval } from './newcombe-difference-interval';
import { standardResult } from './standard-result';
import { standardSample } from './standard-sample';
import { welchTTest } from './welch-t-test';

/** p below this is reported as beyond chance (the usual two-sided 5% level). */
const ALPHA = 0.05;

/**
 * One standard compared between two audit cycles (REFERENCES.md §C: re-audit closes the
 * loop). Both observed values and verdicts come from {@link standardResult}; the
 * difference is second − first with its 95% CI:
 * - shares (in percentage points): p₂ − p₁ with Newcombe's hybrid score interval
 *   ({@link newcombeDifferenceInterval}; Newcombe, Stat Med 1998;17:873–890, method 10),
 *   tested with Fisher's exact test ({@link fisherExact2x2}) on [[x₂, n₂ − x₂], [x₁, n₁ − x₁]];
 * - means: Welch's t-test on the per-patient values ({@link welchTTest}(second, first)),
 *   whose difference and CI are mean₂ − mean₁. When both cycles' per-patient values are
 *   constant the t statistic is undefined: the difference is given, with CI, test and p null.
 * isBeyondChance = p < 0.05. Everything but the observed values and verdicts is null when
 * either cycle has no data.
 *
 * @param standard the standard (as it stood in the first cycle)
 * @param first the first cycle's dataset
 * @param second the re-audit's dataset
 * @returns the {@link StandardComparison}
 * @throws {AnalyticsInputError} as {@link standardResult} does
 */
export function compareStandard(standard: StandardView, first: AuditDataset, second: AuditDataset): StandardComparison {
  const firstResult = standardResult(standard, first);
  const secondResult = standardResult(standard, second);
  const comparison = {
    criterion: standard.criterion,
    metric: standard.metric,
    unit: firstResult.unit,
    first: firstResult.observed,
    second: secondResult.observed,
    firstVerdict: firstResult.verdict,
    secondVerdict: secondResult.verdict,
  };
  const none = { difference: null, ci95: null, test: null, p: null, isBeyondChance: null };
  if (firstResult.observed === null || secondResult.observed === null) return { ...comparison, ...none };

  const firstSample = standardSample(standard, first, 'compareStandard');
  const secondSample = standardSample(standard, second, 'compareStandard');
  if (firstSample.kind === 'share' && secondSample.kind === 'share') {
    const { difference, lower, upper } = newcombeDifferenceInterval(secondSample.count, secondSample.n, firstSample.count, firstSample.n);
    const { p } = fisherExact2x2([
      [secondSample.count, secondSample.n - secondSample.count],
      [firstSample.count, firstSample.n - firstSample.count],
    ]);
    return { ...comparison, difference: difference * 100, ci95: [lower * 100, upper * 100], test: 'fisher-exact', p, isBeyondChance: p < ALPHA };
  }
  if (firstSample.kind === 'mean' && secondSample.kind === 'mean') {
    if (isConstant(firstSample.values) && isConstant(secondSample.values)) {
      return { ...comparison, ...none, difference: secondResult.observed.value - firstResult.observed.value };
    }
    const { difference, ci95, p } = welchTTest(secondSample.values, firstSample.values);
    return { ...comparison, difference, ci95, test: 'welch-t', p, isBeyondChance: p < ALPHA };
  }
  // Unreachable: one standard always yields the same kind of sample from both datasets.
  return { ...comparison, ...none };
}

function isConstant(values: readonly number[]): boolean {
  return values.every((value) => value === values[0]);
}
