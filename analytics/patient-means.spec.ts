import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { AnalyticsInputError } from './analytics-input-error';
import { patientMeans } from './patient-means';

describe('patientMeans', () => {
  it('averages each patient’s values, in order of first appearance (hand: (0.5 + 1.5)/2 = 1; 2)', () => {
    expect(patientMeans([{ patientId: 4, value: 0.5 }, { patientId: 2, value: 2 }, { patientId: 4, value: 1.5 }])).toEqual([1, 2]);
  });

  it('gives one mean per patient, each between that patient’s min and max (property)', () => {
    fc.assert(
      fc.property(fc.array(fc.record({ patientId: fc.integer({ min: 1, max: 5 }), value: fc.double({ min: -20, max: 20, noNaN: true }) })), (values) => {
        const means = patientMeans(values);
        const patients = [...new Set(values.map((entry) => entry.patientId))];
        expect(means).toHaveLength(patients.length);
        patients.forEach((patientId, j) => {
          const own = values.filter((entry) => entry.patientId === patientId).map((entry) => entry.value);
          expect(means[j]).toBeGreaterThanOrEqual(Math.min(...own) - 1e-9);
          expect(means[j]).toBeLessThanOrEqual(Math.max(...own) + 1e-9);
        });
      }),
    );
  });

  it('rejects a non-finite value', () => {
    expect(() => patientMeans([{ patientId: 1, value: Number.NaN }])).toThrow(AnalyticsInputError);
  });
});
