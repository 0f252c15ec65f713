import { describe, expect, it } from 'vitest';
import { AnalyticsInputError } from './analytics-input-error';
import { rebound } from './rebound';

// Source: DESIGN.md §3 conventions (common practice): rebound = REF→GM(post-op) − REF→GM(recall),
// positive when the margin crept back coronally.
describe('rebound', () => {
  it('is positive when the margin moved back coronally', () => {
    // Computed (hand calculation): post-op 10.5, recall 9.5 → 1.0 mm of coronal regrowth.
    expect(rebound(10.5, 9.5)).toBe(1);
  });

  it('is negative when the margin moved further apically (possible recession)', () => {
    expect(rebound(10, 10.5)).toBe(-0.5);
  });

  it('rejects invalid measurements', () => {
    expect(() => rebound(10, Number.NaN)).toThrow(/recall REF→GM/);
    expect(() => rebound(-0.5, 10)).toThrow(AnalyticsInputError);
    expect(() => rebound(20.5, 10)).toThrow(AnalyticsInputError);
  });
});
