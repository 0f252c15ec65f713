import { assertMillimetres } from './assert-millimetres';

/**
 * Retained gain at a recall (DESIGN.md §3): REF→GM(recall) − REF→GM(baseline), in mm.
 * Identity: rebound + retained gain = crown gain.
 *
 * @param baseline REF→GM before surgery, mm (0–20)
 * @param recall REF→GM at the recall, mm (0–20)
 * @returns recall − baseline, mm
 * @throws {AnalyticsInputError} when a value is NaN, infinite, negative or above 20 mm
 * @example
 * retainedGain(8, 9.5); // 1.5
 */
export function retainedGain(baseline: number, recall: number): number {
  assertMillimetres(baseline, 'retainedGain: baseline REF→GM');
  assertMillimetres(recall, 'retainedGain: recall REF→GM');
  return recall - baseline;
}
