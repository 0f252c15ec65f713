import { AnalyticsInputError } from './analytics-input-error';
import { assertCount } from './assert-count';
import { landisKochBand, type AgreementBand } from './landis-koch-band';
import { assertArray } from './assert-array';

/** Disagreement weighting of {@link cohenKappa}. */
export type KappaWeights = 'none' | 'linear' | 'quadratic';

/** Cohen's kappa with its observed and chance-expected agreement. */
export interface CohenKappa {
  readonly kappa: number;
  /** Observed (weighted) agreement pₒ. */
  readonly observed: number;
  /** Chance-expected (weighted) agreement pₑ. */
  readonly expected: number;
  readonly band: AgreementBand;
}

/** Agreement weight of cell (i, j) in a k-category table. */
function agreementWeight(i: number, j: number, k: number, weights: KappaWeights): number {
  if (weights === 'none') return i === j ? 1 : 0;
  const distance = Math.abs(i - j) / (k - 1);
  return weights === 'linear' ? 1 - distance : 1 - distance * distance;
}

/**
 * Cohen's kappa for two raters (Cohen J, Educ Psychol Meas 1960;20:37–46) and weighted
 * kappa (Cohen J, Psychol Bull 1968;70:213–220), in agreement-weight form:
 * pₒ = Σ w_ij·p_ij, pₑ = Σ w_ij·p_i.·p_.j, κ = (pₒ − pₑ)/(1 − pₑ), with
 * w_ij = 1 if i = j else 0 (none), 1 − |i − j|/(k − 1) (linear),
 * 1 − (i − j)²/(k − 1)² (quadratic). Categories must be ordered for weighted kappa.
 * The band is the Landis & Koch (1977) label ({@link landisKochBand}).
 *
 * @param table k×k counts (k ≥ 2): rows = rater 1's category, columns = rater 2's
 * @param weights 'none' (default), 'linear' or 'quadratic'
 * @returns { kappa, observed, expected, band }
 * @throws {AnalyticsInputError} when the table is not square, holds invalid counts, is empty,
 *   or chance agreement is 1 (both raters used one category only: κ undefined)
 * @example
 * cohenKappa([[20, 5], [10, 15]]); // { kappa: 0.4, observed: 0.7, expected: 0.5, band: 'fair' }
 */
export function cohenKappa(table: readonly (readonly number[])[], weights: KappaWeights = 'none'): CohenKappa {
  assertArray(table, 'cohenKappa: table');
  if (table.length < 2) {
    throw new AnalyticsInputError('cohenKappa: table must be a square array of at least 2×2 counts');
  }
  const k = table.length;
  table.forEach((row, i) => {
    assertArray(row, `cohenKappa: table[${i}]`);
    if (row.length !== k) {
      throw new AnalyticsInputError(`cohenKappa: table must be square (${k}×${k}); row ${i} has ${row.length} cells`);
    }
    row.forEach((count, j) => assertCount(count, `cohenKappa: table[${i}][${j}]`));
  });
  if (weights !== 'none' && weights !== 'linear' && weights !== 'quadratic') {
    throw new AnalyticsInputError(`cohenKappa: weights must be 'none', 'linear' or 'quadratic', got ${String(weights)}`);
  }
  const total = table.reduce((sum, row) => sum + row.reduce((rowSum, count) => rowSum + count, 0), 0);
  if (total === 0) throw new AnalyticsInputError('cohenKappa: table has no observations');
  const rowShares = table.map((row) => row.reduce((sum, count) => sum + count, 0) / total);
  const columnShares = table[0].map((_, j) => table.reduce((sum, row) => sum + row[j], 0) / total);
  let observed = 0;
  let expected = 0;
  for (let i = 0; i < k; i++) {
    for (let j = 0; j < k; j++) {
      const weight = agreementWeight(i, j, k, weights);
      observed += (weight * table[i][j]) / total;
      expected += weight * rowShares[i] * columnShares[j];
    }
  }
  if (Math.abs(1 - expected) < 1e-12) {
    throw new AnalyticsInputError('cohenKappa: chance agreement is 1 (one category only), so kappa is undefined');
  }
  const kappa = (observed - expected) / (1 - expected);
  return { kappa, observed, expected, band: landisKochBand(kappa) };
}
