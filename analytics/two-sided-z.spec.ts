import { describe, expect, it } from 'vitest';
import { AnalyticsInputError } from './analytics-input-error';
import { twoSidedZ } from './two-sided-z';

describe('twoSidedZ', () => {
  it('gives the usual critical values', () => {
    // Source: standard normal table — 1.960 (95%), 2.576 (99%), 3.090 (99.8%) (common practice;
    // 3.090 also in Spiegelhalter DJ, Stat Med 2005;24:1185–1202).
    expect(twoSidedZ(0.95)).toBeCloseTo(1.959964, 6);
    expect(twoSidedZ(0.99)).toBeCloseTo(2.575829, 6);
    expect(twoSidedZ(0.998)).toBeCloseTo(3.090232, 6);
  });

  it('rejects confidence outside (0, 1)', () => {
    expect(() => twoSidedZ(95)).toThrow(AnalyticsInputError);
  });
});
