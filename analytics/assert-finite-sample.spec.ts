import { describe, expect, it } from 'vitest';
import { AnalyticsInputError } from './analytics-input-error';
import { assertFiniteSample } from './assert-finite-sample';

describe('assertFiniteSample', () => {
  it('accepts finite numbers in arrays and typed arrays', () => {
    expect(() => assertFiniteSample([1, -2.5, 0], 'x')).not.toThrow();
    expect(() => assertFiniteSample(Float64Array.of(1, 2), 'x', 2)).not.toThrow();
  });

  it('rejects empty and too-short samples', () => {
    expect(() => assertFiniteSample([], 'values')).toThrow(/at least 1 value, got 0/);
    expect(() => assertFiniteSample([1], 'values', 2)).toThrow(/at least 2 values/);
  });

  it('rejects NaN, infinities and non-numbers, naming the index', () => {
    expect(() => assertFiniteSample([1, Number.NaN], 'values')).toThrow(/values\[1\] must be a finite number/);
    expect(() => assertFiniteSample([Number.POSITIVE_INFINITY], 'values')).toThrow(AnalyticsInputError);
    expect(() => assertFiniteSample(JSON.parse('[1, "2"]'), 'values')).toThrow(AnalyticsInputError);
    expect(() => assertFiniteSample(JSON.parse('null'), 'values')).toThrow(/must be an array/);
  });
});
