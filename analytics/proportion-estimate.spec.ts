import { describe, expect, it } from 'vitest';
import { AnalyticsInputError } from './analytics-input-error';
import { proportionEstimate } from './proportion-estimate';

describe('proportionEstimate', () => {
  it('carries the Wilson interval', () => {
    // Source: Newcombe RG, Stat Med 1998;17:857–872, Table I — 81/263: 0.2553–0.3662.
    const estimate = proportionEstimate(81, 263);
    expect(estimate.count).toBe(81);
    expect(estimate.n).toBe(263);
    expect(estimate.lower).toBeCloseTo(0.2553, 4);
    expect(estimate.upper).toBeCloseTo(0.3662, 4);
  });

  it('0 of 0 gives nulls instead of throwing', () => {
    expect(proportionEstimate(0, 0)).toEqual({ count: 0, n: 0, p: null, lower: null, upper: null });
  });

  it('still rejects impossible counts', () => {
    expect(() => proportionEstimate(3, 2)).toThrow(AnalyticsInputError);
    expect(() => proportionEstimate(1, 0)).toThrow(AnalyticsInputError);
  });
});
