import normalCdf from '@stdlib/stats-base-dists-normal-cdf';
import { assertFiniteSample } from './assert-finite-sample';

/** Result of the Wilcoxon rank-sum (Mann–Whitney) test, two-sided. */
export interface RankSumTestResult {
  /** W = rank sum of a − na(na + 1)/2 (R's statistic, equal to Mann–Whitney U for a). */
  readonly w: number;
  readonly p: number;
  /** 'exact' when both samples have fewer than 50 values and there are no ties. */
  readonly method: 'exact' | 'normal';
}

/** Samples this size or larger use the normal approximation, as in R. */
const EXACT_LIMIT = 50;

/**
 * Exact null distribution of W for sample sizes m and n, as probabilities
 * P(W = w), w = 0 … mn. The counts are the coefficients of the Gaussian binomial
 * coefficient [m + n choose m]_q, built by the q-Pascal rule
 * [N, k] = [N − 1, k − 1] + q^k [N − 1, k] (Mann & Whitney, Ann Math Stat 1947;18:50–60).
 * Counts are held as doubles (up to C(98, 49) ≈ 2.5e28), exact to ~1e-16 relative.
 */
export function rankSumDistribution(m: number, n: number): Float64Array {
  // rows[k] holds the counts for choosing k of the first N elements, N growing to m + n.
  let rows: Float64Array[] = [Float64Array.of(1)];
  for (let total = 1; total <= m + n; total++) {
    const next: Float64Array[] = [];
    const kMax = Math.min(total, m);
    for (let k = 0; k <= kMax; k++) {
      const size = k * (total - k) + 1;
      const counts = new Float64Array(size);
      // [N − 1, k − 1] contributes unshifted.
      const withLast = k >= 1 ? rows[k - 1] : undefined;
      if (withLast) for (let w = 0; w < withLast.length && w < size; w++) counts[w] += withLast[w];
      // q^k · [N − 1, k] contributes shifted by k.
      const withoutLast = k < rows.length && k <= total - 1 ? rows[k] : undefined;
      if (withoutLast) for (let w = 0; w < withoutLast.length && w + k < size; w++) counts[w + k] += withoutLast[w];
      next.push(counts);
    }
    rows = next;
  }
  const counts = rows[m];
  let total = 0;
  for (const count of counts) total += count;
  return counts.map((count) => count / total);
}

/**
 * Ranks with ties given their average rank (R's `rank`, ties.method = "average").
 * Returns the ranks in the input order and the sizes of the tie groups.
 */
function averageRanks(values: readonly number[]): { ranks: Float64Array; tieSizes: number[] } {
  const order = values.map((_, i) => i).sort((i, j) => values[i] - values[j]);
  const ranks = new Float64Array(values.length);
  const tieSizes: number[] = [];
  let start = 0;
  while (start < order.length) {
    let end = start;
    while (end + 1 < order.length && values[order[end + 1]] === values[order[start]]) end++;
    const averageRank = (start + end) / 2 + 1;
    for (let i = start; i <= end; i++) ranks[order[i]] = averageRank;
    if (end > start) tieSizes.push(end - start + 1);
    start = end + 1;
  }
  return { ranks, tieSizes };
}

/**
 * Wilcoxon rank-sum test (Wilcoxon F, Biometrics Bulletin 1945;1:80–83), equivalent
 * to the Mann–Whitney U test, two-sided, following R's `wilcox.test(a, b)`:
 *
 * - W = Σ ranks(a) − na(na + 1)/2 (average ranks over the pooled sample);
 * - exact p when na < 50, nb < 50 and there are no ties: from the exact null
 *   distribution of W ({@link rankSumDistribution}),
 *   p = min(1, 2·P(W ≤ w)) if w ≤ na·nb/2, else min(1, 2·P(W ≥ w));
 * - otherwise the normal approximation with tie and continuity correction:
 *   z = (W − na·nb/2 − ½·sign(W − na·nb/2)) / σ,
 *   σ² = (na·nb/12)·((N + 1) − Σ(t³ − t) / (N(N − 1))), p = 2·min(Φ(z), 1 − Φ(z)).
 *
 * When every value is tied σ = 0: the samples cannot be told apart and p is
 * reported as 1 (R returns NaN here).
 *
 * @param a first sample (≥ 1 finite value)
 * @param b second sample (≥ 1 finite value)
 * @returns { w, p, method }
 * @throws {AnalyticsInputError} when a sample is empty or holds NaN / ±Infinity
 * @example
 * rankSumTest(sleepGroup1, sleepGroup2); // { w: 25.5, p: 0.06933, method: 'normal' }
 */
export function rankSumTest(a: readonly number[], b: readonly number[]): RankSumTestResult {
  assertFiniteSample(a, 'rankSumTest: a');
  assertFiniteSample(b, 'rankSumTest: b');
  const na = a.length;
  const nb = b.length;
  const total = na + nb;
  const { ranks, tieSizes } = averageRanks([...a, ...b]);
  let rankSumA = 0;
  for (let i = 0; i < na; i++) rankSumA += ranks[i];
  const w = rankSumA - (na * (na + 1)) / 2;
  const centre = (na * nb) / 2;

  if (na < EXACT_LIMIT && nb < EXACT_LIMIT && tieSizes.length === 0) {
    const probabilities = rankSumDistribution(na, nb);
    let tail = 0;
    if (w > centre) {
      for (let k = w; k < probabilities.length; k++) tail += probabilities[k];
    } else {
      for (let k = 0; k <= w; k++) tail += probabilities[k];
    }
    return { w, p: Math.min(1, 2 * tail), method: 'exact' };
  }

  const tieTerm = tieSizes.reduce((sum, t) => sum + t ** 3 - t, 0) / (total * (total - 1));
  const sigma = Math.sqrt(((na * nb) / 12) * (total + 1 - tieTerm));
  if (!(sigma > 0)) return { w, p: 1, method: 'normal' };
  const deviation = w - centre;
  const z = (deviation - Math.sign(deviation) * 0.5) / sigma;
  const p = 2 * Math.min(normalCdf(z, 0, 1), 1 - normalCdf(z, 0, 1));
  return { w, p: Math.min(1, p), method: 'normal' };
}
