import { describe, expect, it } from 'vitest';
import { AnalyticsInputError } from './analytics-input-error';
import { assertCount } from './assert-count';

describe('assertCount', () => {
  it('accepts non-negative integers', () => {
    expect(() => assertCount(0, 'n')).not.toThrow();
    expect(() => assertCount(42, 'n')).not.toThrow();
  });

  it('rejects negative, fractional and non-finite counts', () => {
    for (const value of [-1, 1.5, Number.NaN, Number.POSITIVE_INFINITY]) {
      expect(() => assertCount(value, 'n')).toThrow(AnalyticsInputError);
    }
    expect(() => assertCount(-1, 'successes')).toThrow(/successes must be a non-negative integer, got -1/);
  });
});
