import { describe, expect, it } from 'vitest';
import type { AuditCaseRecord, AuditDataset } from '../shared/types/audit-dataset';
import { AnalyticsInputError } from './analytics-input-error';
import { compareStandard } from './compare-standard';
import { SMALL_AUDIT, auditCase, auditStandard, siteRecord } from './small-audit-dataset.fixture';

/** One patient per value, each with one site whose 6m rebound is that value (post-op 10 mm). */
function patientsWithRebounds(rebounds: readonly number[]): AuditDataset {
  const cases = rebounds.map((_, i) => auditCase({ caseId: i + 1, patientId: i + 1, operatorId: 1, surgeryDate: '2024-01-01', procedure: 'gingivectomy', phenotype: 'thin', smoking: 'never' }));
  const records = rebounds.map((value, i) =>
    siteRecord(cases[i], { siteId: i + 1, intervalKey: '6m', visitDate: '2024-07-01', baselineRefGm: 8, postOpRefGm: 10, recallRefGm: 10 - value }),
  );
  return { ...SMALL_AUDIT, cases, records };
}

/** `n` cases, the first `events` with a grade II complication. */
function casesWithComplications(events: number, n: number): AuditDataset {
  const cases: AuditCaseRecord[] = Array.from({ length: n }, (_, i) =>
    auditCase({
      caseId: i + 1, patientId: i + 1, operatorId: 1, surgeryDate: '2024-01-01', procedure: 'gingivectomy', phenotype: 'thin', smoking: 'never',
      complications: i < events ? [{ type: 'infection', grade: 'II' }] : [],
    }),
  );
  return { ...SMALL_AUDIT, records: [], cases };
}

const MEAN_REBOUND = auditStandard({ metric: 'mean-rebound', intervalKey: '6m', comparator: '<=', target: 0.8, criterion: 'Mean rebound at 6 months' });
const COMPLICATIONS = auditStandard({ metric: 'share-cases-complication-grade', minGrade: 'II', comparator: '<=', target: 10 });

describe('compareStandard', () => {
  /*
   * R `sleep` data (Cushny & Peebles 1905; REFERENCES.md A3) as per-patient rebounds: first cycle = group 2,
   * re-audit = group 1. welchTTest(second, first) is R's t.test(extra ~ group): difference −1.58,
   * 95% CI −3.3654832 to 0.2054832, p = 0.07939.
   */
  it('means: Welch t-test on per-patient values, second − first (R sleep data)', () => {
    const group1 = [0.7, -1.6, -0.2, -1.2, -0.1, 3.4, 3.7, 0.8, 0.0, 2.0];
    const group2 = [1.9, 0.8, 1.1, 0.1, -0.1, 4.4, 5.5, 1.6, 4.6, 3.4];
    const comparison = compareStandard(MEAN_REBOUND, patientsWithRebounds(group2), patientsWithRebounds(group1));
    expect(comparison).toMatchObject({ criterion: 'Mean rebound at 6 months', metric: 'mean-rebound', unit: 'mm', test: 'welch-t', isBeyondChance: false });
    expect(comparison.first?.value).toBeCloseTo(2.33, 10);
    expect(comparison.second?.value).toBeCloseTo(0.75, 10);
    expect(comparison.difference).toBeCloseTo(-1.58, 10);
    expect(comparison.ci95?.[0]).toBeCloseTo(-3.3654832, 6);
    expect(comparison.ci95?.[1]).toBeCloseTo(0.2054832, 6);
    expect(comparison.p).toBeCloseTo(0.07939, 5);
    // Verdicts against "≤ 0.8 mm" (t(0.975, 9) = 2.262157): group 2, SD 2.00225, SE 0.633166 → 2.33 ± 1.432330 =
    // 0.8977 to 3.7623, all above 0.8 (not met); group 1, SD 1.789010, SE 0.565735 → 0.75 ± 1.279781 straddles it.
    expect([comparison.firstVerdict, comparison.secondVerdict]).toEqual(['not-met', 'inconclusive']);
  });

  /*
   * Newcombe 1998 Table II example (a) as complication shares: re-audit 56/70 = 80 %, first 48/80 = 60 %:
   * difference +20 percentage points, method 10 interval 5.24 to 33.39. Fisher's exact test on
   * [[56, 14], [48, 32]]: p = 0.012521 (computed: scipy.stats.fisher_exact, and the exact hypergeometric sum).
   */
  it('shares: difference in percentage points with the Newcombe interval and Fisher’s exact p', () => {
    const comparison = compareStandard(COMPLICATIONS, casesWithComplications(48, 80), casesWithComplications(56, 70));
    expect(comparison).toMatchObject({ unit: '%', test: 'fisher-exact', isBeyondChance: true, first: { count: 48, n: 80 }, second: { count: 56, n: 70 } });
    expect(comparison.difference).toBeCloseTo(20, 10);
    expect(comparison.ci95?.[0]).toBeCloseTo(5.24, 2);
    expect(comparison.ci95?.[1]).toBeCloseTo(33.39, 2);
    expect(comparison.p).toBeCloseTo(0.012521, 6);
  });

  it('the same data twice: no difference, p = 1', () => {
    const comparison = compareStandard(COMPLICATIONS, casesWithComplications(3, 10), casesWithComplications(3, 10));
    expect(comparison.difference).toBe(0);
    expect(comparison.p).toBeCloseTo(1, 12);
    expect(comparison.isBeyondChance).toBe(false);
  });

  it('nulls when either cycle has no data, keeping the other’s value and verdict', () => {
    const comparison = compareStandard(COMPLICATIONS, casesWithComplications(1, 5), casesWithComplications(0, 0));
    expect(comparison).toMatchObject({ second: null, secondVerdict: 'no-data', difference: null, ci95: null, test: null, p: null, isBeyondChance: null });
    expect(comparison.first).toMatchObject({ count: 1, n: 5 });
  });

  it('means with no spread in either cycle: the difference without a test', () => {
    const comparison = compareStandard(MEAN_REBOUND, patientsWithRebounds([0.5, 0.5]), patientsWithRebounds([1, 1, 1]));
    expect(comparison.difference).toBeCloseTo(0.5, 12);
    expect(comparison).toMatchObject({ ci95: null, test: null, p: null, isBeyondChance: null });
  });

  it('rejects what standardResult rejects (an unknown interval)', () => {
    expect(() => compareStandard({ ...MEAN_REBOUND, intervalKey: '9m' }, SMALL_AUDIT, SMALL_AUDIT)).toThrow(AnalyticsInputError);
  });
});
