import { describe, expect, it } from 'vitest';
import { AnalyticsInputError } from './analytics-input-error';
import { assertTwoByTwo, type TwoByTwoTable } from './assert-two-by-two';

describe('assertTwoByTwo', () => {
  it('accepts a 2×2 table of counts', () => {
    expect(() => assertTwoByTwo([[1, 0], [0, 0]], 'test')).not.toThrow();
  });

  it('rejects wrong shapes, bad counts and empty tables', () => {
    const badShape: TwoByTwoTable = JSON.parse('[[1, 2, 3], [4, 5]]');
    expect(() => assertTwoByTwo(badShape, 'test')).toThrow(/must be 2×2/);
    expect(() => assertTwoByTwo([[1, -1], [0, 0]], 'test')).toThrow(/table\[0\]\[1\] must be a non-negative integer/);
    expect(() => assertTwoByTwo([[1.5, 1], [0, 0]], 'test')).toThrow(AnalyticsInputError);
    expect(() => assertTwoByTwo([[0, 0], [0, 0]], 'test')).toThrow(/no observations/);
  });
});
