import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { CaseOutcome, OutcomeRecord } from '../shared/types/outcome-record';
import { DEFAULT_RECALL_SCHEDULE } from '../shared/types/recall-schedule';
import { AnalyticsInputError } from './analytics-input-error';
import { summariseOutcomes } from './summarise-outcomes';

type Measurements = Pick<
  OutcomeRecord,
  'caseId' | 'patientId' | 'siteId' | 'baselineRefGm' | 'postOpRefGm' | 'baselinePapilla' | 'intervalKey' | 'recallRefGm' | 'recallPapilla'
>;

function record(measurements: Measurements): OutcomeRecord {
  return {
    operatorId: 1,
    phenotype: 'thick',
    procedure: 'apically positioned flap with osseous recontouring',
    indication: 'aesthetic',
    smoking: 'never',
    surgeryDate: '2024-01-10',
    tooth: 11,
    location: measurements.baselinePapilla === null ? 'mid-facial' : 'mesial-papilla',
    visitDate: '2024-07-20',
    bleedingOnProbing: false,
    ...measurements,
  };
}

/*
 * Invented test cohort (not demo data), worked by hand.
 * Patient 1 (case 101): site 1001 baseline 8 → post-op 10.5 (gain 2.5); site 1002 7 → 9 (gain 2);
 *   site 1003 is a papilla site (no REF→GM after surgery), papilla 3 at baseline.
 * Patient 2 (case 102): site 2001 9 → 9 (gain 0).
 * 6 weeks: 1001 recall 10 → rebound 0.5, retained 2, 80%; 1002 not measured; 2001 recall 9 → rebound 0,
 *   retained 0, % undefined; 1003 papilla 2 (−1, worse).
 * 6 months: 1001 recall 9.5 → rebound 1.0 (minor), retained 1.5, 60%; 1002 recall 9.5 → rebound −0.5
 *   (stable, flagged), retained 2.5, 125%; 2001 recall 7.5 → rebound 1.5 (relapse), retained −1.5;
 *   1003 papilla 3 (unchanged).
 *   Rebound, site level: 1.0, −0.5, 1.5 → mean 2/3; deviations 1/3, −7/6, 5/6 → SS 13/6 → SD √(13/12) = 1.040833.
 *   Rebound, patient level: patient 1 (1.0 − 0.5)/2 = 0.25, patient 2 1.5 → mean 0.875.
 *   Retained, site: 1.5, 2.5, −1.5 → mean 5/6; patient: 2.0, −1.5 → mean 0.25.
 *   % retained, site: 60, 125 → mean 92.5 (2001 excluded, gain 0); patient: only patient 1 (92.5).
 * One row at an interval outside the schedule ('9m') is counted and ignored.
 */
const RECORDS: OutcomeRecord[] = [
  record({ caseId: 101, patientId: 1, siteId: 1001, baselineRefGm: 8, postOpRefGm: 10.5, baselinePapilla: null, intervalKey: '6w', recallRefGm: 10, recallPapilla: null }),
  record({ caseId: 101, patientId: 1, siteId: 1002, baselineRefGm: 7, postOpRefGm: 9, baselinePapilla: null, intervalKey: '6w', recallRefGm: null, recallPapilla: null }),
  record({ caseId: 101, patientId: 1, siteId: 1003, baselineRefGm: 6, postOpRefGm: null, baselinePapilla: 3, intervalKey: '6w', recallRefGm: null, recallPapilla: 2 }),
  record({ caseId: 102, patientId: 2, siteId: 2001, baselineRefGm: 9, postOpRefGm: 9, baselinePapilla: null, intervalKey: '6w', recallRefGm: 9, recallPapilla: null }),
  record({ caseId: 101, patientId: 1, siteId: 1001, baselineRefGm: 8, postOpRefGm: 10.5, baselinePapilla: null, intervalKey: '6m', recallRefGm: 9.5, recallPapilla: null }),
  record({ caseId: 101, patientId: 1, siteId: 1002, baselineRefGm: 7, postOpRefGm: 9, baselinePapilla: null, intervalKey: '6m', recallRefGm: 9.5, recallPapilla: null }),
  record({ caseId: 101, patientId: 1, siteId: 1003, baselineRefGm: 6, postOpRefGm: null, baselinePapilla: 3, intervalKey: '6m', recallRefGm: null, recallPapilla: 3 }),
  record({ caseId: 102, patientId: 2, siteId: 2001, baselineRefGm: 9, postOpRefGm: 9, baselinePapilla: null, intervalKey: '6m', recallRefGm: 7.5, recallPapilla: null }),
  record({ caseId: 102, patientId: 2, siteId: 2001, baselineRefGm: 9, postOpRefGm: 9, baselinePapilla: null, intervalKey: '9m', recallRefGm: 7.5, recallPapilla: null }),
];

const CASES: CaseOutcome[] = [
  { caseId: 101, patientId: 1, operatorId: 1, surgeryDate: '2024-01-10', isWithdrawn: false, complications: [{ type: 'bleeding', grade: 'I' }], visits: [{ intervalKey: '6w', visitDate: '2024-02-21' }, { intervalKey: '6m', visitDate: '2024-07-20' }] },
  { caseId: 102, patientId: 2, operatorId: 1, surgeryDate: '2024-01-10', isWithdrawn: false, complications: [], visits: [{ intervalKey: '6w', visitDate: '2024-02-21' }, { intervalKey: '6m', visitDate: '2024-07-20' }] },
];

const OPTIONS = { cases: CASES, schedule: DEFAULT_RECALL_SCHEDULE, asOf: '2024-09-01' };

describe('summariseOutcomes', () => {
  const summary = summariseOutcomes(RECORDS, OPTIONS);
  const sixWeeks = summary.intervals[1];
  const sixMonths = summary.intervals[3];

  it('counts rows, sites and patients; ignores unscheduled rows', () => {
    expect(summary).toMatchObject({ asOf: '2024-09-01', nRecords: 9, nUnscheduledRecords: 1, nSites: 4, nPatients: 2 });
    expect(summary.intervals.map((interval) => interval.intervalKey)).toEqual(['2w', '6w', '3m', '6m', '12m']);
  });

  it('6 months, rebound: site level and patient level (hand calculation above)', () => {
    expect(sixMonths).toMatchObject({ nRecords: 4, nSites: 3, nPatients: 2 });
    expect(sixMonths.rebound.site?.mean).toBeCloseTo(2 / 3, 12);
    expect(sixMonths.rebound.site?.sd).toBeCloseTo(1.040833, 6);
    expect(sixMonths.rebound.site?.median).toBe(1);
    expect(sixMonths.rebound.patient?.n).toBe(2);
    expect(sixMonths.rebound.patient?.mean).toBeCloseTo(0.875, 12);
  });

  it('6 months, retained gain and % retained (zero-gain site left out of %)', () => {
    expect(sixMonths.retainedGain.site?.mean).toBeCloseTo(5 / 6, 12);
    expect(sixMonths.retainedGain.patient?.mean).toBeCloseTo(0.25, 12);
    expect(sixMonths.percentRetained).toMatchObject({ nSites: 2, nPatients: 1 });
    expect(sixMonths.percentRetained.site?.mean).toBeCloseTo(92.5, 12);
    expect(sixMonths.percentRetained.patient).toMatchObject({ n: 1, mean: 92.5, sd: null });
  });

  it('6 months, stability shares with Wilson intervals and the negative-rebound flag', () => {
    const { stable, minor, relapse, flaggedForReview, thresholds } = sixMonths.stability;
    expect(thresholds).toEqual({ stable: 0.5, relapse: 1 });
    expect([stable.count, minor.count, relapse.count, flaggedForReview.count]).toEqual([1, 1, 1, 1]);
    expect(stable.n).toBe(3);
    expect(stable.p).toBeCloseTo(1 / 3, 12);
    expect(stable.lower).toBeGreaterThan(0);
    expect(stable.upper).toBeLessThan(1);
  });

  it('papilla: distribution at the interval and change from baseline', () => {
    expect(sixWeeks.papilla).toMatchObject({ nSites: 1, nPatients: 1, improved: 0, unchanged: 0, worsened: 1 });
    expect(sixWeeks.papilla.distribution.map((d) => d.estimate.count)).toEqual([0, 0, 1, 0, 0]);
    expect(sixWeeks.papilla.change.site?.mean).toBe(-1);
    expect(sixMonths.papilla).toMatchObject({ unchanged: 1 });
    expect(sixMonths.papilla.score.site).toMatchObject({ n: 1, mean: 3 });
  });

  it('6 weeks: unmeasured sites are left out, zero rebound is stable', () => {
    expect(sixWeeks).toMatchObject({ nRecords: 4, nSites: 2, nPatients: 2 });
    expect(sixWeeks.rebound.site?.mean).toBeCloseTo(0.25, 12);
    expect(sixWeeks.stability.stable.count).toBe(2);
    expect(sixWeeks.percentRetained.site).toMatchObject({ n: 1, mean: 80 });
  });

  it('intervals without rows give empty summaries, not errors', () => {
    const twoWeeks = summary.intervals[0];
    expect(twoWeeks).toMatchObject({ nRecords: 0, nSites: 0, nPatients: 0 });
    expect(twoWeeks.rebound).toEqual({ nSites: 0, nPatients: 0, site: null, patient: null });
    expect(twoWeeks.stability.stable).toEqual({ count: 0, n: 0, p: null, lower: null, upper: null });
  });

  it('includes complications and recall completion', () => {
    expect(summary.complications.casesWithComplication).toMatchObject({ count: 1, n: 2 });
    expect(summary.recall.intervals[1]).toMatchObject({ intervalKey: '6w', seenInWindow: 2 });
  });

  it('applies audit-specific thresholds', () => {
    const strict = summariseOutcomes(RECORDS, { ...OPTIONS, thresholds: { stable: 0, relapse: 0.5 } });
    const { stable, minor, relapse } = strict.intervals[3].stability;
    expect([stable.count, minor.count, relapse.count]).toEqual([1, 0, 2]);
  });

  it('accepts any iterable, read once (e.g. rows mapped from a database cursor)', () => {
    function* stream(): Generator<OutcomeRecord> {
      yield* RECORDS;
    }
    expect(summariseOutcomes(stream(), OPTIONS)).toEqual(summary);
  });

  it('no records: an empty but complete summary', () => {
    const empty = summariseOutcomes([], { ...OPTIONS, cases: [] });
    expect(empty).toMatchObject({ nRecords: 0, nSites: 0, nPatients: 0 });
    expect(empty.intervals).toHaveLength(5);
  });

  it('throws on an implausible row, naming it, and on bad options', () => {
    const negative = [...RECORDS, { ...RECORDS[0], recallRefGm: -1 }];
    expect(() => summariseOutcomes(negative, OPTIONS)).toThrow(/records\[9\] recallRefGm must be null or 0–20 mm/);
    const notANumber = [{ ...RECORDS[0], baselineRefGm: Number.NaN }];
    expect(() => summariseOutcomes(notANumber, OPTIONS)).toThrow(AnalyticsInputError);
    const badPapilla = [{ ...RECORDS[2], recallPapilla: 5 }];
    expect(() => summariseOutcomes(badPapilla, OPTIONS)).toThrow(/recallPapilla/);
    expect(() => summariseOutcomes(RECORDS, { ...OPTIONS, asOf: 'yesterday' })).toThrow(/asOf/);
    expect(() => summariseOutcomes(RECORDS, { ...OPTIONS, thresholds: { stable: 2, relapse: 1 } })).toThrow(/stable ≤ relapse/);
    expect(() => summariseOutcomes(JSON.parse('{"length":0}'), OPTIONS)).toThrow(/iterable/);
    expect(() => summariseOutcomes(JSON.parse('[null]'), OPTIONS)).toThrow(/records\[0\] must be a record object/);
  });

  it('properties: classes add up to nSites, patients ≤ sites, mean rebound + mean retained = mean gain', () => {
    const halfMm = fc.integer({ min: 0, max: 40 }).map((steps) => steps / 2);
    const site = fc.record({
      patientId: fc.integer({ min: 1, max: 8 }),
      baseline: halfMm,
      postOp: halfMm,
      recall: fc.option(halfMm, { nil: null }),
      intervalKey: fc.constantFrom('2w', '6w', '6m'),
    });
    fc.assert(
      fc.property(fc.array(site, { maxLength: 60 }), (sites) => {
        const records = sites.map((s, i) =>
          record({
            caseId: s.patientId, patientId: s.patientId, siteId: i, baselineRefGm: s.baseline, postOpRefGm: s.postOp,
            baselinePapilla: null, intervalKey: s.intervalKey, recallRefGm: s.recall, recallPapilla: null,
          }),
        );
        const result = summariseOutcomes(records, { ...OPTIONS, cases: [] });
        return result.intervals.every((interval) => {
          const { stable, minor, relapse } = interval.stability;
          if (stable.count + minor.count + relapse.count !== interval.nSites) return false;
          if (interval.nPatients > interval.nSites) return false;
          if (interval.nSites === 0) return interval.rebound.site === null;
          const measured = sites.filter((s) => s.intervalKey === interval.intervalKey && s.recall !== null);
          const meanGain = measured.reduce((sum, s) => sum + (s.postOp - s.baseline), 0) / measured.length;
          const meanRebound = interval.rebound.site?.mean ?? Number.NaN;
          const meanRetained = interval.retainedGain.site?.mean ?? Number.NaN;
          return Math.abs(meanRebound + meanRetained - meanGain) < 1e-9;
        });
      }),
    );
  });
});
