import { assertMillimetres } from './assert-millimetres';

/**
 * Rebound (coronal regrowth) at a recall (DESIGN.md §3):
 * REF→GM(post-op) − REF→GM(recall), in mm. Positive = the margin crept back
 * coronally; negative = it moved further apically than placed (possible recession).
 *
 * @param postOp REF→GM immediately after surgery, mm (0–20)
 * @param recall REF→GM at the recall, mm (0–20)
 * @returns postOp − recall, mm
 * @throws {AnalyticsInputError} when a value is NaN, infinite, negative or above 20 mm
 * @example
 * rebound(10.5, 9.5); // 1
 */
export function rebound(postOp: number, recall: number): number {
  assertMillimetres(postOp, 'rebound: post-op REF→GM');
  assertMillimetres(recall, 'rebound: recall REF→GM');
  return postOp - recall;
}
