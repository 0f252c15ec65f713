import { describe, expect, it } from 'vitest';
import { LevelledAccumulator } from './levelled-accumulator';

describe('LevelledAccumulator', () => {
  it('describes sites and the mean of each patient', () => {
    // Computed (hand calculation): patient 0 has sites 1 and 3 (mean 2), patient 1 has site 6.
    // Site level: 1, 3, 6 → n 3, mean 10/3. Patient level: 2, 6 → n 2, mean 4.
    const accumulator = new LevelledAccumulator(3, 2);
    accumulator.add(1, 0);
    accumulator.add(6, 1);
    accumulator.add(3, 0);
    const summary = accumulator.summarise();
    expect(summary.nSites).toBe(3);
    expect(summary.nPatients).toBe(2);
    expect(summary.site?.mean).toBeCloseTo(10 / 3, 12);
    expect(summary.patient?.mean).toBe(4);
    expect(summary.patient?.min).toBe(2);
  });

  it('gives nulls when nothing was added', () => {
    expect(new LevelledAccumulator(0, 5).summarise()).toEqual({ nSites: 0, nPatients: 0, site: null, patient: null });
  });
});
