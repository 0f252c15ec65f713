import { mean, sampleStandardDeviation } from 'simple-statistics';
import { AnalyticsInputError } from './analytics-input-error';
import { assertFiniteSample } from './assert-finite-sample';

/** Options of {@link blandAltman}. */
export interface BlandAltmanOptions {
  /** Multiplier of the SD for the limits; default 1.96 (the 1986 paper used 2). */
  readonly z?: number;
}

/** Bland–Altman bias and limits of agreement of a − b. */
export interface BlandAltman {
  readonly n: number;
  /** Mean difference (a − b). */
  readonly bias: number;
  /** Sample SD (n − 1) of the differences. */
  readonly sd: number;
  readonly lower: number;
  readonly upper: number;
}

/**
 * Bland–Altman limits of agreement (Bland JM, Altman DG, Lancet 1986;i:307–310):
 * d_i = a_i − b_i, bias = mean(d), sd = SD(d) (n − 1), limits bias ± z·sd.
 * Mean and SD from simple-statistics.
 *
 * @param a first method / examiner, one value per subject
 * @param b second method / examiner, same subjects in the same order
 * @param options z (default 1.96)
 * @returns { n, bias, sd, lower, upper }
 * @throws {AnalyticsInputError} on fewer than 2 pairs, mismatched lengths, non-finite values, z ≤ 0
 * @example
 * blandAltman(wright, miniWright, { z: 2 }); // bias −2.1, sd 38.8, limits −79.7 to 75.5
 */
export function blandAltman(a: readonly number[], b: readonly number[], { z = 1.96 }: BlandAltmanOptions = {}): BlandAltman {
  assertFiniteSample(a, 'blandAltman: a', 2);
  assertFiniteSample(b, 'blandAltman: b', 2);
  if (a.length !== b.length) {
    throw new AnalyticsInputError(`blandAltman: a and b must have the same length (${a.length} vs ${b.length})`);
  }
  if (typeof z !== 'number' || !(z > 0) || !Number.isFinite(z)) {
    throw new AnalyticsInputError(`blandAltman: z must be a positive number, got ${String(z)}`);
  }
  const differences = a.map((value, i) => value - b[i]);
  const bias = mean(differences);
  const sd = sampleStandardDeviation(differences);
  return { n: a.length, bias, sd, lower: bias - z * sd, upper: bias + z * sd };
}
