import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { AnalyticsInputError } from './analytics-input-error';
import { stabilityClass } from './stability-class';

// Source: DESIGN.md §3 (common practice): stable ≤ 0.5 mm, minor 0.5–1.0 mm, relapse > 1.0 mm;
// negative rebound counts as stable.
describe('stabilityClass', () => {
  it.each([
    [-1, 'stable'],
    [0, 'stable'],
    [0.5, 'stable'],
    [0.51, 'minor'],
    [1, 'minor'],
    [1.01, 'relapse'],
    [3, 'relapse'],
  ])('rebound %s mm → %s with the default thresholds', (reboundMm, expected) => {
    expect(stabilityClass(reboundMm)).toBe(expected);
  });

  it('a boundary reached by floating-point subtraction stays on its side', () => {
    // 2.6 − 2.1 = 0.5000000000000002 in binary floating point; it is still 0.5 mm.
    expect(stabilityClass(2.6 - 2.1)).toBe('stable');
    expect(stabilityClass(3.3 - 2.3)).toBe('minor');
  });

  it('uses audit-specific thresholds', () => {
    expect(stabilityClass(0.8, { stable: 1, relapse: 2 })).toBe('stable');
    expect(stabilityClass(2.5, { stable: 1, relapse: 2 })).toBe('relapse');
  });

  it('throws on a non-finite rebound or inconsistent thresholds', () => {
    expect(() => stabilityClass(Number.NaN)).toThrow(AnalyticsInputError);
    expect(() => stabilityClass(0.5, { stable: 1, relapse: 0.5 })).toThrow(/stable ≤ relapse/);
    expect(() => stabilityClass(0.5, { stable: -1, relapse: 0.5 })).toThrow(AnalyticsInputError);
  });

  it('property: the class never gets less severe as rebound grows', () => {
    const rank = { stable: 0, minor: 1, relapse: 2 };
    const mm = fc.double({ min: -5, max: 10, noNaN: true });
    fc.assert(fc.property(mm, mm, (a, b) => (a <= b ? rank[stabilityClass(a)] <= rank[stabilityClass(b)] : true)));
  });
});
