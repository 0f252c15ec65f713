import normalQuantile from '@stdlib/stats-base-dists-normal-quantile';
import { assertConfidence } from './assert-confidence';

/**
 * Two-sided standard normal critical value z = Φ⁻¹(1 − (1 − confidence) / 2)
 * (1.959964 for 0.95, 3.090232 for 0.998). Φ⁻¹ from @stdlib/stats-base-dists-normal-quantile.
 *
 * @param confidence confidence level in (0, 1)
 * @returns the critical value z
 * @throws {AnalyticsInputError} when confidence is outside (0, 1)
 */
export function twoSidedZ(confidence: number): number {
  assertConfidence(confidence, 'confidence');
  return normalQuantile(1 - (1 - confidence) / 2, 0, 1);
}
