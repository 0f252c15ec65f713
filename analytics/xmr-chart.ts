import { mean } from 'simple-statistics';
import { assertFiniteSample } from './assert-finite-sample';

/** One plotted value of an individuals chart. */
export interface XmrPoint {
  readonly value: number;
  /** Above the UCL or below the LCL. */
  readonly isOutside: boolean;
}

/** Individuals and moving-range (XmR) chart limits. */
export interface XmrChart {
  readonly mean: number;
  /** Average moving range MR̄ of consecutive values. */
  readonly mrBar: number;
  readonly lcl: number;
  readonly ucl: number;
  /** Upper limit of the moving-range chart (its lower limit is 0). */
  readonly mrUcl: number;
  readonly points: readonly XmrPoint[];
}

/** Bias-correction constant d2 for moving ranges of two (ASTM / Montgomery Appendix VI). */
const D2 = 1.128;
/** D4 for subgroups of two: UCL of the moving-range chart = D4·MR̄. */
const D4 = 3.267;

/**
 * Individuals (X) and moving-range chart (NIST/SEMATECH e-Handbook of Statistical
 * Methods, §6.3.2.2): MR_i = |x_i − x_{i−1}|, MR̄ = mean of the n − 1 moving ranges;
 * limits x̄ ± 3·MR̄/d2 with d2 = 1.128 (≈ 2.66·MR̄); moving-range UCL = D4·MR̄ with D4 = 3.267.
 * Means from simple-statistics.
 *
 * @param values the individual values in time order (≥ 2 finite values)
 * @returns { mean, mrBar, lcl, ucl, mrUcl, points: { value, isOutside }[] }
 * @throws {AnalyticsInputError} with fewer than 2 values or a non-finite value
 * @example
 * xmrChart([49.6, 47.6, 49.9, 51.3, 47.8, 51.2, 52.6, 52.4, 53.6, 52.1]); // mean 50.81, mrBar 1.8778
 */
export function xmrChart(values: readonly number[]): XmrChart {
  assertFiniteSample(values, 'xmrChart: values', 2);
  const centre = mean([...values]);
  const movingRanges = values.slice(1).map((value, i) => Math.abs(value - values[i]));
  const mrBar = mean(movingRanges);
  const halfWidth = (3 * mrBar) / D2;
  const lcl = centre - halfWidth;
  const ucl = centre + halfWidth;
  return {
    mean: centre,
    mrBar,
    lcl,
    ucl,
    mrUcl: D4 * mrBar,
    points: values.map((value) => ({ value, isOutside: value > ucl || value < lcl })),
  };
}
