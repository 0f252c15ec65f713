import { AnalyticsInputError } from './analytics-input-error';
import { assertCount } from './assert-count';
import { assertArray } from './assert-array';

/** One subgroup of a p chart: `count` non-conforming out of `n`. */
export interface PChartSample {
  readonly count: number;
  readonly n: number;
}

/** One plotted point of a p chart with its own limits. */
export interface PChartPoint {
  readonly p: number;
  readonly lcl: number;
  readonly ucl: number;
  /** Above the UCL or below the LCL. */
  readonly isOutside: boolean;
}

/** A p chart: centre line and per-point 3-sigma limits. */
export interface PChart {
  readonly centre: number;
  readonly points: readonly PChartPoint[];
}

/**
 * p control chart (fraction non-conforming) with 3-sigma limits
 * (Montgomery DC, Introduction to Statistical Quality Control, 2nd ed. 1991, §6.2):
 * centre p̄ = Σcount / Σn; for each subgroup i, limits p̄ ± 3√(p̄(1 − p̄)/n_i),
 * so varying subgroup sizes give per-point limits. The LCL is floored at 0 and the
 * UCL capped at 1 (a proportion cannot leave [0, 1]). A point is outside when
 * p_i > UCL_i or p_i < LCL_i.
 *
 * @param samples subgroups { count, n } with integer 0 ≤ count ≤ n, n ≥ 1
 * @returns { centre, points: { p, lcl, ucl, isOutside }[] }
 * @throws {AnalyticsInputError} when empty, or a count is negative, fractional or exceeds n
 * @example
 * pChart(orangeJuiceSamples); // centre 0.2313, ucl 0.4102, lcl 0.0524 (Montgomery 1991)
 */
export function pChart(samples: readonly PChartSample[]): PChart {
  assertArray(samples, 'pChart: samples');
  if (samples.length === 0) {
    throw new AnalyticsInputError('pChart: needs at least one sample');
  }
  let totalCount = 0;
  let totalN = 0;
  samples.forEach(({ count, n }, i) => {
    assertCount(count, `pChart: samples[${i}].count`);
    assertCount(n, `pChart: samples[${i}].n`);
    if (n === 0) throw new AnalyticsInputError(`pChart: samples[${i}].n must be at least 1`);
    if (count > n) throw new AnalyticsInputError(`pChart: samples[${i}].count (${count}) exceeds n (${n})`);
    totalCount += count;
    totalN += n;
  });
  const centre = totalCount / totalN;
  const points = samples.map(({ count, n }) => {
    const p = count / n;
    const threeSigma = 3 * Math.sqrt((centre * (1 - centre)) / n);
    const lcl = Math.max(0, centre - threeSigma);
    const ucl = Math.min(1, centre + threeSigma);
    return { p, lcl, ucl, isOutside: p > ucl || p < lcl };
  });
  return { centre, points };
}
