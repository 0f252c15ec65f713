import { describe, expect, it } from 'vitest';
import { AnalyticsInputError } from './analytics-input-error';
import { assertArray } from './assert-array';

describe('assertArray', () => {
  it('accepts arrays, empty or not', () => {
    expect(() => assertArray([], 'x')).not.toThrow();
    expect(() => assertArray([1, 2], 'x')).not.toThrow();
  });

  it('rejects anything else with the label in the message', () => {
    for (const value of [null, undefined, 'abc', 3, { length: 1 }]) {
      expect(() => assertArray(value, 'samples')).toThrow(AnalyticsInputError);
    }
    expect(() => assertArray(null, 'samples')).toThrow(/samples must be an array/);
  });
});
