import { describe, expect, it } from 'vitest';
import { AnalyticsInputError } from './analytics-input-error';
import { assertConfidence } from './assert-confidence';

describe('assertConfidence', () => {
  it('accepts levels strictly between 0 and 1', () => {
    expect(() => assertConfidence(0.95, 'c')).not.toThrow();
    expect(() => assertConfidence(0.998, 'c')).not.toThrow();
  });

  it('rejects percentages, bounds and NaN', () => {
    for (const value of [95, 0, 1, -0.5, Number.NaN]) {
      expect(() => assertConfidence(value, 'confidence')).toThrow(AnalyticsInputError);
    }
    expect(() => assertConfidence(95, 'confidence')).toThrow(/between 0 and 1/);
  });
});
