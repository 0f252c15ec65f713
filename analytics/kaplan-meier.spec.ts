import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { AnalyticsInputError } from './analytics-input-error';
import { kaplanMeier } from './kaplan-meier';

// Source: R package survival, dataset `aml`, "Maintained" arm (Miller 1997), as listed in
// REFERENCES.md A7; S(t) computed by the product-limit formula (matching R's survfit from memory).
const AML_TIMES = [9, 13, 13, 18, 23, 28, 31, 34, 45, 48, 161];
const AML_EVENTS = [true, true, false, true, true, false, true, true, false, true, false];

describe('kaplanMeier', () => {
  it('aml maintained arm: at risk, events and S(t) at each event time', () => {
    const result = kaplanMeier(AML_TIMES, AML_EVENTS);
    const expected = [
      [9, 11, 1, 0.9091],
      [13, 10, 1, 0.8182],
      [18, 8, 1, 0.7159],
      [23, 7, 1, 0.6136],
      [31, 5, 1, 0.4909],
      [34, 4, 1, 0.3682],
      [48, 2, 1, 0.1841],
    ];
    expect(result.steps.map((s) => [s.time, s.atRisk, s.events])).toEqual(expected.map(([t, n, d]) => [t, n, d]));
    result.steps.forEach((step, i) => expect(step.survival).toBeCloseTo(expected[i][3], 4));
  });

  it('aml median = 31 (smallest time with S ≤ 0.5)', () => {
    expect(kaplanMeier(AML_TIMES, AML_EVENTS).median).toBe(31);
  });

  it('log-log Greenwood limits at t = 9', () => {
    // Computed (hand calculation): S = 10/11; Greenwood Σ d/(n(n − d)) = 1/110;
    // se* = √(1/110)/|ln(10/11)| = 0.0953463/0.0953102 = 1.000379;
    // lower = S^exp(1.959964·1.000379) = 0.9090909^7.1046 = 0.50808; upper = S^exp(−1.960706) = 0.98667.
    const [first] = kaplanMeier(AML_TIMES, AML_EVENTS).steps;
    expect(first.lower).toBeCloseTo(0.50808, 4);
    expect(first.upper).toBeCloseTo(0.98667, 4);
  });

  it('all censored: no steps and no median', () => {
    expect(kaplanMeier([5, 10, 15], [false, false, false])).toEqual({ n: 3, steps: [], median: null });
  });

  it('n = 1 with an event: survival drops to 0 and the limits are not estimable', () => {
    expect(kaplanMeier([7], [true])).toEqual({
      n: 1,
      steps: [{ time: 7, atRisk: 1, events: 1, survival: 0, lower: null, upper: null }],
      median: 7,
    });
  });

  it('median is null when the curve stays above 0.5', () => {
    expect(kaplanMeier([1, 2, 3, 4], [true, false, false, false]).median).toBeNull();
  });

  it('throws on mismatched lengths, negative times and bad event flags', () => {
    expect(() => kaplanMeier([1, 2], [true])).toThrow(/as long as times/);
    expect(() => kaplanMeier([], [])).toThrow(AnalyticsInputError);
    expect(() => kaplanMeier([-1], [true])).toThrow(/must not be negative/);
    expect(() => kaplanMeier([Number.NaN], [true])).toThrow(/finite number/);
    expect(() => kaplanMeier([1], JSON.parse('[1]'))).toThrow(/true or false/);
  });

  it('properties: survival never increases, stays in [0, 1], and the CI contains it', () => {
    const subject = fc.record({ time: fc.integer({ min: 0, max: 50 }), event: fc.boolean() });
    fc.assert(
      fc.property(fc.array(subject, { minLength: 1, maxLength: 60 }), (subjects) => {
        const { steps } = kaplanMeier(subjects.map((s) => s.time), subjects.map((s) => s.event));
        let previous = 1;
        for (const step of steps) {
          if (step.survival > previous || step.survival < 0) return false;
          if (step.lower !== null && step.upper !== null && !(step.lower <= step.survival && step.survival <= step.upper)) return false;
          previous = step.survival;
        }
        return true;
      }),
    );
  });
});
