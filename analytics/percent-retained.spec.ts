import { describe, expect, it } from 'vitest';
import { AnalyticsInputError } from './analytics-input-error';
import { percentRetained } from './percent-retained';

// Source: DESIGN.md §3 conventions (common practice): % retained = retained / crown gain × 100,
// undefined when the gain is 0.
describe('percentRetained', () => {
  it('is retained gain over crown gain, in percent', () => {
    // Computed (hand calculation): gain 10 − 8 = 2, retained 9.5 − 8 = 1.5 → 75%.
    expect(percentRetained(8, 10, 9.5)).toBe(75);
    expect(percentRetained(8, 10, 10)).toBe(100);
    expect(percentRetained(8, 10, 8)).toBe(0);
  });

  it('returns null when the crown gain is 0', () => {
    expect(percentRetained(8, 8, 9)).toBeNull();
  });

  it('returns values outside 0–100 as they are', () => {
    expect(percentRetained(8, 10, 11)).toBe(150);
    expect(percentRetained(8, 10, 7)).toBe(-50);
  });

  it('rejects invalid measurements', () => {
    expect(() => percentRetained(8, Number.NaN, 9)).toThrow(/post-op REF→GM/);
    expect(() => percentRetained(8, 10, 21)).toThrow(AnalyticsInputError);
  });
});
