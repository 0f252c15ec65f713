import { assertMillimetres } from './assert-millimetres';

/**
 * Percentage of the crown gain retained at a recall (DESIGN.md §3):
 * (REF→GM(recall) − REF→GM(baseline)) / (REF→GM(post-op) − REF→GM(baseline)) × 100.
 * Undefined (null) when the crown gain is 0. Values above 100 (further apical
 * movement) and below 0 (margin back beyond baseline) are returned as they are.
 *
 * @param baseline REF→GM before surgery, mm (0–20)
 * @param postOp REF→GM immediately after surgery, mm (0–20)
 * @param recall REF→GM at the recall, mm (0–20)
 * @returns % retained, or null when the gain is 0
 * @throws {AnalyticsInputError} when a value is NaN, infinite, negative or above 20 mm
 * @example
 * percentRetained(8, 10, 9.5); // 75
 */
export function percentRetained(baseline: number, postOp: number, recall: number): number | null {
  assertMillimetres(baseline, 'percentRetained: baseline REF→GM');
  assertMillimetres(postOp, 'percentRetained: post-op REF→GM');
  assertMillimetres(recall, 'percentRetained: recall REF→GM');
  const gain = postOp - baseline;
  if (gain === 0) return null;
  return ((recall - baseline) / gain) * 100;
}
