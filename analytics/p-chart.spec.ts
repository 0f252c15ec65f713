import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { AnalyticsInputError } from './analytics-input-error';
import { pChart } from './p-chart';

// Source: Montgomery DC, Introduction to Statistical Quality Control, 2nd ed. 1991, pp. 152–155
// (orange-juice cans; data also in R package qcc, `orangejuice`), as listed in REFERENCES.md A4.
const ORANGE_JUICE = [12, 15, 8, 10, 4, 7, 16, 9, 14, 10, 5, 6, 17, 12, 22, 8, 10, 5, 13, 11, 20, 18, 24, 15, 9, 12, 7, 13, 9, 6];

describe('pChart', () => {
  it('orange-juice cans: centre 0.2313, UCL 0.4102, LCL 0.0524; samples 15 and 23 above the UCL', () => {
    const chart = pChart(ORANGE_JUICE.map((count) => ({ count, n: 50 })));
    expect(chart.centre).toBeCloseTo(347 / 1500, 12);
    expect(chart.centre).toBeCloseTo(0.2313, 4);
    for (const point of chart.points) {
      expect(point.ucl).toBeCloseTo(0.4102, 4);
      expect(point.lcl).toBeCloseTo(0.0524, 4);
    }
    const outside = chart.points.flatMap((point, i) => (point.isOutside ? [i + 1] : []));
    expect(outside).toEqual([15, 23]);
  });

  it('recomputed without samples 15 and 23: centre 0.2150, UCL 0.3893, LCL 0.0407', () => {
    const kept = ORANGE_JUICE.filter((_, i) => i !== 14 && i !== 22);
    const chart = pChart(kept.map((count) => ({ count, n: 50 })));
    expect(chart.centre).toBeCloseTo(0.215, 4);
    expect(chart.points[0].ucl).toBeCloseTo(0.3893, 4);
    expect(chart.points[0].lcl).toBeCloseTo(0.0407, 4);
  });

  it('varying n gives per-point limits, narrower for larger n, LCL floored at 0', () => {
    // Computed (hand calculation): p̄ = 12/120 = 0.1; n = 20 → 3√(0.09/20) = 0.201246 → LCL 0 (floored), UCL 0.301246;
    // n = 100 → 3·0.03 = 0.09 → LCL 0.01, UCL 0.19.
    const chart = pChart([{ count: 2, n: 20 }, { count: 10, n: 100 }]);
    expect(chart.centre).toBeCloseTo(0.1, 12);
    expect(chart.points[0].lcl).toBe(0);
    expect(chart.points[0].ucl).toBeCloseTo(0.301246, 6);
    expect(chart.points[1].lcl).toBeCloseTo(0.01, 12);
    expect(chart.points[1].ucl).toBeCloseTo(0.19, 12);
  });

  it('zero and all non-conforming: limits collapse to the centre without NaN', () => {
    expect(pChart([{ count: 0, n: 10 }, { count: 0, n: 5 }]).points[0]).toEqual({ p: 0, lcl: 0, ucl: 0, isOutside: false });
    expect(pChart([{ count: 4, n: 4 }]).points[0]).toEqual({ p: 1, lcl: 1, ucl: 1, isOutside: false });
  });

  it('throws on empty input and bad counts', () => {
    expect(() => pChart([])).toThrow(/at least one sample/);
    expect(() => pChart([{ count: -1, n: 5 }])).toThrow(AnalyticsInputError);
    expect(() => pChart([{ count: 6, n: 5 }])).toThrow(/exceeds n/);
    expect(() => pChart([{ count: 0, n: 0 }])).toThrow(/at least 1/);
  });

  it('property: 0 ≤ LCL ≤ centre ≤ UCL ≤ 1 for every point', () => {
    const sample = fc.integer({ min: 1, max: 500 }).chain((n) => fc.record({ count: fc.integer({ min: 0, max: n }), n: fc.constant(n) }));
    fc.assert(
      fc.property(fc.array(sample, { minLength: 1, maxLength: 30 }), (samples) => {
        const chart = pChart(samples);
        return chart.points.every((p) => p.lcl >= 0 && p.lcl <= chart.centre + 1e-12 && chart.centre <= p.ucl + 1e-12 && p.ucl <= 1);
      }),
    );
  });
});
