import { describe, expect, it } from 'vitest';
import { AnalyticsInputError } from './analytics-input-error';
import { assertMillimetres } from './assert-millimetres';

// Source: plausible range 0–20 mm — DESIGN.md §3 (common practice).
describe('assertMillimetres', () => {
  it('accepts 0 to 20 mm inclusive', () => {
    for (const value of [0, 0.5, 9.5, 20]) expect(() => assertMillimetres(value, 'REF→GM')).not.toThrow();
  });

  it('rejects negative, above-range and non-finite values with a clear message', () => {
    for (const value of [-0.5, 20.5, Number.NaN, Number.POSITIVE_INFINITY]) {
      expect(() => assertMillimetres(value, 'REF→GM')).toThrow(AnalyticsInputError);
    }
    expect(() => assertMillimetres(-1, 'baseline REF→GM')).toThrow(/baseline REF→GM must lie between 0 and 20 mm, got -1/);
    expect(() => assertMillimetres(Number.NaN, 'baseline REF→GM')).toThrow(/finite number of millimetres/);
  });
});
