import hypergeometricPmf from '@stdlib/stats-base-dists-hypergeometric-pmf';
import { assertTwoByTwo, type TwoByTwoTable } from './assert-two-by-two';

/** Result of Fisher's exact test. */
export interface FisherExactResult {
  /** Two-sided p-value. */
  readonly p: number;
}

/** R's relative tolerance when comparing table probabilities (`fisher.test`). */
const RELATIVE_TOLERANCE = 1 + 1e-7;

/**
 * Fisher's exact test for a 2×2 table, two-sided (Fisher RA, J R Stat Soc 1922;85:87–94),
 * as R's `fisher.test`: with the margins fixed, the top-left cell X is hypergeometric
 * (population N, K = first column total, draws = first row total);
 * p = Σ P(X = x) over all x with P(X = x) ≤ P(X = observed)·(1 + 10⁻⁷).
 * Hypergeometric PMF from @stdlib.
 *
 * @param table [[a, b], [c, d]] counts: rows = groups, columns = event / no event
 * @returns { p }
 * @throws {AnalyticsInputError} when the table is not 2×2, holds negative or fractional counts, or is empty
 * @example
 * fisherExact2x2([[3, 1], [1, 3]]); // { p: 0.4857 } (Fisher's tea-tasting experiment)
 */
export function fisherExact2x2(table: TwoByTwoTable): FisherExactResult {
  assertTwoByTwo(table, 'fisherExact2x2');
  const [[a, b], [c, d]] = table;
  const total = a + b + c + d;
  const firstRow = a + b;
  const firstColumn = a + c;
  const low = Math.max(0, firstRow + firstColumn - total);
  const high = Math.min(firstRow, firstColumn);
  const observed = hypergeometricPmf(a, total, firstColumn, firstRow) * RELATIVE_TOLERANCE;
  let p = 0;
  for (let x = low; x <= high; x++) {
    const probability = hypergeometricPmf(x, total, firstColumn, firstRow);
    if (probability <= observed) p += probability;
  }
  return { p: Math.min(1, p) };
}
