import type { AuditDataset } from '../shared/types/audit-dataset';
import type { ReboundHistogram } from '../shared/types/audit-results';
import { AnalyticsInputError } from './analytics-input-error';
import { assertAuditDataset } from './assert-audit-dataset';
import { intervalSiteRebounds } from './interval-site-rebounds';

/** More bins than this would be unreadable; a narrower width is refused. */
export const MAX_HISTOGRAM_BINS = 1000;
/** Floating-point slack when placing a value on a bin edge (far below probe resolution). */
const EDGE_TOLERANCE = 1e-9;

/**
 * Histogram of site rebound (post-op − recall REF→GM, DESIGN.md §3) at one interval.
 * The range runs from ⌊min⌋ to ⌈max⌉ in whole millimetres, cut into bins of
 * `binWidthMm` (one bin when all values sit on one whole millimetre); the last bin
 * may overrun ⌈max⌉ when the width does not divide the range. Bins are closed on the
 * right, (from, to], with the lowest value included in the first bin — R's `hist()`
 * default (right = TRUE, include.lowest = TRUE) — so that with 0.5 mm bins and the
 * default thresholds each bin holds one stability class (stable ≤ 0.5 mm,
 * minor ≤ 1.0 mm, relapse > 1.0 mm). No sites: no bins.
 *
 * @param dataset the audit dataset
 * @param intervalKey a key of dataset.schedule
 * @param binWidthMm bin width in mm (> 0); default 0.5, the probe's reading step
 * @returns { intervalKey, bins: { from, to, count }[] }
 * @throws {AnalyticsInputError} on an unknown interval key, a width ≤ 0 or one giving more than 1000 bins
 * @example
 * reboundHistogram(dataset, '6m'); // rebounds 0.5, 1, 1.5 → bins (0, 0.5] 1, (0.5, 1] 1, (1, 1.5] 1, (1.5, 2] 0
 */
export function reboundHistogram(dataset: AuditDataset, intervalKey: string, binWidthMm = 0.5): ReboundHistogram {
  assertAuditDataset(dataset, 'reboundHistogram');
  if (typeof binWidthMm !== 'number' || !Number.isFinite(binWidthMm) || binWidthMm <= 0) {
    throw new AnalyticsInputError(`reboundHistogram: binWidthMm must be a positive number of mm, got ${String(binWidthMm)}`);
  }
  const rebounds = intervalSiteRebounds(dataset, intervalKey, 'reboundHistogram').map((site) => site.rebound);
  if (rebounds.length === 0) return { intervalKey, bins: [] };
  const low = Math.floor(Math.min(...rebounds));
  const high = Math.ceil(Math.max(...rebounds));
  const binCount = Math.max(1, Math.ceil((high - low) / binWidthMm - EDGE_TOLERANCE));
  if (binCount > MAX_HISTOGRAM_BINS) {
    throw new AnalyticsInputError(`reboundHistogram: a ${binWidthMm} mm width gives ${binCount} bins, more than ${MAX_HISTOGRAM_BINS}`);
  }
  const counts = new Array<number>(binCount).fill(0);
  for (const value of rebounds) {
    // (from, to]: a value on an edge belongs to the bin below it; the lowest value to bin 0.
    const index = Math.ceil((value - low) / binWidthMm - EDGE_TOLERANCE) - 1;
    counts[Math.min(binCount - 1, Math.max(0, index))]++;
  }
  return {
    intervalKey,
    bins: counts.map((count, i) => ({ from: roundEdge(low + i * binWidthMm), to: roundEdge(low + (i + 1) * binWidthMm), count })),
  };
}

/** Removes binary rounding noise from an edge (0.30000000000000004 → 0.3). */
function roundEdge(edge: number): number {
  return Math.round(edge * 1e9) / 1e9;
}
