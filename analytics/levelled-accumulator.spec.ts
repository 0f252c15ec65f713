import { describe, expect, it } from 'vitest';
import { LevelledAccumulator } from './levelled-accumulator';

describe('LevelledAccumulator', () => {
  it('describes sites and the mean of each patient', () => {
    // Computed (hand calculation): patient 0 has sites 1 and 3 (mean 2), patient 1 has site 6.
    // Site level: 1, 3, 6 → n 3, mean 10/3. Patient level: 2, 6 → n 2, mean 4.
    const accumulator = new LevelledAccumulator();
    accumulator.add(1, 0);
    accumulator.add(6, 1);
    accumulator.add(3, 0);
    const summary = accumulator.summarise(2);
    expect(summary.nSites).toBe(3);
    expect(summary.nPatients).toBe(2);
    expect(summary.site?.mean).toBeCloseTo(10 / 3, 12);
    expect(summary.patient?.mean).toBe(4);
    expect(summary.patient?.min).toBe(2);
  });

  it('grows past its initial capacity without losing values', () => {
    // Computed (hand calculation): 0 + 1 + … + 4999 = 12,497,500 → mean 2499.5; patients i mod 10.
    const accumulator = new LevelledAccumulator();
    for (let i = 0; i < 5000; i++) accumulator.add(i, i % 10);
    const summary = accumulator.summarise(10);
    expect(summary).toMatchObject({ nSites: 5000, nPatients: 10 });
    expect(summary.site?.mean).toBe(2499.5);
    expect(summary.site?.max).toBe(4999);
  });

  it('gives nulls when nothing was added', () => {
    expect(new LevelledAccumulator().summarise(5)).toEqual({ nSites: 0, nPatients: 0, site: null, patient: null });
  });
});
