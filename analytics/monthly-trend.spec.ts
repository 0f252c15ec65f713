import { describe, expect, it } from 'vitest';
import type { AuditCaseRecord, AuditDataset } from '../shared/types/audit-dataset';
import type { OutcomeRecord } from '../shared/types/outcome-record';
import { AnalyticsInputError } from './analytics-input-error';
import { monthlyTrend } from './monthly-trend';
import { SMALL_AUDIT, auditCase, siteRecord } from './small-audit-dataset.fixture';

/** One case per month (surgery on the 1st), its sites at 6m with the given rebounds (post-op 15 mm). */
function monthsOfRebounds(months: readonly (readonly number[])[]): AuditDataset {
  const cases: AuditCaseRecord[] = [];
  const records: OutcomeRecord[] = [];
  months.forEach((rebounds, m) => {
    const year = 2020 + Math.floor(m / 12);
    const month = String((m % 12) + 1).padStart(2, '0');
    const owner = auditCase({ caseId: m + 1, patientId: m + 1, operatorId: 1, surgeryDate: `${year}-${month}-01`, procedure: 'gingivectomy', phenotype: 'thin', smoking: 'never' });
    cases.push(owner);
    rebounds.forEach((value, s) =>
      records.push(siteRecord(owner, { siteId: (m + 1) * 100 + s, intervalKey: '6m', visitDate: `${year + 1}-${month}-01`, baselineRefGm: 12, postOpRefGm: 15, recallRefGm: 15 - value })),
    );
  });
  return { ...SMALL_AUDIT, asOf: '2030-01-01', cases, records };
}

/** Cases on consecutive days of 2024, complications where `failures` is true. */
function casesInOrder(failures: readonly boolean[]): AuditCaseRecord[] {
  return failures.map((hasComplication, i) =>
    auditCase({
      caseId: i + 1, patientId: i + 1, operatorId: 1, surgeryDate: `2024-01-${String(i + 1).padStart(2, '0')}`, procedure: 'gingivectomy', phenotype: 'thin', smoking: 'never',
      complications: hasComplication ? [{ type: 'bleeding', grade: 'I' }] : [],
    }),
  );
}

describe('monthlyTrend', () => {
  /*
   * Fixture, 6m, by month of surgery: 2024-01 (case 11) sites 0.5, 1.5 → 1 relapse of 2, mean 1.0;
   * 2024-02 (cases 12, 21) 1.0, 1.0, 2.0 → 1 of 3, mean 4/3; 2024-03 (case 31) 0.5 → 0 of 1, mean 0.5.
   * p̄ = 2/6 = 1/3; UCL at n = 2: 1/3 + 3√((1/3)(2/3)/2) = 1/3 + 1 → capped at 1; LCL floored at 0.
   * XmR: mean (1 + 4/3 + 0.5)/3 = 0.944444; moving ranges 1/3, 5/6 → MR̄ 7/12 = 0.583333;
   * limits 0.944444 ± 3 · 0.583333 / 1.128 = 0.944444 ± 1.551418.
   */
  it('monthly relapse p chart and rebound XmR chart of the fixture (hand calculation above)', () => {
    const trend = monthlyTrend(SMALL_AUDIT, '6m');
    expect(trend.intervalKey).toBe('6m');
    expect(trend.relapse.centre).toBeCloseTo(1 / 3, 12);
    expect(trend.relapse.points.map((point) => [point.month, point.count, point.n, point.lcl, point.ucl, point.isOutside])).toEqual([
      ['2024-01', 1, 2, 0, 1, false], ['2024-02', 1, 3, 0, 1, false], ['2024-03', 0, 1, 0, 1, false],
    ]);
    expect(trend.rebound.points.map((point) => point.month)).toEqual(['2024-01', '2024-02', '2024-03']);
    expect(trend.rebound.points[1].value).toBeCloseTo(4 / 3, 12);
    expect(trend.rebound.mean).toBeCloseTo(0.944444, 6);
    expect(trend.rebound.lcl).toBeCloseTo(0.944444 - 1.551418, 5);
    expect(trend.rebound.ucl).toBeCloseTo(0.944444 + 1.551418, 5);
  });

  /*
   * Fixture CUSUM: cases by date 11 (complication), 12, 21 (complication), 31, 41 → p = 2/5 = 0.4.
   * Steiner et al. 2000 weights with R_A = 2: 1 − p + R_A·p = 1.4; failure ln(2/1.4) = 0.356675,
   * success ln(1/1.4) = −0.336472. Path 0.356675, 0.020203, 0.376878, 0.040405, 0 → with h = 0.3,
   * signals at 0 and 2.
   */
  it('complication CUSUM over cases in order of surgery, against the dataset’s own rate', () => {
    const { cusum } = monthlyTrend(SMALL_AUDIT, '6m', { oddsRatio: 2, h: 0.3 });
    expect(cusum).toMatchObject({ p: 0.4, oddsRatio: 2, h: 0.3, signalAt: [0, 2] });
    expect(cusum.points.map((point) => [point.index, point.surgeryDate, point.hadComplication])).toEqual([
      [0, '2024-01-15', true], [1, '2024-02-10', false], [2, '2024-02-20', true], [3, '2024-03-05', false], [4, '2024-06-01', false],
    ]);
    [0.356675, 0.020203, 0.376878, 0.040405, 0].forEach((value, i) => expect(cusum.points[i].value).toBeCloseTo(value, 6));
  });

  /*
   * REFERENCES.md A9 (Steiner et al. 2000), p = 0.10, R_A = 2: failure +0.59784, success −0.09531.
   * 10 cases, the 3rd with a complication → p = 0.1; path 0, 0, 0.59784, 0.50253, 0.40722, …;
   * h = 0.5 → signals at 2 and 3.
   */
  it('uses the Bernoulli CUSUM weights of Steiner et al. (p = 0.10)', () => {
    const failures = [false, false, true, false, false, false, false, false, false, false];
    const { cusum } = monthlyTrend({ ...SMALL_AUDIT, cases: casesInOrder(failures) }, '6m', { oddsRatio: 2, h: 0.5 });
    expect(cusum.p).toBeCloseTo(0.1, 12);
    expect(cusum.points[2].value).toBeCloseTo(0.59784, 5);
    expect(cusum.points[3].value).toBeCloseTo(0.59784 - 0.09531, 5);
    expect(cusum.signalAt).toEqual([2, 3]);
  });

  it('orders cases by surgery date, then case id', () => {
    const sameDay = (caseId: number, hasComplication: boolean) =>
      auditCase({ caseId, patientId: caseId, operatorId: 1, surgeryDate: '2024-05-05', procedure: 'gingivectomy', phenotype: 'thin', smoking: 'never', complications: hasComplication ? [{ type: 'pain', grade: 'I' }] : [] });
    const { cusum } = monthlyTrend({ ...SMALL_AUDIT, cases: [sameDay(5, false), sameDay(3, true)] }, '6m');
    expect(cusum.points.map((point) => point.hadComplication)).toEqual([true, false]);
  });

  it('a rate of 0 or 1 gives a flat CUSUM at 0 with no signal', () => {
    for (const failures of [[false, false, false], [true, true, true]]) {
      const { cusum } = monthlyTrend({ ...SMALL_AUDIT, cases: casesInOrder(failures) }, '6m', { oddsRatio: 2, h: 0.1 });
      expect(cusum.points.map((point) => point.value)).toEqual([0, 0, 0]);
      expect(cusum.signalAt).toEqual([]);
    }
  });

  /*
   * Montgomery 1991 orange-juice cans (REFERENCES.md A4): 30 months of 50 sites, the counts as relapses
   * (rebound 1.5 mm), the rest stable (0.5 mm) → centre 0.2313, UCL 0.4102, LCL 0.0524; months 15 and 23 above.
   */
  it('p chart composition reproduces Montgomery’s limits', () => {
    const counts = [12, 15, 8, 10, 4, 7, 16, 9, 14, 10, 5, 6, 17, 12, 22, 8, 10, 5, 13, 11, 20, 18, 24, 15, 9, 12, 7, 13, 9, 6];
    const trend = monthlyTrend(monthsOfRebounds(counts.map((count) => Array.from({ length: 50 }, (_, s) => (s < count ? 1.5 : 0.5)))), '6m');
    expect(trend.relapse.centre).toBeCloseTo(0.2313, 4);
    expect(trend.relapse.points[0].ucl).toBeCloseTo(0.4102, 4);
    expect(trend.relapse.points[0].lcl).toBeCloseTo(0.0524, 4);
    expect(trend.relapse.points.flatMap((point, i) => (point.isOutside ? [i + 1] : []))).toEqual([15, 23]);
    expect(trend.relapse.points[14]).toMatchObject({ month: '2021-03', count: 22, n: 50 });
  });

  /*
   * NIST/SEMATECH e-Handbook §6.3.2.2 (REFERENCES.md A5), scaled to mm by 1/10: one site a month with
   * rebound 4.96, 4.76, … → mean 5.081, limits 4.58159–5.58041.
   */
  it('XmR composition reproduces the NIST example (values /10)', () => {
    const values = [49.6, 47.6, 49.9, 51.3, 47.8, 51.2, 52.6, 52.4, 53.6, 52.1].map((value) => value / 10);
    const trend = monthlyTrend(monthsOfRebounds(values.map((value) => [value])), '6m');
    expect(trend.rebound.mean).toBeCloseTo(5.081, 6);
    expect(trend.rebound.lcl).toBeCloseTo(4.58159, 4);
    expect(trend.rebound.ucl).toBeCloseTo(5.58041, 4);
  });

  it('fewer than 2 months with sites: empty charts, CUSUM still given', () => {
    const trend = monthlyTrend(monthsOfRebounds([[0.5, 1.5]]), '6m');
    expect(trend.relapse).toEqual({ centre: null, points: [] });
    expect(trend.rebound).toEqual({ mean: null, lcl: null, ucl: null, points: [] });
    expect(trend.cusum.points).toHaveLength(1);
  });

  it('rejects an unknown interval and invalid CUSUM settings', () => {
    expect(() => monthlyTrend(SMALL_AUDIT, '9m')).toThrow(AnalyticsInputError);
    expect(() => monthlyTrend(SMALL_AUDIT, '6m', { oddsRatio: 0, h: 2 })).toThrow(/oddsRatio must be a positive number/);
    expect(() => monthlyTrend(SMALL_AUDIT, '6m', { oddsRatio: 2, h: -1 })).toThrow(/h must be a positive number/);
  });
});
