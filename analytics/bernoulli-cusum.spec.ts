import { describe, expect, it } from 'vitest';
import { AnalyticsInputError } from './analytics-input-error';
import { bernoulliCusum } from './bernoulli-cusum';

describe('bernoulliCusum', () => {
  // Source: Steiner SH, Cook RJ, Farewell VT, Treasure T, Biostatistics 2000;1(4):441–452 (weights);
  // values computed for R_A = 2 as listed in REFERENCES.md A9.
  it.each([
    { p: 0.05, failure: 0.64436, success: -0.04879 },
    { p: 0.1, failure: 0.59784, success: -0.09531 },
    { p: 0.2, failure: 0.51083, success: -0.18232 },
  ])('weights for p = $p, R_A = 2', ({ p, failure, success }) => {
    const { weights } = bernoulliCusum([], { p, oddsRatio: 2, h: 4 });
    expect(weights.failure).toBeCloseTo(failure, 5);
    expect(weights.success).toBeCloseTo(success, 5);
  });

  it('accumulates, floors at 0, never resets, and lists every index at or above h', () => {
    // Computed (hand calculation) with p = 0.1, R_A = 2 (failure +0.597837, success −0.095310), h = 1:
    // S → 0; F → 0.597837; F → 1.195674 (signal); S → 1.100364 (signal); F → 1.698201 (signal).
    const result = bernoulliCusum([false, true, true, false, true], { p: 0.1, oddsRatio: 2, h: 1 });
    expect(result.values[0]).toBe(0);
    expect(result.values[1]).toBeCloseTo(0.597837, 6);
    expect(result.values[2]).toBeCloseTo(1.195674, 6);
    expect(result.values[3]).toBeCloseTo(1.100364, 6);
    expect(result.values[4]).toBeCloseTo(1.698201, 6);
    expect(result.signalAt).toEqual([2, 3, 4]);
  });

  it('a run of successes stays at 0; no cases gives an empty path', () => {
    expect(bernoulliCusum([false, false, false], { p: 0.05, oddsRatio: 2, h: 2 })).toMatchObject({ values: [0, 0, 0], signalAt: [] });
    expect(bernoulliCusum([], { p: 0.05, oddsRatio: 2, h: 2 })).toMatchObject({ values: [], signalAt: [] });
  });

  it('throws on invalid parameters or outcomes', () => {
    expect(() => bernoulliCusum([true], { p: 0, oddsRatio: 2, h: 1 })).toThrow(/p must lie strictly between 0 and 1/);
    expect(() => bernoulliCusum([true], { p: 0.1, oddsRatio: -2, h: 1 })).toThrow(/oddsRatio/);
    expect(() => bernoulliCusum([true], { p: 0.1, oddsRatio: 2, h: 0 })).toThrow(/h must be a positive number/);
    expect(() => bernoulliCusum(JSON.parse('[1, 0]'), { p: 0.1, oddsRatio: 2, h: 1 })).toThrow(AnalyticsInputError);
  });
});
