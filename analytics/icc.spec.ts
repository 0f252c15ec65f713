import { describe, expect, it } from 'vitest';
import { AnalyticsInputError } from './analytics-input-error';
import { icc } from './icc';

// Source: Shrout PE, Fleiss JL, Psychol Bull 1979;86:420–428, Table 2 (6 targets × 4 judges):
// ICC(2,1) = 0.29 and ICC(3,1) = 0.71 (from memory).
const SHROUT_FLEISS = [
  [9, 2, 5, 8],
  [6, 1, 3, 2],
  [8, 4, 6, 8],
  [7, 1, 2, 6],
  [10, 5, 6, 9],
  [6, 2, 4, 7],
];

describe('icc', () => {
  it('Shrout & Fleiss Table 2: ICC(2,1) = 0.29, ICC(3,1) = 0.71', () => {
    const result = icc(SHROUT_FLEISS);
    expect(result.n).toBe(6);
    expect(result.k).toBe(4);
    expect(result.icc21.value).toBeCloseTo(0.29, 2);
    expect(result.icc31.value).toBeCloseTo(0.71, 2);
  });

  it('mean squares by hand', () => {
    // Computed (hand calculation): grand mean 5.291667; target means 6, 3, 6.5, 4, 7.5, 4.75;
    // SS targets = 4 × Σ(mean − 5.291667)² = 56.208333 → BMS = 11.241667 (df 5);
    // judge means 7.666667, 2.5, 4.333333, 6.666667 → SS judges = 6 × 16.243056 = 97.458333 → JMS = 32.486111;
    // SS total = 168.958333 → SS error = 15.291667 → EMS = 1.019444 (df 15).
    const result = icc(SHROUT_FLEISS);
    expect(result.msTargets).toBeCloseTo(11.241667, 5);
    expect(result.msRaters).toBeCloseTo(32.486111, 5);
    expect(result.msError).toBeCloseTo(1.019444, 5);
  });

  it('95% limits bracket the estimates (psych::ICC gives 0.019–0.76 and 0.34–0.95, from memory)', () => {
    const { icc21, icc31 } = icc(SHROUT_FLEISS);
    expect(icc21.lower).toBeCloseTo(0.019, 3);
    expect(icc21.upper).toBeCloseTo(0.76, 2);
    expect(icc31.lower).toBeCloseTo(0.34, 2);
    expect(icc31.upper).toBeCloseTo(0.95, 2);
  });

  it('raters who agree exactly: both ICCs are 1, limits not estimable', () => {
    const result = icc([[1, 1], [2, 2], [4, 4]]);
    expect(result.icc21).toEqual({ value: 1, lower: null, upper: null });
    expect(result.icc31).toEqual({ value: 1, lower: null, upper: null });
  });

  it('a constant rater offset lowers ICC(2,1) (absolute agreement) but not ICC(3,1) (consistency)', () => {
    const result = icc([[1, 3], [2, 4], [4, 6]]);
    expect(result.icc31.value).toBeCloseTo(1, 12);
    expect(result.icc21.value).toBeLessThan(1);
  });

  it('throws on too few targets or raters, ragged rows, NaN and no variation', () => {
    expect(() => icc([[1, 2]])).toThrow(/at least 2 targets/);
    expect(() => icc([[1], [2]])).toThrow(/at least 2 raters/);
    expect(() => icc([[1, 2], [3]])).toThrow(AnalyticsInputError);
    expect(() => icc([[1, 2], [3, 4, 5]])).toThrow(/every row needs 2 ratings/);
    expect(() => icc([[1, Number.NaN], [3, 4]])).toThrow(/finite number/);
    expect(() => icc([[2, 2], [2, 2]])).toThrow(/identical/);
    expect(() => icc([[1, 2], [1, 2]])).toThrow(/only between raters/);
  });
});
