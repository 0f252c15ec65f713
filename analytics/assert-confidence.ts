import { AnalyticsInputError } from './analytics-input-error';

/**
 * Checks that a confidence level lies strictly between 0 and 1 (0.95, not 95).
 *
 * @param confidence the confidence level
 * @param label name used in the error message
 * @throws {AnalyticsInputError} when outside (0, 1) or not a number
 */
export function assertConfidence(confidence: number, label: string): void {
  if (typeof confidence !== 'number' || !(confidence > 0 && confidence < 1)) {
    throw new AnalyticsInputError(`${label} must be between 0 and 1 (e.g. 0.95), got ${String(confidence)}`);
  }
}
