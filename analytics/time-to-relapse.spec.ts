import { describe, expect, it } from 'vitest';
import type { AuditDataset } from '../shared/types/audit-dataset';
import { AnalyticsInputError } from './analytics-input-error';
import { SMALL_AUDIT, auditCase, siteRecord } from './small-audit-dataset.fixture';
import { timeToRelapse } from './time-to-relapse';

const OWNER = auditCase({ caseId: 1, patientId: 1, operatorId: 1, surgeryDate: '2024-01-01', procedure: 'gingivectomy', phenotype: 'thin', smoking: 'never' });

/** ISO date `days` after 2024-01-01. */
function dayAfterNewYear(days: number): string {
  return new Date(Date.UTC(2024, 0, 1 + days)).toISOString().slice(0, 10);
}

/** Sites each seen at the given days with the given rebounds (post-op 10 mm). */
function sitesWithVisits(sites: readonly (readonly { day: number; rebound: number; intervalKey?: string }[])[]): AuditDataset {
  const records = sites.flatMap((visits, s) =>
    visits.map(({ day, rebound, intervalKey = '6m' }) =>
      siteRecord(OWNER, { siteId: s + 1, intervalKey, visitDate: dayAfterNewYear(day), baselineRefGm: 8, postOpRefGm: 10, recallRefGm: 10 - rebound }),
    ),
  );
  return { ...SMALL_AUDIT, cases: [OWNER], records };
}

describe('timeToRelapse', () => {
  /*
   * Fixture: site 212 relapses at 6w (1.5 mm, day 42); site 112 at 6m (1.5 mm, day 182); 111, 121, 211, 311
   * are censored at day 182 (last rebound 0.5, 1.0, 1.0, 0.5: 1.0 mm is not > 1.0). Papilla sites have no
   * REF→GM recall and are left out. KM: day 42, 6 at risk, 1 event → 5/6 = 0.833333; day 182, 5 at risk
   * (events before censoring at ties), 1 event → 5/6 · 4/5 = 0.666667; never reaches 0.5 → median null.
   */
  it('fixture: events at the first relapse visit, censoring at the last recall (hand calculation above)', () => {
    const survival = timeToRelapse(SMALL_AUDIT);
    expect(survival).toMatchObject({ relapseThresholdMm: 1, nSites: 6, events: 2, censored: 4 });
    expect(survival.curve.steps.map((step) => [step.time, step.atRisk, step.events])).toEqual([[42, 6, 1], [182, 5, 1]]);
    expect(survival.curve.steps[0].survival).toBeCloseTo(5 / 6, 12);
    expect(survival.curve.steps[1].survival).toBeCloseTo(2 / 3, 12);
    expect(survival.curve.median).toBeNull();
  });

  it('takes the first relapse visit even if a later one is not a relapse, and counts unscheduled visits', () => {
    const survival = timeToRelapse(
      sitesWithVisits([
        // Rows out of date order: relapse at day 91 (the earliest relapse), though 120 is listed first and 182 is not one.
        [{ day: 182, rebound: 0.5 }, { day: 120, rebound: 1.5 }, { day: 91, rebound: 1.5 }],
        // Censored at the unscheduled day 270, its latest visit, though listed first.
        [{ day: 270, rebound: 0.5, intervalKey: '9m' }, { day: 42, rebound: 0 }],
      ]),
    );
    expect(survival.curve.steps.map((step) => [step.time, step.atRisk])).toEqual([[91, 2]]);
    // Censoring at day 270 (not 42) shows in the number at risk at an event between the two: 2, not 1.
    const between = timeToRelapse(sitesWithVisits([[{ day: 270, rebound: 0.5 }, { day: 42, rebound: 0 }], [{ day: 100, rebound: 2 }]]));
    expect(between.curve.steps.map((step) => [step.time, step.atRisk])).toEqual([[100, 2]]);
    expect(survival).toMatchObject({ events: 1, censored: 1 });
  });

  it('follows a lower relapse threshold (0.4 mm: 0.5 mm is now a relapse)', () => {
    const survival = timeToRelapse({ ...sitesWithVisits([[{ day: 42, rebound: 0.5 }]]), thresholds: { stable: 0.2, relapse: 0.4 } });
    expect(survival).toMatchObject({ relapseThresholdMm: 0.4, events: 1, censored: 0 });
  });

  /*
   * R survival `aml`, Maintained arm (REFERENCES.md A7), one site per subject, times as days:
   * 9, 13, 13+, 18, 23, 28+, 31, 34, 45+, 48, 161+ → S = 0.9091, 0.8182, 0.7159, 0.6136, 0.4909, 0.3682, 0.1841.
   */
  it('Kaplan–Meier composition reproduces the aml example', () => {
    const subjects: [number, boolean][] = [[9, true], [13, true], [13, false], [18, true], [23, true], [28, false], [31, true], [34, true], [45, false], [48, true], [161, false]];
    const survival = timeToRelapse(sitesWithVisits(subjects.map(([day, isEvent]) => [{ day, rebound: isEvent ? 1.5 : 0.5 }])));
    expect(survival).toMatchObject({ nSites: 11, events: 7, censored: 4 });
    expect(survival.curve.steps.map((step) => step.time)).toEqual([9, 13, 18, 23, 31, 34, 48]);
    [0.9091, 0.8182, 0.7159, 0.6136, 0.4909, 0.3682, 0.1841].forEach((value, i) => expect(survival.curve.steps[i].survival).toBeCloseTo(value, 4));
    expect(survival.curve.median).toBe(31);
  });

  it('no measured recall: an empty curve', () => {
    expect(timeToRelapse({ ...SMALL_AUDIT, records: [] })).toEqual({ relapseThresholdMm: 1, nSites: 0, events: 0, censored: 0, curve: { n: 0, steps: [], median: null } });
  });

  it('rejects a recall dated before surgery and an invalid date', () => {
    expect(() => timeToRelapse(sitesWithVisits([[{ day: -3, rebound: 0.5 }]]))).toThrow(/before its surgery/);
    const badDate = { ...SMALL_AUDIT, records: [{ ...SMALL_AUDIT.records[0], visitDate: '2024-02-31' }] };
    expect(() => timeToRelapse(badDate)).toThrow(AnalyticsInputError);
  });
});
