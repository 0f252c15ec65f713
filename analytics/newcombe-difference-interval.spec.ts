import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { AnalyticsInputError } from './analytics-input-error';
import { newcombeDifferenceInterval } from './newcombe-difference-interval';

describe('newcombeDifferenceInterval', () => {
  /*
   * Newcombe RG, Stat Med 1998;17:873–890, Table II, method 10 (hybrid score, no continuity correction).
   * Values from memory; (a) and (b) are also the values the R package propint asserts as Newcombe's in
   * its tests (m-Py/propint, tests/testthat), and every row was recomputed here from the formula.
   */
  it.each<[string, number, number, number, number, number, number]>([
    ['(a) 56/70 − 48/80', 56, 70, 48, 80, 0.0524, 0.3339],
    ['(b) 9/10 − 3/10', 9, 10, 3, 10, 0.1705, 0.809],
    ['(d) 5/56 − 0/29', 5, 56, 0, 29, -0.0381, 0.1926],
    ['(e) 0/10 − 0/20', 0, 10, 0, 20, -0.1611, 0.2775],
    ['(f) 0/10 − 0/10', 0, 10, 0, 10, -0.2775, 0.2775],
    ['(g) 10/10 − 0/20', 10, 10, 0, 20, 0.6791, 1],
    ['(h) 10/10 − 0/10', 10, 10, 0, 10, 0.6075, 1],
  ])('Newcombe 1998 Table II %s', (_, x1, n1, x2, n2, lower, upper) => {
    const interval = newcombeDifferenceInterval(x1, n1, x2, n2);
    expect(interval.difference).toBeCloseTo(x1 / n1 - x2 / n2, 12);
    expect(interval.lower).toBeCloseTo(lower, 4);
    expect(interval.upper).toBeCloseTo(upper, 4);
  });

  it('contains the estimate, stays within [−1, 1], and swapping the groups mirrors it (property)', () => {
    const group = fc.integer({ min: 1, max: 200 }).chain((n) => fc.tuple(fc.integer({ min: 0, max: n }), fc.constant(n)));
    fc.assert(
      fc.property(group, group, ([x1, n1], [x2, n2]) => {
        const forward = newcombeDifferenceInterval(x1, n1, x2, n2);
        const backward = newcombeDifferenceInterval(x2, n2, x1, n1);
        expect(forward.lower).toBeLessThanOrEqual(forward.difference + 1e-12);
        expect(forward.upper).toBeGreaterThanOrEqual(forward.difference - 1e-12);
        expect(forward.lower).toBeGreaterThanOrEqual(-1);
        expect(forward.upper).toBeLessThanOrEqual(1);
        expect(backward.lower).toBeCloseTo(-forward.upper, 12);
        expect(backward.upper).toBeCloseTo(-forward.lower, 12);
      }),
    );
  });

  it('is wider at 99% than at 95%', () => {
    const at95 = newcombeDifferenceInterval(56, 70, 48, 80);
    const at99 = newcombeDifferenceInterval(56, 70, 48, 80, 0.99);
    expect(at99.lower).toBeLessThan(at95.lower);
    expect(at99.upper).toBeGreaterThan(at95.upper);
  });

  it('rejects empty groups, impossible counts and a bad confidence level', () => {
    expect(() => newcombeDifferenceInterval(0, 0, 1, 2)).toThrow(/n1 and n2 must be at least 1/);
    expect(() => newcombeDifferenceInterval(3, 2, 1, 2)).toThrow(/successes cannot exceed trials/);
    expect(() => newcombeDifferenceInterval(1.5, 2, 1, 2)).toThrow(/x1 must be a non-negative integer/);
    expect(() => newcombeDifferenceInterval(1, 2, 1, 2, 95)).toThrow(AnalyticsInputError);
  });
});
