import chisquareCdf from '@stdlib/stats-base-dists-chisquare-cdf';
import { AnalyticsInputError } from './analytics-input-error';
import { assertTwoByTwo, type TwoByTwoTable } from './assert-two-by-two';

/** Options of {@link chiSquare2x2}. */
export interface ChiSquare2x2Options {
  /** Yates' continuity correction; default true, as R's `chisq.test`. */
  readonly continuityCorrection?: boolean;
}

/** Result of Pearson's chi-square test on a 2×2 table. */
export interface ChiSquare2x2Result {
  readonly statistic: number;
  readonly df: 1;
  readonly p: number;
  /** True when an expected count is below 5: prefer {@link fisherExact2x2} (Cochran 1954). */
  readonly hasSmallExpected: boolean;
}

/**
 * Pearson's chi-square test of independence for a 2×2 table (Pearson K 1900), as R's
 * `chisq.test(table, correct)`: E_ij = row_i·col_j / N;
 * X² = Σ (|O − E| − c)² / E with c = min(0.5, |O − E|) under Yates' correction
 * (Yates F, Suppl J R Stat Soc 1934;1:217–235) and c = 0 without it;
 * p = 1 − F_χ²(X²; 1) from @stdlib.
 *
 * @param table [[a, b], [c, d]] counts
 * @param options continuityCorrection (default true)
 * @returns { statistic, df: 1, p, hasSmallExpected }
 * @throws {AnalyticsInputError} on an invalid table or a zero row / column total (expected count 0)
 * @example
 * chiSquare2x2([[20, 5], [10, 15]], { continuityCorrection: false }); // statistic 8.3333
 */
export function chiSquare2x2(
  table: TwoByTwoTable,
  { continuityCorrection = true }: ChiSquare2x2Options = {},
): ChiSquare2x2Result {
  assertTwoByTwo(table, 'chiSquare2x2');
  const rowTotals = [table[0][0] + table[0][1], table[1][0] + table[1][1]];
  const columnTotals = [table[0][0] + table[1][0], table[0][1] + table[1][1]];
  if (rowTotals.includes(0) || columnTotals.includes(0)) {
    throw new AnalyticsInputError('chiSquare2x2: a row or column total is 0, so an expected count is 0');
  }
  const total = rowTotals[0] + rowTotals[1];
  let statistic = 0;
  let hasSmallExpected = false;
  for (let i = 0; i < 2; i++) {
    for (let j = 0; j < 2; j++) {
      const expected = (rowTotals[i] * columnTotals[j]) / total;
      if (expected < 5) hasSmallExpected = true;
      const gap = Math.abs(table[i][j] - expected);
      const correction = continuityCorrection ? Math.min(0.5, gap) : 0;
      statistic += (gap - correction) ** 2 / expected;
    }
  }
  return { statistic, df: 1, p: 1 - chisquareCdf(statistic, 1), hasSmallExpected };
}
