import { assertMillimetres } from './assert-millimetres';

/**
 * Crown gain (DESIGN.md §3): REF→GM(immediately post-op) − REF→GM(baseline), in mm.
 * REF→GM grows when tissue is removed, so a successful crown lengthening gives a
 * positive gain. Convention: common practice (the trade's definition, DESIGN.md §3).
 *
 * @param baseline REF→GM before surgery, mm (0–20)
 * @param postOp REF→GM immediately after surgery, mm (0–20)
 * @returns postOp − baseline, mm
 * @throws {AnalyticsInputError} when a value is NaN, infinite, negative or above 20 mm
 * @example
 * crownGain(8, 10.5); // 2.5
 */
export function crownGain(baseline: number, postOp: number): number {
  assertMillimetres(baseline, 'crownGain: baseline REF→GM');
  assertMillimetres(postOp, 'crownGain: post-op REF→GM');
  return postOp - baseline;
}
