import { describe, expect, it } from 'vitest';
import { AnalyticsInputError } from './analytics-input-error';
import { xmrChart } from './xmr-chart';

// Source: NIST/SEMATECH e-Handbook of Statistical Methods, §6.3.2.2 (individuals control chart example),
// as listed in REFERENCES.md A5.
const NIST_VALUES = [49.6, 47.6, 49.9, 51.3, 47.8, 51.2, 52.6, 52.4, 53.6, 52.1];

describe('xmrChart', () => {
  it('NIST example: mean 50.81, MR̄ 1.8778, limits 45.8159–55.8041', () => {
    const chart = xmrChart(NIST_VALUES);
    expect(chart.mean).toBeCloseTo(50.81, 10);
    expect(chart.mrBar).toBeCloseTo(1.8778, 4);
    expect(chart.lcl).toBeCloseTo(45.8159, 4);
    expect(chart.ucl).toBeCloseTo(55.8041, 4);
    // The handbook prints 6.1349; 3.267 × 1.877778 = 6.13470, so agreement is to 3 decimals
    // (the fourth digit depends on how MR̄ and D4 were rounded).
    expect(chart.mrUcl).toBeCloseTo(6.1349, 3);
    expect(chart.points.every((point) => !point.isOutside)).toBe(true);
  });

  it('flags a value beyond the limits', () => {
    // Computed (hand calculation): values 10, 10, 10, 10, 20 → mean 12, MR̄ = 10/4 = 2.5,
    // UCL = 12 + 3·2.5/1.128 = 18.648936 → 20 is outside.
    const chart = xmrChart([10, 10, 10, 10, 20]);
    expect(chart.ucl).toBeCloseTo(18.648936, 6);
    expect(chart.points.map((point) => point.isOutside)).toEqual([false, false, false, false, true]);
  });

  it('identical values: zero-width limits, nothing outside', () => {
    const chart = xmrChart([3, 3, 3]);
    expect([chart.mrBar, chart.lcl, chart.ucl, chart.mrUcl]).toEqual([0, 3, 3, 0]);
    expect(chart.points.some((point) => point.isOutside)).toBe(false);
  });

  it('throws with fewer than 2 values or NaN', () => {
    expect(() => xmrChart([1])).toThrow(/at least 2 values/);
    expect(() => xmrChart([1, Number.NaN])).toThrow(AnalyticsInputError);
  });
});
