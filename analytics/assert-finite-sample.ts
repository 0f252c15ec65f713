import { AnalyticsInputError } from './analytics-input-error';

/**
 * Checks that `values` is a sample of at least `minLength` finite numbers.
 *
 * @param values the sample
 * @param label name used in the error message (e.g. "describe: values")
 * @param minLength smallest acceptable length (default 1)
 * @throws {AnalyticsInputError} when the sample is too short or holds NaN / ±Infinity / a non-number
 */
export function assertFiniteSample(values: ArrayLike<number>, label: string, minLength = 1): void {
  if (values === null || typeof values !== 'object' || typeof values.length !== 'number') {
    throw new AnalyticsInputError(`${label} must be an array of numbers`);
  }
  if (values.length < minLength) {
    throw new AnalyticsInputError(
      `${label} needs at least ${minLength} value${minLength === 1 ? '' : 's'}, got ${values.length}`,
    );
  }
  for (let i = 0; i < values.length; i++) {
    const value = values[i];
    if (typeof value !== 'number' || !Number.isFinite(value)) {
      throw new AnalyticsInputError(`${label}[${i}] must be a finite number, got ${String(value)}`);
    }
  }
}
