import { describe, expect, it } from 'vitest';
import { AnalyticsInputError } from './analytics-input-error';
import { retainedGain } from './retained-gain';

// Source: DESIGN.md §3 conventions (common practice): retained gain = REF→GM(recall) − REF→GM(baseline).
describe('retainedGain', () => {
  it('is recall minus baseline', () => {
    // Computed (hand calculation): 9.5 − 8 = 1.5 mm retained.
    expect(retainedGain(8, 9.5)).toBe(1.5);
    expect(retainedGain(8, 7.5)).toBe(-0.5);
  });

  it('rejects invalid measurements', () => {
    expect(() => retainedGain(Number.NaN, 9)).toThrow(/baseline REF→GM/);
    expect(() => retainedGain(8, -1)).toThrow(AnalyticsInputError);
  });
});
