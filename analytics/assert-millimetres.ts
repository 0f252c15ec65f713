import { AnalyticsInputError } from './analytics-input-error';

/** Largest plausible REF→GM distance in mm (DESIGN.md §3). */
export const MAX_PLAUSIBLE_MM = 20;

/**
 * Checks that a REF→GM measurement is a finite number of millimetres in the
 * plausible range 0–20 mm (DESIGN.md §3).
 *
 * @param value the measurement in mm
 * @param label name used in the error message (e.g. "baseline REF→GM")
 * @throws {AnalyticsInputError} when NaN, infinite, negative or above 20 mm
 */
export function assertMillimetres(value: number, label: string): void {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new AnalyticsInputError(`${label} must be a finite number of millimetres, got ${String(value)}`);
  }
  if (value < 0 || value > MAX_PLAUSIBLE_MM) {
    throw new AnalyticsInputError(`${label} must lie between 0 and ${MAX_PLAUSIBLE_MM} mm, got ${value}`);
  }
}
