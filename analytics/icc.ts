import fQuantile from '@stdlib/stats-base-dists-f-quantile';
import { mean } from 'simple-statistics';
import { AnalyticsInputError } from './analytics-input-error';
import { assertFiniteSample } from './assert-finite-sample';
import { assertArray } from './assert-array';

/** One intraclass correlation with its 95% CI. */
export interface IccEstimate {
  readonly value: number;
  /** 95% limits; null when there is no residual variation to estimate them from. */
  readonly lower: number | null;
  readonly upper: number | null;
}

/** Two-way ANOVA intraclass correlations for single ratings. */
export interface Icc {
  /** Targets (subjects / sites), rows of the ratings matrix. */
  readonly n: number;
  /** Raters (examiners), columns. */
  readonly k: number;
  /** Mean squares: between targets, between raters, residual. */
  readonly msTargets: number;
  readonly msRaters: number;
  readonly msError: number;
  /** ICC(2,1): two-way random effects, absolute agreement, single rater. */
  readonly icc21: IccEstimate;
  /** ICC(3,1): two-way mixed effects, consistency, single rater. */
  readonly icc31: IccEstimate;
}

/**
 * Intraclass correlations from a two-way ANOVA without replication
 * (Shrout PE, Fleiss JL, Psychol Bull 1979;86:420–428), for n targets each rated
 * once by the same k raters. With BMS = between-targets mean square (df n − 1),
 * JMS = between-raters mean square (df k − 1) and EMS = residual mean square
 * (df (n − 1)(k − 1)):
 *
 * - ICC(2,1) — raters are a random sample of raters; absolute agreement, so
 *   systematic rater differences count as error:
 *   (BMS − EMS) / (BMS + (k − 1)EMS + k(JMS − EMS)/n).
 * - ICC(3,1) — these raters are the only ones of interest (fixed); consistency,
 *   rater offsets removed: (BMS − EMS) / (BMS + (k − 1)EMS).
 *
 * 95% CIs as in Shrout & Fleiss (1979), Table 4 (F quantiles from @stdlib):
 * ICC(3,1): F₀ = BMS/EMS, F_L = F₀/F(0.975; n − 1, (n − 1)(k − 1)),
 * F_U = F₀·F(0.975; (n − 1)(k − 1), n − 1), limits (F − 1)/(F + k − 1).
 * ICC(2,1): Satterthwaite df ν for the denominator, F* = F(0.975; n − 1, ν),
 * F_* = F(0.975; ν, n − 1); lower = n(BMS − F*·EMS) / (F*(k·JMS + (kn − k − n)EMS) + n·BMS),
 * upper = n(F_*·BMS − EMS) / (k·JMS + (kn − k − n)EMS + n·F_*·BMS).
 *
 * @param ratings n × k matrix: ratings[target][rater], n ≥ 2, k ≥ 2, finite
 * @returns { n, k, msTargets, msRaters, msError, icc21, icc31 }
 * @throws {AnalyticsInputError} on fewer than 2 targets or raters, ragged rows, non-finite values,
 *   or ratings with no variation between targets nor residual variation
 */
export function icc(ratings: readonly (readonly number[])[]): Icc {
  assertArray(ratings, 'icc: ratings');
  ratings.forEach((row, i) => assertArray(row, `icc: ratings[${i}]`));
  if (ratings.length < 2) {
    throw new AnalyticsInputError('icc: ratings need at least 2 targets (rows)');
  }
  const n = ratings.length;
  const k = ratings[0].length;
  if (k < 2) throw new AnalyticsInputError('icc: ratings need at least 2 raters (columns)');
  ratings.forEach((row, i) => {
    assertFiniteSample(row, `icc: ratings[${i}]`, k);
    if (row.length !== k) throw new AnalyticsInputError(`icc: every row needs ${k} ratings; row ${i} has ${row.length}`);
  });

  const grandMean = mean(ratings.flat());
  const targetMeans = ratings.map((row) => mean([...row]));
  const raterMeans = ratings[0].map((_, j) => mean(ratings.map((row) => row[j])));
  let ssTotal = 0;
  let ssError = 0;
  // Residuals summed directly rather than by subtraction, so a perfectly consistent
  // matrix gives exactly 0 instead of rounding noise.
  ratings.forEach((row, i) =>
    row.forEach((value, j) => {
      ssTotal += (value - grandMean) ** 2;
      ssError += (value - targetMeans[i] - raterMeans[j] + grandMean) ** 2;
    }),
  );
  const ssTargets = k * targetMeans.reduce((sum, m) => sum + (m - grandMean) ** 2, 0);
  const ssRaters = n * raterMeans.reduce((sum, m) => sum + (m - grandMean) ** 2, 0);
  if (ssTotal === 0) throw new AnalyticsInputError('icc: all ratings are identical, so the ICC is undefined');
  if (ssTargets === 0 && ssError === 0) {
    throw new AnalyticsInputError('icc: ratings differ only between raters, so the ICC is undefined');
  }

  const dfTargets = n - 1;
  const dfError = (n - 1) * (k - 1);
  const bms = ssTargets / dfTargets;
  const jms = ssRaters / (k - 1);
  const ems = ssError / dfError;

  const icc21Value = (bms - ems) / (bms + (k - 1) * ems + (k * (jms - ems)) / n);
  const icc31Value = (bms - ems) / (bms + (k - 1) * ems);

  if (ems === 0) {
    // Perfect consistency: the F-based limits divide by zero.
    return {
      n, k, msTargets: bms, msRaters: jms, msError: ems,
      icc21: { value: icc21Value, lower: null, upper: null },
      icc31: { value: icc31Value, lower: null, upper: null },
    };
  }

  // ICC(3,1) limits.
  const f0 = bms / ems;
  const fLower = f0 / fQuantile(0.975, dfTargets, dfError);
  const fUpper = f0 * fQuantile(0.975, dfError, dfTargets);
  const icc31 = {
    value: icc31Value,
    lower: (fLower - 1) / (fLower + k - 1),
    upper: (fUpper - 1) / (fUpper + k - 1),
  };

  // ICC(2,1) limits with Satterthwaite's approximate df.
  const fj = jms / ems;
  const rho = icc21Value;
  const nuNumerator = (k - 1) * (n - 1) * (k * rho * fj + n * (1 + (k - 1) * rho) - k * rho) ** 2;
  const nuDenominator = (n - 1) * k * k * rho * rho * fj * fj + (n * (1 + (k - 1) * rho) - k * rho) ** 2;
  const nu = nuNumerator / nuDenominator;
  const fStar = fQuantile(0.975, dfTargets, nu);
  const fStarInverse = fQuantile(0.975, nu, dfTargets);
  const raterTerm = k * jms + (k * n - k - n) * ems;
  const icc21 = {
    value: icc21Value,
    lower: (n * (bms - fStar * ems)) / (fStar * raterTerm + n * bms),
    upper: (n * (fStarInverse * bms - ems)) / (raterTerm + n * fStarInverse * bms),
  };

  return { n, k, msTargets: bms, msRaters: jms, msError: ems, icc21, icc31 };
}
