import { AnalyticsInputError } from './analytics-input-error';

/**
 * Checks that `value` is a count: a non-negative integer.
 *
 * @param value the count
 * @param label name used in the error message
 * @throws {AnalyticsInputError} when the value is negative, fractional, NaN or infinite
 */
export function assertCount(value: number, label: string): void {
  if (typeof value !== 'number' || !Number.isInteger(value) || value < 0) {
    throw new AnalyticsInputError(`${label} must be a non-negative integer, got ${String(value)}`);
  }
}
