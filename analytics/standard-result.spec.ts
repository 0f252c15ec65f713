import { describe, expect, it } from 'vitest';
import type { StandardView } from '../shared/schemas/standard';
import { AnalyticsInputError } from './analytics-input-error';
import * as analytics from './index';
import { standardResult } from './standard-result';
import { SMALL_AUDIT, auditStandard } from './small-audit-dataset.fixture';

/*
 * Hand calculations (fixture table in small-audit-dataset.fixture.ts; z = 1.959964, z² = 3.841459).
 * Wilson (Newcombe 1998, method 3): (2r + z² ± z√(z² + 4r(n − r)/n)) / (2(n + z²)).
 * - 4/6 sites with rebound ≤ 1.0 mm at 6m: (8 + 3.8415 ± 1.96·√(3.8415 + 5.3333)) / 19.6829
 *   = (11.8415 ± 5.9368) / 19.6829 → 29.999 % to 90.323 %, value 66.667 %.
 * - 1/5 cases with grade ≥ II: (2 + 3.8415 ± 1.96·√(3.8415 + 3.2)) / 17.6829 → 3.622 % to 62.447 %.
 * - 2/4 cases seen at 6w: (4 + 3.8415 ± 1.96·√(3.8415 + 4)) / 15.6829 → 15.004 % to 84.996 %.
 * - 2/3 impressions ≥ 42 d: (4 + 3.8415 ± 1.96·√(3.8415 + 2.6667)) / 13.6829 → 20.766 % to 93.851 %.
 * - 1/3 patients with pain > 7: (2 + 3.8415 ± 5.0002) / 13.6829 → 6.149 % to 79.234 %.
 * Means over patients (t(0.975, 2) = 4.302653):
 * - rebound at 6m: 1.0, 1.5, 0.5 → mean 1.0, SD 0.5, SE 0.288675 → 1 ± 1.242069 = −0.242069 to 2.242069.
 * - papilla change at 6m: −1, 0.5, 0 → mean −1/6, SD √(7/12) = 0.763763, SE 0.440959 → −1/6 ± 1.897291.
 */
const result = (fields: Pick<StandardView, 'metric'> & Partial<StandardView>) => standardResult(auditStandard(fields), SMALL_AUDIT);

describe('standardResult', () => {
  it('mean-rebound: mean of patient means with t CI, in mm; a CI straddling the target is inconclusive', () => {
    const outcome = result({ metric: 'mean-rebound', intervalKey: '6m', comparator: '<=', target: 1 });
    expect(outcome.unit).toBe('mm');
    expect(outcome.observed?.value).toBeCloseTo(1, 12);
    expect(outcome.observed?.ci95[0]).toBeCloseTo(-0.242069, 5);
    expect(outcome.observed?.ci95[1]).toBeCloseTo(2.242069, 5);
    expect(outcome.observed).toMatchObject({ n: 3, count: null });
    expect(outcome.verdict).toBe('inconclusive');
  });

  it('mean-rebound verdicts: met when the whole CI is at or under the target, not met when it is all above', () => {
    expect(result({ metric: 'mean-rebound', intervalKey: '6m', comparator: '<=', target: 2.5 }).verdict).toBe('met');
    expect(result({ metric: 'mean-rebound', intervalKey: '6m', comparator: '<=', target: -0.5 }).verdict).toBe('not-met');
  });

  it('share-sites-rebound-within: 4/6 as 66.7 % with Wilson limits ×100', () => {
    const outcome = result({ metric: 'share-sites-rebound-within', intervalKey: '6m', thresholdMm: 1, comparator: '>=', target: 25 });
    expect(outcome.unit).toBe('%');
    expect(outcome.observed?.value).toBeCloseTo(66.6667, 4);
    expect(outcome.observed?.ci95[0]).toBeCloseTo(29.999, 3);
    expect(outcome.observed?.ci95[1]).toBeCloseTo(90.323, 3);
    expect(outcome.observed).toMatchObject({ n: 6, count: 4 });
    expect(outcome.verdict).toBe('met');
    expect(result({ metric: 'share-sites-rebound-within', intervalKey: '6m', thresholdMm: 1, comparator: '>=', target: 95 }).verdict).toBe('not-met');
  });

  it.each<[string, Pick<StandardView, 'metric'> & Partial<StandardView>, number, number, number, number]>([
    ['complications grade ≥ II (1/5)', { metric: 'share-cases-complication-grade', minGrade: 'II' }, 1, 5, 3.622, 62.447],
    ['recall completion at 6w (2/4)', { metric: 'recall-completion', intervalKey: '6w' }, 2, 4, 15.004, 84.996],
    ['bleeding under 10 % (2/4)', { metric: 'share-cases-bleeding-under', thresholdPct: 10 }, 2, 4, 15.004, 84.996],
    ['impressions ≥ 6 weeks (2/3)', { metric: 'share-cases-impression-after-6w' }, 2, 3, 20.766, 93.851],
    ['patients with pain > 7 (1/3)', { metric: 'share-patients-pain-over-7' }, 1, 3, 6.149, 79.234],
  ])('%s', (_, fields, count, n, lower, upper) => {
    const outcome = result(fields);
    expect(outcome.observed).toMatchObject({ count, n });
    expect(outcome.observed?.value).toBeCloseTo((count / n) * 100, 10);
    expect(outcome.observed?.ci95[0]).toBeCloseTo(lower, 3);
    expect(outcome.observed?.ci95[1]).toBeCloseTo(upper, 3);
  });

  it('mean-papilla-change: in Jemt score points', () => {
    const outcome = result({ metric: 'mean-papilla-change', intervalKey: '6m', comparator: '>=', target: 0 });
    expect(outcome.unit).toBe('score');
    expect(outcome.observed?.value).toBeCloseTo(-1 / 6, 12);
    expect(outcome.observed?.ci95[0]).toBeCloseTo(-1 / 6 - 1.897291, 5);
    expect(outcome.observed?.ci95[1]).toBeCloseTo(-1 / 6 + 1.897291, 5);
    expect(outcome.verdict).toBe('inconclusive');
  });

  it("'no-data' when the denominator is 0 (12m: no window closed, none seen) or a mean has one patient", () => {
    expect(result({ metric: 'recall-completion', intervalKey: '12m' })).toMatchObject({ observed: null, verdict: 'no-data' });
    const onePatient = { ...SMALL_AUDIT, records: SMALL_AUDIT.records.filter((record) => record.patientId === 2) };
    expect(standardResult(auditStandard({ metric: 'mean-rebound', intervalKey: '6m' }), onePatient)).toMatchObject({ observed: null, verdict: 'no-data' });
  });

  it('returns the standard it was given', () => {
    const standard = auditStandard({ metric: 'share-cases-impression-after-6w', criterion: 'Impressions after healing' });
    expect(standardResult(standard, SMALL_AUDIT).standard).toBe(standard);
  });

  it('rejects an invalid comparator or target even without data', () => {
    const comparator = JSON.parse('"=="');
    expect(() => result({ metric: 'recall-completion', intervalKey: '12m', comparator })).toThrow(AnalyticsInputError);
    expect(() => result({ metric: 'recall-completion', intervalKey: '12m', target: Number.NaN })).toThrow(/target must be a finite number/);
  });

  it('is exported, with the other audit-level functions, from the package index', () => {
    const exported = new Map<string, unknown>(Object.entries(analytics));
    for (const name of [
      'standardResult', 'groupDataset', 'reboundHistogram', 'operatorFunnel', 'monthlyTrend', 'timeToRelapse',
      'compareStandard', 'newcombeDifferenceInterval', 'calibrationAgreement', 'cohortCounts',
    ]) expect(typeof exported.get(name), name).toBe('function');
  });
});
