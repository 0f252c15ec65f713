import type { StabilityClass, StabilityThresholds } from '../shared/types/outcome-record';
import { AnalyticsInputError } from './analytics-input-error';

/** Default thresholds (DESIGN.md §3): stable ≤ 0.5 mm, minor ≤ 1.0 mm, relapse > 1.0 mm. */
export const DEFAULT_STABILITY_THRESHOLDS: StabilityThresholds = { stable: 0.5, relapse: 1.0 };

/**
 * Rounding slack in mm: 2.6 − 2.1 is 0.5000000000000002 in floating point and must
 * still count as 0.5 mm. Far below the 0.5 mm probe resolution.
 */
export const STABILITY_TOLERANCE_MM = 1e-9;

/**
 * Stability class of a site from its rebound (DESIGN.md §3; thresholds set per audit):
 * rebound ≤ stable → 'stable'; ≤ relapse → 'minor'; > relapse → 'relapse'.
 * A negative rebound counts as 'stable' (the summary flags it separately for review).
 * Comparisons allow 1e-9 mm of floating-point slack.
 *
 * @param reboundMm rebound in mm (finite; may be negative)
 * @param thresholds { stable, relapse } in mm, 0 ≤ stable ≤ relapse; default { 0.5, 1.0 }
 * @returns 'stable' | 'minor' | 'relapse'
 * @throws {AnalyticsInputError} when rebound is not finite or the thresholds are invalid
 * @example
 * stabilityClass(0.8); // 'minor'
 */
export function stabilityClass(
  reboundMm: number,
  thresholds: StabilityThresholds = DEFAULT_STABILITY_THRESHOLDS,
): StabilityClass {
  if (typeof reboundMm !== 'number' || !Number.isFinite(reboundMm)) {
    throw new AnalyticsInputError(`stabilityClass: rebound must be a finite number of mm, got ${String(reboundMm)}`);
  }
  assertStabilityThresholds(thresholds);
  if (reboundMm <= thresholds.stable + STABILITY_TOLERANCE_MM) return 'stable';
  if (reboundMm <= thresholds.relapse + STABILITY_TOLERANCE_MM) return 'minor';
  return 'relapse';
}

/**
 * Checks stability thresholds: finite, 0 ≤ stable ≤ relapse.
 *
 * @throws {AnalyticsInputError} when they are not
 */
export function assertStabilityThresholds(thresholds: StabilityThresholds): void {
  const { stable, relapse } = thresholds ?? {};
  if (typeof stable !== 'number' || typeof relapse !== 'number' || !Number.isFinite(stable) || !Number.isFinite(relapse)) {
    throw new AnalyticsInputError('stability thresholds must be finite numbers of mm: { stable, relapse }');
  }
  if (stable < 0 || relapse < stable) {
    throw new AnalyticsInputError(`stability thresholds need 0 ≤ stable ≤ relapse, got stable ${stable}, relapse ${relapse}`);
  }
}
