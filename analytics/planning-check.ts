import { assertMillimetres } from './assert-millimetres';

/** Keratinized tissue that should remain after excision, mm (Lang NP, Löe H, J Periodontol 1972;43:623–627). */
export const MIN_REMAINING_KT_MM = 2;
/** Distance the new margin should keep from the bone crest, mm ("3 mm rule": common practice; Arora et al. 2013 discuss it). */
export const MIN_MARGIN_TO_CREST_MM = 3;

/** Planned readings of one site before surgery (mm; null when not measured). */
export interface PlannedSite {
  ktWidth: number | null;
  marginToCrest: number | null;
  plannedExcision: number | null;
}

/** One guidance warning; never a decision. */
export interface PlanningWarning {
  kind: 'keratinized-tissue' | 'crest-distance';
  /** What would remain after the planned excision, mm. */
  remaining: number;
  /** The guidance threshold it falls below, mm. */
  threshold: number;
}

/**
 * Planning check for a gingivectomy (DESIGN.md §3): after removing `plannedExcision` mm of
 * tissue, at least 2 mm of keratinized tissue should remain (KT − excision ≥ 2) and the new
 * margin should sit about 3 mm from the bone crest (margin-to-crest − excision ≥ 3);
 * otherwise a flap with osseous recontouring may be needed. Guidance thresholds only.
 *
 * @param site planned readings; a check is skipped when its inputs are missing
 * @returns the warnings that apply (empty when none)
 * @throws {AnalyticsInputError} when a reading is not a plausible number of millimetres
 * @example
 * planningCheck({ ktWidth: 4, marginToCrest: 4, plannedExcision: 2 });
 * // [{ kind: 'keratinized-tissue', remaining: 2, … }] is not returned: 4 − 2 = 2 is enough;
 * // [{ kind: 'crest-distance', remaining: 2, threshold: 3 }]
 */
export function planningCheck(site: PlannedSite): PlanningWarning[] {
  const warnings: PlanningWarning[] = [];
  if (site.plannedExcision === null) return warnings;
  assertMillimetres(site.plannedExcision, 'planned excision');
  if (site.ktWidth !== null) {
    assertMillimetres(site.ktWidth, 'keratinized tissue width');
    const remaining = site.ktWidth - site.plannedExcision;
    if (remaining < MIN_REMAINING_KT_MM) warnings.push({ kind: 'keratinized-tissue', remaining, threshold: MIN_REMAINING_KT_MM });
  }
  if (site.marginToCrest !== null) {
    assertMillimetres(site.marginToCrest, 'margin-to-crest distance');
    const remaining = site.marginToCrest - site.plannedExcision;
    if (remaining < MIN_MARGIN_TO_CREST_MM) warnings.push({ kind: 'crest-distance', remaining, threshold: MIN_MARGIN_TO_CREST_MM });
  }
  return warnings;
}
