import { AnalyticsInputError } from './analytics-input-error';
import { assertArray } from './assert-array';

/** Parameters of {@link bernoulliCusum}. */
export interface BernoulliCusumOptions {
  /** Acceptable (baseline) failure rate p₀, in (0, 1). */
  readonly p: number;
  /** Odds ratio R_A of the unacceptable rate against p₀ (> 0, typically 2). */
  readonly oddsRatio: number;
  /** Decision threshold h (> 0). */
  readonly h: number;
}

/** CUSUM path and the cases at which it signals. */
export interface BernoulliCusum {
  /** Score added for a failure and for a success. */
  readonly weights: { readonly failure: number; readonly success: number };
  /** X_t after each case, in input order. */
  readonly values: readonly number[];
  /** 0-based indices where X_t ≥ h. */
  readonly signalAt: readonly number[];
}

/**
 * Bernoulli CUSUM for a run of outcomes (Steiner SH, Cook RJ, Farewell VT, Treasure T,
 * Biostatistics 2000;1(4):441–452), without risk adjustment:
 * X_t = max(0, X_{t−1} + W_t), X_0 = 0, with log-likelihood-ratio weights
 * W = ln(R_A / (1 − p + R_A·p)) for a failure and W = ln(1 / (1 − p + R_A·p)) for a success.
 * The path is never reset after a signal (the audit shows the whole run);
 * signalAt lists every index where X_t ≥ h.
 *
 * @param failures one entry per case in time order: true = failure (complication)
 * @param options { p, oddsRatio, h }
 * @returns { weights, values, signalAt }
 * @throws {AnalyticsInputError} on p outside (0, 1), oddsRatio ≤ 0, h ≤ 0 or a non-boolean outcome
 * @example
 * bernoulliCusum([false, true, true], { p: 0.1, oddsRatio: 2, h: 1 }).weights; // failure 0.59784, success −0.09531
 */
export function bernoulliCusum(
  failures: readonly boolean[],
  { p, oddsRatio, h }: BernoulliCusumOptions,
): BernoulliCusum {
  assertArray(failures, 'bernoulliCusum: failures');
  if (typeof p !== 'number' || !(p > 0 && p < 1)) {
    throw new AnalyticsInputError(`bernoulliCusum: p must lie strictly between 0 and 1, got ${String(p)}`);
  }
  if (typeof oddsRatio !== 'number' || !(oddsRatio > 0) || !Number.isFinite(oddsRatio)) {
    throw new AnalyticsInputError(`bernoulliCusum: oddsRatio must be a positive number, got ${String(oddsRatio)}`);
  }
  if (typeof h !== 'number' || !(h > 0) || !Number.isFinite(h)) {
    throw new AnalyticsInputError(`bernoulliCusum: h must be a positive number, got ${String(h)}`);
  }
  const scale = 1 - p + oddsRatio * p;
  const weights = { failure: Math.log(oddsRatio / scale), success: Math.log(1 / scale) };
  const values: number[] = [];
  const signalAt: number[] = [];
  let current = 0;
  failures.forEach((isFailure, i) => {
    if (typeof isFailure !== 'boolean') {
      throw new AnalyticsInputError(`bernoulliCusum: failures[${i}] must be true or false, got ${String(isFailure)}`);
    }
    current = Math.max(0, current + (isFailure ? weights.failure : weights.success));
    values.push(current);
    if (current >= h) signalAt.push(i);
  });
  return { weights, values, signalAt };
}
