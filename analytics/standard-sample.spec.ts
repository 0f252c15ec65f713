import { describe, expect, it } from 'vitest';
import type { RecallInterval } from '../shared/types/outcome-record';
import { AnalyticsInputError } from './analytics-input-error';
import { standardSample } from './standard-sample';
import { SMALL_AUDIT, auditCase, auditStandard } from './small-audit-dataset.fixture';

/*
 * Hand calculations from the fixture table (small-audit-dataset.fixture.ts).
 * Rebound at 6m per site: 111 0.5, 112 1.5, 121 1.0 (patient 1); 211 1.0, 212 2.0 (patient 2); 311 0.5 (patient 3).
 *   Patient means: (0.5 + 1.5 + 1.0)/3 = 1.0; (1.0 + 2.0)/2 = 1.5; 0.5.
 * Papilla change at 6m (recall − baseline): 113 −1 (patient 1); 213 +1, 214 0 (patient 2); 313 0 (patient 3).
 *   Patient means: −1, 0.5, 0.
 */
describe('standardSample', () => {
  it('mean-rebound: one mean rebound per patient', () => {
    expect(standardSample(auditStandard({ metric: 'mean-rebound', intervalKey: '6m' }), SMALL_AUDIT, 'test')).toEqual({ kind: 'mean', values: [1, 1.5, 0.5] });
  });

  it('mean-papilla-change: one mean change per patient', () => {
    expect(standardSample(auditStandard({ metric: 'mean-papilla-change', intervalKey: '6m' }), SMALL_AUDIT, 'test')).toEqual({ kind: 'mean', values: [-1, 0.5, 0] });
  });

  it('share-sites-rebound-within: ≤ the limit counts (1.0 mm: 0.5, 1.0, 1.0, 0.5 → 4 of 6; 0.5 mm: 2 of 6)', () => {
    const within = (thresholdMm: number) => standardSample(auditStandard({ metric: 'share-sites-rebound-within', intervalKey: '6m', thresholdMm }), SMALL_AUDIT, 'test');
    expect(within(1)).toEqual({ kind: 'share', count: 4, n: 6 });
    expect(within(0.5)).toEqual({ kind: 'share', count: 2, n: 6 });
  });

  it('share-cases-complication-grade: Clavien–Dindo order I < II < IIIa … (≥ I: cases 11, 21; ≥ II: case 21; ≥ IIIa: none; of 5 cases)', () => {
    const grade = (minGrade: 'I' | 'II' | 'IIIa') => standardSample(auditStandard({ metric: 'share-cases-complication-grade', minGrade }), SMALL_AUDIT, 'test');
    expect(grade('I')).toEqual({ kind: 'share', count: 2, n: 5 });
    expect(grade('II')).toEqual({ kind: 'share', count: 1, n: 5 });
    expect(grade('IIIa')).toEqual({ kind: 'share', count: 0, n: 5 });
  });

  it('recall-completion: 6w seen by cases 11 and 21, missed by 12 and 31, withdrawn 41 excluded → 2 of 4; 6m all 4 seen', () => {
    const completion = (intervalKey: string) => standardSample(auditStandard({ metric: 'recall-completion', intervalKey }), SMALL_AUDIT, 'test');
    expect(completion('6w')).toEqual({ kind: 'share', count: 2, n: 4 });
    expect(completion('6m')).toEqual({ kind: 'share', count: 4, n: 4 });
  });

  it('share-cases-bleeding-under: strictly under the limit, among cases with a score (8, 12, 25, 5 → 2 of 4 under 10; 8 is not under 8)', () => {
    const under = (thresholdPct: number) => standardSample(auditStandard({ metric: 'share-cases-bleeding-under', thresholdPct }), SMALL_AUDIT, 'test');
    expect(under(10)).toEqual({ kind: 'share', count: 2, n: 4 });
    expect(under(8)).toEqual({ kind: 'share', count: 1, n: 4 });
  });

  it('share-cases-impression-after-6w: 46 d and 57 d count, 34 d does not → 2 of 3 cases with a date', () => {
    expect(standardSample(auditStandard({ metric: 'share-cases-impression-after-6w' }), SMALL_AUDIT, 'test')).toEqual({ kind: 'share', count: 2, n: 3 });
  });

  it('share-cases-impression-after-6w: exactly 42 days counts, 41 does not (2024-01-01 + 42 d = 2024-02-12)', () => {
    const onNewYear = (caseId: number, finalImpressionDate: string) =>
      auditCase({ caseId, patientId: caseId, operatorId: 1, surgeryDate: '2024-01-01', procedure: 'gingivectomy', phenotype: 'thin', smoking: 'never', finalImpressionDate });
    const cases = [onNewYear(1, '2024-02-12'), onNewYear(2, '2024-02-11')];
    expect(standardSample(auditStandard({ metric: 'share-cases-impression-after-6w' }), { ...SMALL_AUDIT, cases }, 'test')).toEqual({ kind: 'share', count: 1, n: 2 });
  });

  it('share-patients-pain-over-7: per patient, worst score at the first recall (P1 max(8, 5) = 8 > 7; P2 7 is not; P3 3 → 1 of 3)', () => {
    expect(standardSample(auditStandard({ metric: 'share-patients-pain-over-7' }), SMALL_AUDIT, 'test')).toEqual({ kind: 'share', count: 1, n: 3 });
  });

  it('share-patients-pain-over-7: the first recall is the one with the smallest target day, whatever the schedule order', () => {
    const reversed: RecallInterval[] = [...SMALL_AUDIT.schedule].reverse();
    const cases = SMALL_AUDIT.cases.map((outcome) => ({ ...outcome, painByInterval: { ...outcome.painByInterval, '12m': 9 } }));
    // Still read at 2w: a 12m score of 9 for everyone would otherwise give 3 of 3.
    expect(standardSample(auditStandard({ metric: 'share-patients-pain-over-7' }), { ...SMALL_AUDIT, schedule: reversed, cases }, 'test')).toEqual({ kind: 'share', count: 1, n: 3 });
  });

  it('rejects an unknown metric, missing parameters and an unknown interval', () => {
    // As a JavaScript caller or parsed JSON could send it.
    const unknownMetric = { ...auditStandard({ metric: 'mean-rebound', intervalKey: '6m' }), metric: JSON.parse('"median-rebound"') };
    expect(() => standardSample(unknownMetric, SMALL_AUDIT, 'standardResult')).toThrow("standardResult: unknown metric 'median-rebound'");
    expect(() => standardSample(auditStandard({ metric: 'mean-rebound' }), SMALL_AUDIT, 'test')).toThrow(/needs a recall interval/);
    expect(() => standardSample(auditStandard({ metric: 'mean-rebound', intervalKey: '9m' }), SMALL_AUDIT, 'test')).toThrow(/unknown interval key '9m'/);
    expect(() => standardSample(auditStandard({ metric: 'share-sites-rebound-within', intervalKey: '6m' }), SMALL_AUDIT, 'test')).toThrow(/thresholdMm/);
    expect(() => standardSample(auditStandard({ metric: 'share-cases-bleeding-under' }), SMALL_AUDIT, 'test')).toThrow(/thresholdPct/);
    expect(() => standardSample(auditStandard({ metric: 'share-cases-complication-grade' }), SMALL_AUDIT, 'test')).toThrow(/minGrade/);
  });

  it('rejects implausible case values', () => {
    const painful = { ...SMALL_AUDIT, cases: SMALL_AUDIT.cases.map((outcome) => ({ ...outcome, painByInterval: { '2w': 11 } })) };
    expect(() => standardSample(auditStandard({ metric: 'share-patients-pain-over-7' }), painful, 'test')).toThrow(AnalyticsInputError);
    const bleeding = { ...SMALL_AUDIT, cases: SMALL_AUDIT.cases.map((outcome) => ({ ...outcome, bleedingScorePct: 120 })) };
    expect(() => standardSample(auditStandard({ metric: 'share-cases-bleeding-under', thresholdPct: 10 }), bleeding, 'test')).toThrow(AnalyticsInputError);
  });
});
