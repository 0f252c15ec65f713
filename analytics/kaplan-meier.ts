import { AnalyticsInputError } from './analytics-input-error';
import { assertFiniteSample } from './assert-finite-sample';
import { twoSidedZ } from './two-sided-z';
import { assertArray } from './assert-array';

/** One step of the Kaplan–Meier curve, at a time with at least one event. */
export interface KaplanMeierStep {
  readonly time: number;
  /** Subjects with time ≥ this time. */
  readonly atRisk: number;
  readonly events: number;
  readonly survival: number;
  /** 95% log-log limits; null when survival is 0 (not estimable). */
  readonly lower: number | null;
  readonly upper: number | null;
}

/** Kaplan–Meier estimate. */
export interface KaplanMeier {
  readonly n: number;
  readonly steps: readonly KaplanMeierStep[];
  /** Smallest event time with S(t) ≤ 0.5; null when the curve never reaches 0.5. */
  readonly median: number | null;
}

/**
 * Kaplan–Meier product-limit estimate (Kaplan EL, Meier P, JASA 1958;53:457–481):
 * S(t) = Π_{t_i ≤ t} (1 − d_i / n_i) over event times t_i with d_i events among n_i at risk.
 * Censored subjects count as at risk at their own time (events come before censoring
 * at tied times, the usual convention). Greenwood variance (Greenwood 1926):
 * Var(S)/S² = Σ d_i / (n_i(n_i − d_i)). 95% CI on the log-log scale, as R's
 * `survfit(conf.type = "log-log")`: se* = √(Σ d/(n(n − d))) / |ln S|,
 * limits S^exp(±z·se*) (lower uses +, upper −).
 * Median = smallest time with S ≤ 0.5 (R's rule, except that R takes the midpoint to
 * the next event time when S is exactly 0.5 on an interval).
 *
 * @param times follow-up time per subject (finite, ≥ 0)
 * @param events per subject: true = event observed, false = censored
 * @returns { n, steps: { time, atRisk, events, survival, lower, upper }[], median }
 * @throws {AnalyticsInputError} on empty or mismatched arrays, negative / NaN times, non-boolean events
 * @example
 * kaplanMeier([9, 13, 13, 18], [true, true, false, true]).steps[0]; // { time 9, atRisk 4, events 1, survival 0.75, … }
 */
export function kaplanMeier(times: readonly number[], events: readonly boolean[]): KaplanMeier {
  assertFiniteSample(times, 'kaplanMeier: times');
  assertArray(events, 'kaplanMeier: events');
  if (events.length !== times.length) {
    throw new AnalyticsInputError(
      `kaplanMeier: events must be as long as times (${times.length}), got ${events.length}`,
    );
  }
  times.forEach((time, i) => {
    if (time < 0) throw new AnalyticsInputError(`kaplanMeier: times[${i}] must not be negative, got ${time}`);
    if (typeof events[i] !== 'boolean') {
      throw new AnalyticsInputError(`kaplanMeier: events[${i}] must be true or false, got ${String(events[i])}`);
    }
  });

  const z = twoSidedZ(0.95);
  const order = times.map((_, i) => i).sort((i, j) => times[i] - times[j]);
  const steps: KaplanMeierStep[] = [];
  let atRisk = times.length;
  let survival = 1;
  let greenwoodSum = 0;
  let median: number | null = null;
  let position = 0;
  while (position < order.length) {
    const time = times[order[position]];
    let eventCount = 0;
    let leaving = 0;
    while (position < order.length && times[order[position]] === time) {
      if (events[order[position]]) eventCount++;
      leaving++;
      position++;
    }
    if (eventCount > 0) {
      survival *= 1 - eventCount / atRisk;
      const isExhausted = eventCount === atRisk;
      greenwoodSum += isExhausted ? 0 : eventCount / (atRisk * (atRisk - eventCount));
      steps.push({ time, atRisk, events: eventCount, survival, ...logLogLimits(survival, greenwoodSum, z) });
      if (median === null && survival <= 0.5) median = time;
    }
    atRisk -= leaving;
  }
  return { n: times.length, steps, median };
}

/** Log-log limits S^exp(±z·se*), se* = √greenwoodSum / |ln S|. */
function logLogLimits(survival: number, greenwoodSum: number, z: number): { lower: number | null; upper: number | null } {
  if (survival <= 0) return { lower: null, upper: null };
  if (survival >= 1 || greenwoodSum === 0) return { lower: survival, upper: survival };
  const se = Math.sqrt(greenwoodSum) / Math.abs(Math.log(survival));
  return { lower: survival ** Math.exp(z * se), upper: survival ** Math.exp(-z * se) };
}
