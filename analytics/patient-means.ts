import { AnalyticsInputError } from './analytics-input-error';
import { assertArray } from './assert-array';

/** One site's value, tagged with its patient. */
export interface PatientValue {
  readonly patientId: number;
  readonly value: number;
}

/**
 * Mean of each patient's values (DESIGN.md §3: sites of one patient are correlated,
 * so patient-level summaries use one value per patient): m_j = Σ_{i ∈ j} x_i / n_j.
 *
 * @param values site values tagged with their patient
 * @returns one mean per patient, in order of the patient's first appearance
 * @throws {AnalyticsInputError} when a value is not finite
 * @example
 * patientMeans([{ patientId: 1, value: 0.5 }, { patientId: 2, value: 2 }, { patientId: 1, value: 1.5 }]); // [1, 2]
 */
export function patientMeans(values: readonly PatientValue[]): number[] {
  assertArray(values, 'patientMeans: values');
  const sums = new Map<number, { sum: number; count: number }>();
  values.forEach(({ patientId, value }, i) => {
    if (typeof value !== 'number' || !Number.isFinite(value)) {
      throw new AnalyticsInputError(`patientMeans: values[${i}].value must be a finite number, got ${String(value)}`);
    }
    const tally = sums.get(patientId) ?? { sum: 0, count: 0 };
    tally.sum += value;
    tally.count++;
    sums.set(patientId, tally);
  });
  return [...sums.values()].map(({ sum, count }) => sum / count);
}
