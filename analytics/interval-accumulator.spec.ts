import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { OutcomeRecord } from '../shared/types/outcome-record';
import { IntervalAccumulator } from './interval-accumulator';
import { stabilityClass } from './stability-class';

const SIX_MONTHS = { key: '6m', label: '6 months', targetDays: 182, windowBeforeDays: 21, windowAfterDays: 30 };

function site(baselineRefGm: number, postOpRefGm: number | null, recallRefGm: number | null, papilla: [number, number] | null = null): OutcomeRecord {
  return {
    caseId: 1, patientId: 1, operatorId: 1, phenotype: 'thin', procedure: 'gingivectomy', indication: 'aesthetic',
    smoking: null, surgeryDate: '2024-01-10', siteId: 1, tooth: 21, location: papilla ? 'distal-papilla' : 'mid-facial',
    baselineRefGm, postOpRefGm, baselinePapilla: papilla ? papilla[0] : null, intervalKey: '6m', visitDate: '2024-07-10',
    recallRefGm, recallPapilla: papilla ? papilla[1] : null, bleedingOnProbing: null,
  };
}

describe('IntervalAccumulator', () => {
  it('adds margin and papilla outcomes of one interval', () => {
    // Computed (hand calculation), DESIGN.md §3 conventions:
    // patient 0: baseline 8, post-op 10, recall 9 → rebound 1 (minor), retained 1, 50%;
    // patient 1: baseline 6, post-op 8, recall 8.5 → rebound −0.5 (stable, flagged), retained 2.5, 125%;
    // patient 1: post-op missing → no margin outcome; papilla 1 → 3 (improved).
    const accumulator = new IntervalAccumulator(SIX_MONTHS, { stable: 0.5, relapse: 1 });
    accumulator.add(site(8, 10, 9), 0);
    accumulator.add(site(6, 8, 8.5), 1);
    accumulator.add(site(7, null, 7, [1, 3]), 1);
    const summary = accumulator.summarise(2);
    expect(summary).toMatchObject({ intervalKey: '6m', nRecords: 3, nSites: 2, nPatients: 2 });
    expect(summary.rebound.site?.mean).toBe(0.25);
    expect(summary.percentRetained.site?.mean).toBe(87.5);
    expect(summary.stability.minor.count).toBe(1);
    expect(summary.stability.flaggedForReview.count).toBe(1);
    expect(summary.papilla).toMatchObject({ nSites: 1, nPatients: 1, improved: 1 });
    expect(summary.papilla.distribution[3].estimate).toMatchObject({ count: 1, n: 1, p: 1 });
  });

  it('property: classifies every site exactly as stabilityClass does', () => {
    const tenthMm = fc.integer({ min: 0, max: 200 }).map((tenths) => tenths / 10);
    const thresholds = fc
      .tuple(fc.integer({ min: 0, max: 20 }), fc.integer({ min: 0, max: 20 }))
      .map(([a, b]) => ({ stable: Math.min(a, b) / 10, relapse: Math.max(a, b) / 10 }));
    fc.assert(
      fc.property(fc.array(fc.tuple(tenthMm, tenthMm), { minLength: 1, maxLength: 40 }), thresholds, (pairs, limits) => {
        const accumulator = new IntervalAccumulator(SIX_MONTHS, limits);
        const expected = { stable: 0, minor: 0, relapse: 0 };
        for (const [postOp, recall] of pairs) {
          accumulator.add(site(0, postOp, recall), 0);
          expected[stabilityClass(postOp - recall, limits)]++;
        }
        const { stable, minor, relapse } = accumulator.summarise(1).stability;
        return stable.count === expected.stable && minor.count === expected.minor && relapse.count === expected.relapse;
      }),
    );
  });
});
