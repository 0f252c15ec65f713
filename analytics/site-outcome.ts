import type { SiteOutcome } from '../shared/types/clinical-views';
import type { StabilityThresholds } from '../shared/types/outcome-record';
import { percentRetained } from './percent-retained';
import { rebound } from './rebound';
import { retainedGain } from './retained-gain';
import { DEFAULT_STABILITY_THRESHOLDS, stabilityClass } from './stability-class';

/** REF→GM readings of one site (mm). */
export interface SiteReadings {
  baselineRefGm: number;
  postOpRefGm: number | null;
  recallRefGm: number;
}

/** Rebound below this counts as negative (floating-point slack far under probe resolution). */
const NEGATIVE_SLACK_MM = 1e-9;

/**
 * Everything the recall grid and the case page show for one site at one recall
 * (DESIGN.md §3): rebound = post-op − recall; retained gain = recall − baseline;
 * % retained = retained / crown gain × 100; stability class from the rebound; and a
 * review flag when the rebound is negative (margin further apical than placed).
 * Without a post-op reading only the retained gain can be computed.
 *
 * @param readings baseline, post-op (may be null) and recall REF→GM, mm
 * @param thresholds stability thresholds (default stable ≤ 0.5, relapse > 1.0 mm)
 * @throws {AnalyticsInputError} when a reading is not a plausible number of millimetres
 * @example
 * siteOutcome({ baselineRefGm: 8, postOpRefGm: 10, recallRefGm: 9.5 });
 * // { rebound: 0.5, retainedGain: 1.5, percentRetained: 75, stability: 'stable', isFlaggedForReview: false }
 */
export function siteOutcome(readings: SiteReadings, thresholds: StabilityThresholds = DEFAULT_STABILITY_THRESHOLDS): SiteOutcome {
  const retained = retainedGain(readings.baselineRefGm, readings.recallRefGm);
  if (readings.postOpRefGm === null) {
    return { rebound: null, retainedGain: retained, percentRetained: null, stability: null, isFlaggedForReview: false };
  }
  const reboundMm = rebound(readings.postOpRefGm, readings.recallRefGm);
  return {
    rebound: reboundMm,
    retainedGain: retained,
    percentRetained: percentRetained(readings.baselineRefGm, readings.postOpRefGm, readings.recallRefGm),
    stability: stabilityClass(reboundMm, thresholds),
    isFlaggedForReview: reboundMm < -NEGATIVE_SLACK_MM,
  };
}
