import { AnalyticsInputError } from './analytics-input-error';

/**
 * Checks at run time that a value is an array (JavaScript callers and parsed JSON
 * can pass anything). Takes `unknown` and returns void on purpose: unlike
 * `Array.isArray` it does not narrow the caller's typed readonly array to `any[]`.
 *
 * @param value the value to check
 * @param label name used in the error message
 * @throws {AnalyticsInputError} when the value is not an array
 */
export function assertArray(value: unknown, label: string): void {
  if (!Array.isArray(value)) throw new AnalyticsInputError(`${label} must be an array`);
}
