import type {
  AuditResults,
  AuditView,
  CalibrationResult,
  CycleComparison,
  CycleView,
  FunnelResult,
  IntervalOutcomeSummary,
  OutcomeSummary,
  ProportionEstimate,
  StandardResult,
  SurvivalResult,
  TrendResult,
} from '@tidemark/shared';
import {
  FIXTURE_CODES,
  FIXTURE_SURGERY,
  FIXTURE_STANDARDS,
  addCycle,
  addStandard,
  auditBody,
  buildOutcomeFixture,
  createAudit,
  defaultScheduleId,
  jsonOf,
  reportCycle,
  type OutcomeFixture,
} from './support/audit-fixtures';
import { createClinicalWorld, expectStatus, todayUtc, type ClinicalWorld } from './support/clinical-fixtures';
import type { ApiClient } from './support/test-app';

/*
 * Every expected number below is worked out by hand from the outcome fixture (table in
 * support/audit-fixtures.ts) with DESIGN.md §3: rebound = post-op − recall REF→GM; stable ≤ 0.5 mm,
 * minor ≤ 1.0 mm, relapse > 1.0 mm (the audit keeps the default thresholds). Rebound per site:
 *   2w: S7 1.0
 *   6w: S1 0.5, S2 0.5, S3 0.5, S4 0, S5 0, S6 0.5
 *   6m: S1 0.5, S2 1.0, S3 1.5, S4 0, S5 −0.5     (S6 missed; C5 withdrawn after 2 w)
 * Proportions carry the Wilson 95% score interval (Wilson 1927; Newcombe, Stat Med 1998;17:857–872,
 * method 3): (2r + z² ± z√(z² + 4r(n − r)/n)) / (2(n + z²)), z = 1.959964. Worked by hand:
 *   1/5 → 0.036224 … 0.624465      3/5 → 0.230724 … 0.882379      4/5 → 0.375535 … 0.963776
 *   3/4 → 0.300642 … 0.954413      6/6 → 0.609666 … 1
 * t quantile t(0.975, 2) = 4.302653 (any t table).
 */

const Z95_WILSON: Record<string, [number, number]> = {
  '1/5': [0.036224, 0.624465],
  '3/5': [0.230724, 0.882379],
  '4/5': [0.375535, 0.963776],
  '3/4': [0.300642, 0.954413],
  '6/6': [0.609666, 1],
};

/** A proportion estimate with its hand-worked Wilson limits. */
function expectShare(estimate: ProportionEstimate | undefined, count: number, n: number): void {
  expect(estimate).toBeDefined();
  const { lower, upper, p } = estimate as ProportionEstimate;
  expect([estimate?.count, estimate?.n]).toEqual([count, n]);
  expect(p).toBeCloseTo(count / n, 10);
  const limits = Z95_WILSON[`${count}/${n}`];
  if (!limits) throw new Error(`No hand-worked Wilson interval for ${count}/${n}`);
  expect(lower).toBeCloseTo(limits[0], 5);
  expect(upper).toBeCloseTo(limits[1], 5);
}

const at = (summary: OutcomeSummary, key: string) => summary.intervals.find((interval) => interval.intervalKey === key) as IntervalOutcomeSummary;
const completionAt = (summary: OutcomeSummary, key: string) => summary.recall.intervals.find((interval) => interval.intervalKey === key);

describe('audit results on a hand-built cohort', () => {
  let w: ClinicalWorld;
  let lead: ApiClient;
  let fixture: OutcomeFixture;
  let audit: AuditView;
  let first: CycleView;
  let second: CycleView;
  let results: AuditResults;
  const clinicianName = 'Dr Cal Clinician (demo)';
  const otherName = 'Dr Sam Second (test)';

  beforeAll(async () => {
    w = await createClinicalWorld();
    lead = w.as('audit_lead');
    fixture = await buildOutcomeFixture(w);
    audit = await createAudit(lead, auditBody(await defaultScheduleId(lead)));
    for (const standard of FIXTURE_STANDARDS) await addStandard(lead, audit.id, standard);
    // Cycle 1: surgery January–February 2024 (C1, C2), reported; cycle 2: March–May 2024 (C3, C4, C5), open.
    first = await reportCycle(lead, await addCycle(lead, audit.id, '2024-01-01', '2024-02-29'));
    second = await addCycle(lead, audit.id, '2024-03-01', '2024-05-31');
    results = expectStatus(await lead.get(`/api/audits/${audit.id}/results`), 200).body as AuditResults;
  });
  afterAll(async () => {
    await w.close();
  });

  describe('GET /api/audits/:id/results', () => {
    it('counts the cohort: C1–C5 (withdrawn C5 included, planned C6 not), patients P1–P4, sites S1–S7', () => {
      expect(results.cohort).toEqual({ cases: 5, patients: 4, sites: 7 });
      expect(results).toEqual(expect.objectContaining({ auditId: audit.id, cycleId: null, frozenAt: null, asOf: todayUtc(), groupBy: null, groups: [] }));
      expect(results.thresholds).toEqual({ stable: 0.5, relapse: 1 });
      // 6 visits' rows at 6 w, 5 at 6 m, 1 at 2 w = 12 rows; 7 sites; 4 patients.
      expect([results.summary.nRecords, results.summary.nSites, results.summary.nPatients, results.summary.nUnscheduledRecords]).toEqual([12, 7, 4, 0]);
    });

    it('summarises rebound at 6 months at site and patient level', () => {
      const sixMonths = at(results.summary, '6m');
      // Sites: 0.5 + 1.0 + 1.5 + 0 − 0.5 = 2.5 → mean 2.5 / 5 = 0.5; SD √((0 + 0.25 + 1 + 0.25 + 1) / 4) = √0.625 = 0.790569.
      expect([sixMonths.nSites, sixMonths.nPatients]).toEqual([5, 3]);
      expect(sixMonths.rebound.site).toEqual(expect.objectContaining({ n: 5, median: 0.5, min: -0.5, max: 1.5 }));
      expect(sixMonths.rebound.site?.mean).toBeCloseTo(0.5, 10);
      expect(sixMonths.rebound.site?.sd).toBeCloseTo(0.790569, 5);
      // Patients: P1 (0.5 + 1.0) / 2 = 0.75, P2 1.5, P3 (0 − 0.5) / 2 = −0.25 → mean 2.0 / 3 = 0.666667.
      expect(sixMonths.rebound.patient?.n).toBe(3);
      expect(sixMonths.rebound.patient?.mean).toBeCloseTo(2 / 3, 10);
      // Retained gain = recall − baseline: 1.5, 1.5, 0.5, 2.5, 3.0 → mean 9.0 / 5 = 1.8 mm.
      expect(sixMonths.retainedGain.site?.mean).toBeCloseTo(1.8, 10);
      // % retained = retained / gain × 100: 75, 60, 25, 100, 120 → mean 380 / 5 = 76%.
      expect(sixMonths.percentRetained.site?.mean).toBeCloseTo(76, 10);
    });

    it('summarises rebound at 6 weeks and 2 weeks', () => {
      const sixWeeks = at(results.summary, '6w');
      // Sites: 0.5 × 4 + 0 × 2 = 2.0 → 2.0 / 6; patients: P1 0.5, P2 0.5, P3 0, P4 0.5 → 1.5 / 4 = 0.375.
      expect([sixWeeks.nSites, sixWeeks.nPatients]).toEqual([6, 4]);
      expect(sixWeeks.rebound.site?.mean).toBeCloseTo(2 / 6, 10);
      expect(sixWeeks.rebound.patient?.mean).toBeCloseTo(0.375, 10);
      const twoWeeks = at(results.summary, '2w');
      expect([twoWeeks.nSites, twoWeeks.nPatients, twoWeeks.rebound.site?.mean]).toEqual([1, 1, 1]);
      expect([at(results.summary, '3m').nSites, at(results.summary, '12m').nSites]).toEqual([0, 0]);
    });

    it('gives stability shares with Wilson intervals and flags the negative rebound', () => {
      const { stability } = at(results.summary, '6m');
      // Stable ≤ 0.5: S1 0.5, S4 0, S5 −0.5 → 3/5; minor (0.5, 1.0]: S2 → 1/5; relapse > 1.0: S3 → 1/5; negative: S5 → 1/5.
      expectShare(stability.stable, 3, 5);
      expectShare(stability.minor, 1, 5);
      expectShare(stability.relapse, 1, 5);
      expectShare(stability.flaggedForReview, 1, 5);
      // At 6 w every rebound is ≤ 0.5 mm: 6/6 stable.
      expectShare(at(results.summary, '6w').stability.stable, 6, 6);
    });

    it('counts recall completion per interval, withdrawn C5 left out (all windows closed by 2025)', () => {
      const { recall } = results.summary;
      expect([recall.nCases, recall.nWithdrawn]).toEqual([5, 1]);
      // C1–C4: none seen at 2 w, 3 m or 12 m; all four at 6 w on target; C1–C3 at 6 m on target, C4 missed.
      const counts = recall.intervals.map((interval) => [interval.intervalKey, interval.seenInWindow, interval.seenEarly, interval.seenLate, interval.missed, interval.pending, interval.notYetDue]);
      expect(counts).toEqual([
        ['2w', 0, 0, 0, 4, 0, 0],
        ['6w', 4, 0, 0, 0, 0, 0],
        ['3m', 0, 0, 0, 4, 0, 0],
        ['6m', 3, 0, 0, 1, 0, 0],
        ['12m', 0, 0, 0, 4, 0, 0],
      ]);
      expectShare(completionAt(results.summary, '6m')?.completion, 3, 4);
      // Nobody came at 12 m, the last closed window: 4/4 lost to follow-up.
      expect([recall.lossToFollowUp.count, recall.lossToFollowUp.n]).toEqual([4, 4]);
    });

    it('counts complications per case, withdrawn included: 1 of 5 (C3, grade II)', () => {
      const { complications } = results.summary;
      expect(complications.nCases).toBe(5);
      expectShare(complications.casesWithComplication, 1, 5);
      const gradeTwo = complications.byGrade.find((grade) => grade.grade === 'II');
      expect(gradeTwo?.complications).toBe(1);
      expectShare(gradeTwo?.cases, 1, 5);
      expect(complications.byGrade.filter((grade) => grade.grade !== 'II').every((grade) => grade.complications === 0)).toBe(true);
      expect(complications.byType).toEqual([{ type: 'delayed-healing', complications: 1, cases: 1 }]);
    });

    it('evaluates each standard: observed value, n, and the verdict the CI demands (evaluate-standard rules)', () => {
      const byMetric = new Map(results.standards.map((result: StandardResult) => [result.standard.metric, result]));
      // Mean of patient means at 6 m = 0.666667, SD 0.877971, SE 0.506897, CI ± 4.302653 × SE → −1.514335 … 2.847668.
      // Target ≤ 1 mm: the CI straddles 1 → inconclusive.
      const meanRebound = byMetric.get('mean-rebound');
      expect(meanRebound).toEqual(expect.objectContaining({ unit: 'mm', verdict: 'inconclusive' }));
      expect(meanRebound?.observed?.n).toBe(3);
      expect(meanRebound?.observed?.count).toBeNull();
      expect(meanRebound?.observed?.value).toBeCloseTo(2 / 3, 8);
      expect(meanRebound?.observed?.ci95[0]).toBeCloseTo(-1.514335, 5);
      expect(meanRebound?.observed?.ci95[1]).toBeCloseTo(2.847668, 5);
      // Sites within 1.0 mm at 6 m: S1, S2 (1.0 exactly), S4, S5 → 4/5 = 80%; CI 37.55–96.38% ≥ 30% → met.
      const within = byMetric.get('share-sites-rebound-within');
      expect(within).toEqual(expect.objectContaining({ unit: '%', verdict: 'met' }));
      expect([within?.observed?.count, within?.observed?.n]).toEqual([4, 5]);
      expect(within?.observed?.value).toBeCloseTo(80, 8);
      expect(within?.observed?.ci95[0]).toBeCloseTo(37.5535, 3);
      expect(within?.observed?.ci95[1]).toBeCloseTo(96.3776, 3);
      // Grade II or worse: C3 → 1/5 = 20%; CI 3.62–62.45%, all above the 2% ceiling → not met.
      const complications = byMetric.get('share-cases-complication-grade');
      expect(complications?.verdict).toBe('not-met');
      expect([complications?.observed?.count, complications?.observed?.n]).toEqual([1, 5]);
      expect(complications?.observed?.ci95[0]).toBeCloseTo(3.6224, 3);
      // Recall at 6 m: 3/4 = 75%; CI 30.06–95.44% straddles 80% → inconclusive.
      const completion = byMetric.get('recall-completion');
      expect(completion?.verdict).toBe('inconclusive');
      expect([completion?.observed?.count, completion?.observed?.n, completion?.observed?.value]).toEqual([3, 4, 75]);
      expect(completion?.observed?.ci95[0]).toBeCloseTo(30.0642, 3);
      expect(completion?.observed?.ci95[1]).toBeCloseTo(95.4413, 3);
      // No case has a final impression date: no data.
      expect(byMetric.get('share-cases-impression-after-6w')).toEqual(expect.objectContaining({ observed: null, verdict: 'no-data' }));
    });

    it('groups by operator: A = C1, C2 and B = C3, C4, C5, with per-group numbers', async () => {
      const grouped = expectStatus(await lead.get(`/api/audits/${audit.id}/results?groupBy=operator`), 200).body as AuditResults;
      expect(grouped.groupBy).toBe('operator');
      // The lead sees names, in order of operator id (the demo clinician was created before the second one).
      expect(grouped.groups.map((group) => group.label)).toEqual([clinicianName, otherName]);
      const [a, b] = grouped.groups.map((group) => group.summary);
      // A at 6 m: S1 0.5, S2 1.0, S3 1.5 → mean 1.0; patients P1 0.75, P2 1.5 → 1.125. B: S4 0, S5 −0.5 → −0.25.
      expect([at(a, '6m').nSites, at(a, '6m').nPatients]).toEqual([3, 2]);
      expect(at(a, '6m').rebound.site?.mean).toBeCloseTo(1, 10);
      expect(at(a, '6m').rebound.patient?.mean).toBeCloseTo(1.125, 10);
      expect([at(b, '6m').nSites, at(b, '6m').nPatients]).toEqual([2, 1]);
      expect(at(b, '6m').rebound.site?.mean).toBeCloseTo(-0.25, 10);
      // Complications: A 0/2, B 1/3. Recall at 6 m: A 2/2; B C3 seen, C4 missed (C5 withdrawn) → 1/2.
      expect([a.complications.casesWithComplication.count, a.complications.nCases]).toEqual([0, 2]);
      expect([b.complications.casesWithComplication.count, b.complications.nCases]).toEqual([1, 3]);
      expect([completionAt(a, '6m')?.completion.count, completionAt(a, '6m')?.completion.n]).toEqual([2, 2]);
      expect([completionAt(b, '6m')?.completion.count, completionAt(b, '6m')?.completion.n, b.recall.nWithdrawn]).toEqual([1, 2, 1]);
    });

    it('groups by procedure: flap + osseous (C4), flap (C2), gingivectomy (C1, C3, C5)', async () => {
      const grouped = expectStatus(await lead.get(`/api/audits/${audit.id}/results?groupBy=procedure`), 200).body as AuditResults;
      expect(grouped.groups.map((group) => [group.key, group.label])).toEqual([
        ['apf-osseous-recontouring', 'Apically positioned flap with osseous recontouring'],
        ['apically-positioned-flap', 'Apically positioned flap'],
        ['gingivectomy', 'Gingivectomy / gingivoplasty'],
      ]);
      const [osseous, flap, gingivectomy] = grouped.groups.map((group) => group.summary);
      // C4: S6 0.5 at 6 w, nothing at 6 m. C2: S3 1.5 at 6 m.
      expect([at(osseous, '6w').nSites, at(osseous, '6w').rebound.site?.mean, at(osseous, '6m').nSites, at(osseous, '6m').rebound.site]).toEqual([1, 0.5, 0, null]);
      expect([at(flap, '6m').nSites, at(flap, '6m').rebound.site?.mean]).toEqual([1, 1.5]);
      // Gingivectomy at 6 m: S1 0.5, S2 1.0, S4 0, S5 −0.5 → 1.0 / 4 = 0.25; patients P1 0.75, P3 −0.25 → 0.25.
      expect([at(gingivectomy, '6m').nSites, at(gingivectomy, '6m').nPatients]).toEqual([4, 2]);
      expect(at(gingivectomy, '6m').rebound.site?.mean).toBeCloseTo(0.25, 10);
      expect(at(gingivectomy, '6m').rebound.patient?.mean).toBeCloseTo(0.25, 10);
      expect([gingivectomy.complications.casesWithComplication.count, gingivectomy.complications.nCases]).toEqual([1, 3]);
      expect([osseous.complications.nCases, flap.complications.nCases]).toEqual([1, 1]);
    });

    it('groups by phenotype: thick (C2, C4) and thin (C1, C3, C5)', async () => {
      const grouped = expectStatus(await lead.get(`/api/audits/${audit.id}/results?groupBy=phenotype`), 200).body as AuditResults;
      expect(grouped.groups.map((group) => [group.key, group.label])).toEqual([
        ['thick', 'Thick (> 1 mm)'],
        ['thin', 'Thin (≤ 1 mm)'],
      ]);
      const [thick, thin] = grouped.groups.map((group) => group.summary);
      // Thick: 6 m S3 1.5; 6 w S3 0.5, S6 0.5 → 0.5. Thin: 6 m 1.0 / 4 = 0.25; 6 w S1 0.5, S2 0.5, S4 0, S5 0 → 0.25.
      expect([at(thick, '6m').nSites, at(thick, '6m').rebound.site?.mean, at(thick, '6w').nSites, at(thick, '6w').rebound.site?.mean]).toEqual([1, 1.5, 2, 0.5]);
      expect([at(thin, '6m').nSites, at(thin, '6w').nSites]).toEqual([4, 4]);
      expect(at(thin, '6m').rebound.site?.mean).toBeCloseTo(0.25, 10);
      expect(at(thin, '6w').rebound.site?.mean).toBeCloseTo(0.25, 10);
      // Recall at 6 m: thick C2 seen, C4 missed → 1/2; thin C1, C3 seen (C5 withdrawn) → 2/2.
      expect([completionAt(thick, '6m')?.completion.count, completionAt(thick, '6m')?.completion.n]).toEqual([1, 2]);
      expect([completionAt(thin, '6m')?.completion.count, completionAt(thin, '6m')?.completion.n]).toEqual([2, 2]);
    });

    it('reads a cycle: the open cycle 2 live (C3–C5), the reported cycle 1 frozen (C1, C2)', async () => {
      const open = expectStatus(await lead.get(`/api/audits/${audit.id}/results?cycleId=${second.id}`), 200).body as AuditResults;
      expect([open.cycleId, open.frozenAt]).toEqual([second.id, null]);
      // C3 (P3; S4, S5), C4 (P4; S6), C5 (P1; S7).
      expect(open.cohort).toEqual({ cases: 3, patients: 3, sites: 4 });
      const frozen = expectStatus(await lead.get(`/api/audits/${audit.id}/results?cycleId=${first.id}`), 200).body as AuditResults;
      expect([frozen.cycleId, frozen.frozenAt]).toEqual([first.id, first.frozenAt]);
      expect(frozen.cohort).toEqual({ cases: 2, patients: 2, sites: 3 });
    });

    it('refuses an unknown groupBy and a malformed cycleId (400)', async () => {
      const unknown = await lead.get(`/api/audits/${audit.id}/results?groupBy=tooth`);
      expect(unknown.status).toBe(400);
      expect(Object.keys(unknown.body.error.fields)).toEqual(['groupBy']);
      const cycle = await lead.get(`/api/audits/${audit.id}/results?cycleId=first`);
      expect(cycle.status).toBe(400);
      expect(Object.keys(cycle.body.error.fields)).toEqual(['cycleId']);
      expect((await lead.get('/api/audits/999999/results')).status).toBe(404);
    });
  });

  describe('GET /api/audits/:id/funnel (Spiegelhalter 2005)', () => {
    it('complications per operator: A 0/2, B 1/3, practice 1/5', async () => {
      const funnel = expectStatus(await lead.get(`/api/audits/${audit.id}/funnel`), 200).body as FunnelResult;
      expect([funnel.measure, funnel.intervalKey, funnel.totalEvents, funnel.totalN]).toEqual(['complication', null, 1, 5]);
      expect(funnel.target).toBeCloseTo(0.2, 10);
      expect(funnel.points.map((point) => [point.label, point.isSelf, point.events, point.n])).toEqual([
        [clinicianName, false, 0, 2],
        [otherName, false, 1, 3],
      ]);
      expect(funnel.points[1].rate).toBeCloseTo(1 / 3, 10);
      for (const point of funnel.points) {
        expect(point.limits998.lower).toBeLessThanOrEqual(point.limits95.lower);
        expect(point.limits95.lower).toBeLessThanOrEqual(funnel.target);
        expect(point.limits95.upper).toBeGreaterThanOrEqual(funnel.target);
        expect(point.limits998.upper).toBeGreaterThanOrEqual(point.limits95.upper);
        expect(point.limits998.upper).toBeLessThanOrEqual(1);
      }
      // The curve runs n = 1 … the largest operator n (3).
      expect(funnel.curve.map((step) => step.n)).toEqual([1, 2, 3]);
    });

    it('relapse at 6 m (the default interval) per operator: A 1/3 (S3), B 0/2; practice 1/5', async () => {
      for (const url of [`/api/audits/${audit.id}/funnel?measure=relapse`, `/api/audits/${audit.id}/funnel?measure=relapse&intervalKey=6m`]) {
        const funnel = expectStatus(await lead.get(url), 200).body as FunnelResult;
        expect([funnel.measure, funnel.intervalKey, funnel.totalEvents, funnel.totalN]).toEqual(['relapse', '6m', 1, 5]);
        expect(funnel.points.map((point) => [point.events, point.n])).toEqual([
          [1, 3],
          [0, 2],
        ]);
      }
      // At 6 w nothing exceeds 1.0 mm: 0 of 6 sites.
      const sixWeeks = expectStatus(await lead.get(`/api/audits/${audit.id}/funnel?measure=relapse&intervalKey=6w`), 200).body as FunnelResult;
      expect([sixWeeks.totalEvents, sixWeeks.totalN]).toEqual([0, 6]);
    });

    it('refuses an unknown measure or interval (400)', async () => {
      for (const [query, field] of [
        ['measure=bleeding', 'measure'],
        ['measure=relapse&intervalKey=9y', 'intervalKey'],
        ['intervalKey=9y', 'intervalKey'],
      ]) {
        const response = await lead.get(`/api/audits/${audit.id}/funnel?${query}`);
        expect(response.status, query).toBe(400);
        expect(Object.keys(response.body.error.fields), query).toEqual([field]);
      }
    });
  });

  describe('GET /api/audits/:id/trend', () => {
    it('charts 6 m relapse and rebound by month of surgery and the complication CUSUM', async () => {
      const trend = expectStatus(await lead.get(`/api/audits/${audit.id}/trend`), 200).body as TrendResult;
      expect(trend.intervalKey).toBe('6m');
      // Months: 2024-01 S1, S2 (0/2 relapse, mean 0.75); 2024-02 S3 (1/1, 1.5); 2024-03 S4, S5 (0/2, −0.25). p̄ = 1/5.
      expect(trend.relapse.points.map((point) => [point.month, point.count, point.n])).toEqual([
        ['2024-01', 0, 2],
        ['2024-02', 1, 1],
        ['2024-03', 0, 2],
      ]);
      expect(trend.relapse.centre).toBeCloseTo(0.2, 10);
      const means = trend.rebound.points.map((point) => point.value);
      [0.75, 1.5, -0.25].forEach((value, i) => expect(means[i]).toBeCloseTo(value, 10));
      // Individuals chart (NIST/SEMATECH §6.3.2.2): mean 2.0 / 3; moving ranges 0.75, 1.75 → MR̄ 1.25; limits
      // x̄ ± 3·MR̄/d₂ with d₂ = 1.128 (n = 2; the "2.66" of REFERENCES.md §A5 rounds 3/1.128 = 2.659574) → ± 3.324468.
      expect(trend.rebound.mean).toBeCloseTo(2 / 3, 10);
      expect(trend.rebound.ucl).toBeCloseTo(2 / 3 + 3.324468, 5);
      expect(trend.rebound.lcl).toBeCloseTo(2 / 3 - 3.324468, 5);
      // CUSUM (Steiner et al. 2000; weights for p = 0.2, R_A = 2 from REFERENCES.md §A9: failure +0.51083, success −0.18232):
      // C1, C2 → 0, 0; C3 (complication) → 0.51083; C4 → 0.32851; C5 → 0.14619. Never reaches h = 2.
      expect([trend.cusum.p, trend.cusum.oddsRatio, trend.cusum.h]).toEqual([0.2, 2, 2]);
      expect(trend.cusum.points.map((point) => point.hadComplication)).toEqual([false, false, true, false, false]);
      [0, 0, 0.51083, 0.32851, 0.14619].forEach((value, i) => expect(trend.cusum.points[i].value).toBeCloseTo(value, 4));
      expect(trend.cusum.signalAt).toEqual([]);
    });

    it('refuses an interval the schedule does not have (400)', async () => {
      const response = await lead.get(`/api/audits/${audit.id}/trend?intervalKey=9y`);
      expect(response.status).toBe(400);
      expect(Object.keys(response.body.error.fields)).toEqual(['intervalKey']);
    });
  });

  describe('GET /api/audits/:id/survival (Kaplan–Meier, time to relapse)', () => {
    it('has one event (S3, rebound 1.5 > 1.0 at day 182) among 7 sites; 5 at risk then → S = 4/5', async () => {
      const survival = expectStatus(await lead.get(`/api/audits/${audit.id}/survival`), 200).body as SurvivalResult;
      // Censored: S1, S2, S4, S5 at day 182; S6 at day 42; S7 at day 14.
      expect([survival.relapseThresholdMm, survival.nSites, survival.events, survival.censored]).toEqual([1, 7, 1, 6]);
      expect(survival.curve.n).toBe(7);
      expect(survival.curve.steps.map((step) => [step.time, step.atRisk, step.events])).toEqual([[182, 5, 1]]);
      expect(survival.curve.steps[0].survival).toBeCloseTo(0.8, 10);
      expect(survival.curve.median).toBeNull();
    });
  });

  describe('GET /api/audits/:id/calibration after POST /api/calibration-readings', () => {
    it('has no pairs before any repeated reading', async () => {
      const calibration = expectStatus(await lead.get(`/api/audits/${audit.id}/calibration`), 200).body as CalibrationResult;
      expect(calibration).toEqual(expect.objectContaining({ pairs: 0, kappa: null, icc: null, blandAltman: null, meetsCalibrationTarget: null }));
      expect(calibration.withinOneMm).toEqual({ count: 0, n: 0, p: null, lower: null, upper: null });
    });

    it('pairs the first two readings of a site on one day: 4 pairs, 3 within ±1 mm', async () => {
      const day = todayUtc();
      const readings: [number, string, number][] = [
        // |9.5 − 10| = 0.5: within. A third reading the same day is not part of the pair.
        [fixture.sites.S1, day, 9.5],
        [fixture.sites.S1, day, 10],
        [fixture.sites.S1, day, 14],
        // 0: within.
        [fixture.sites.S2, day, 10],
        [fixture.sites.S2, day, 10],
        // 1.5: outside.
        [fixture.sites.S3, day, 6.5],
        [fixture.sites.S3, day, 8],
        // exactly 1.0: within (±1 mm counts as agreement, Andrade et al. 2012).
        [fixture.sites.S4, day, 9.5],
        [fixture.sites.S4, day, 10.5],
        // A single reading, and two readings on different days: no pair.
        [fixture.sites.S5, day, 10],
        [fixture.sites.S6, '2024-06-01', 7],
        [fixture.sites.S6, '2024-06-02', 7.5],
      ];
      for (const [siteId, measuredOn, refGm] of readings) {
        const response = await lead.post('/api/calibration-readings', { siteId, measuredOn, refGm });
        expect(response.status, JSON.stringify(response.body)).toBe(201);
        expect(response.body).toEqual({ id: expect.any(Number), siteId, measuredOn, refGm, examinerId: w.ids.audit_lead });
      }
      const calibration = expectStatus(await lead.get(`/api/audits/${audit.id}/calibration`), 200).body as CalibrationResult;
      expect(calibration.pairs).toBe(4);
      expectShare(calibration.withinOneMm, 3, 4);
      // Bland–Altman (1986), first − second: −0.5, 0, −1.5, −1.0 → bias −0.75, SD √(1.25 / 3) = 0.645497,
      // limits −0.75 ± 1.96 × 0.645497 = −2.015175 … 0.515175.
      expect(calibration.blandAltman?.bias).toBeCloseTo(-0.75, 10);
      expect(calibration.blandAltman?.sd).toBeCloseTo(0.645497, 5);
      expect(calibration.blandAltman?.lower).toBeCloseTo(-2.015175, 5);
      expect(calibration.blandAltman?.upper).toBeCloseTo(0.515175, 5);
      // Target > 90% within ±1 mm (Andrade et al. 2012): 75% misses it whatever kappa is.
      expect(calibration.kappa).not.toBeNull();
      expect(calibration.meetsCalibrationTarget).toBe(false);
    });

    it('refuses a reading on an unknown site, in the future or off the 0.5 mm step (400)', async () => {
      for (const [body, field] of [
        [{ siteId: 999_999, measuredOn: todayUtc(), refGm: 9 }, 'siteId'],
        [{ siteId: fixture.sites.S1, measuredOn: '2999-01-01', refGm: 9 }, 'measuredOn'],
        [{ siteId: fixture.sites.S1, measuredOn: todayUtc(), refGm: 9.25 }, 'refGm'],
      ] as const) {
        const response = await lead.post('/api/calibration-readings', body);
        expect(response.status).toBe(400);
        expect(Object.keys(response.body.error.fields)).toEqual([field]);
      }
    });
  });

  describe('GET /api/audits/:id/compare (re-audit against the first cycle)', () => {
    it('gives second − first per standard, as each stood in cycle 1', async () => {
      const comparison = expectStatus(await lead.get(`/api/audits/${audit.id}/compare?first=${first.id}&second=${second.id}`), 200).body as CycleComparison;
      expect(comparison.first).toEqual({ cycleId: first.id, number: 1 });
      expect(comparison.second).toEqual({ cycleId: second.id, number: 2 });
      expect(comparison.standards.map((standard) => standard.metric)).toEqual(FIXTURE_STANDARDS.map((standard) => standard.metric));
      const [meanRebound, within, complications, completion, impressions] = comparison.standards;
      // Mean rebound at 6 m: cycle 1 P1 0.75, P2 1.5 → 1.125 (n 2); cycle 2 only P3 → too few patients, no difference.
      expect(meanRebound.first?.value).toBeCloseTo(1.125, 10);
      expect([meanRebound.second, meanRebound.secondVerdict, meanRebound.difference]).toEqual([null, 'no-data', null]);
      // Sites within 1.0 mm at 6 m: cycle 1 S1, S2 of S1–S3 → 2/3; cycle 2 S4, S5 → 2/2. 100 − 66.67 = +33.33 points.
      expect([within.first?.count, within.first?.n, within.second?.count, within.second?.n]).toEqual([2, 3, 2, 2]);
      expect(within.difference).toBeCloseTo(100 - 200 / 3, 8);
      // Fisher exact on [[2, 0], [2, 1]]: hypergeometric P(2) = 6/10, P(1) = 4/10, both ≤ 0.6 → p = 1.
      expect(within.test).toBe('fisher-exact');
      expect(within.p).toBeCloseTo(1, 8);
      expect(within.isBeyondChance).toBe(false);
      // Grade II+ complications: cycle 1 0/2, cycle 2 1/3 (C3) → +33.33 points.
      expect(complications.difference).toBeCloseTo(100 / 3, 8);
      // Recall at 6 m: cycle 1 C1, C2 → 2/2; cycle 2 C3 seen, C4 missed, C5 withdrawn → 1/2. 50 − 100 = −50 points.
      expect(completion.difference).toBeCloseTo(-50, 8);
      for (const share of [within, complications, completion]) {
        const [lower, upper] = share.ci95 as [number, number];
        expect(lower).toBeLessThanOrEqual(share.difference as number);
        expect(upper).toBeGreaterThanOrEqual(share.difference as number);
      }
      expect([impressions.first, impressions.second, impressions.difference]).toEqual([null, null, null]);
    });

    it('needs both cycles (400) and cycles of this audit (404)', async () => {
      const missing = await lead.get(`/api/audits/${audit.id}/compare?first=${first.id}`);
      expect(missing.status).toBe(400);
      expect(Object.keys(missing.body.error.fields)).toEqual(['second']);
      const other = await createAudit(lead, auditBody(await defaultScheduleId(lead)));
      const otherCycle = await addCycle(lead, other.id, '2024-01-01', '2024-12-31');
      expect((await lead.get(`/api/audits/${audit.id}/compare?first=${first.id}&second=${otherCycle.id}`)).status).toBe(404);
    });
  });

  describe('de-identification (DESIGN.md §2, §7)', () => {
    const codes = Object.values(FIXTURE_CODES);
    const endpoints = () => [
      '/api/audits',
      `/api/audits/${audit.id}`,
      '/api/schedules',
      `/api/audits/${audit.id}/results`,
      `/api/audits/${audit.id}/results?groupBy=operator`,
      `/api/audits/${audit.id}/results?groupBy=procedure`,
      `/api/audits/${audit.id}/results?groupBy=phenotype`,
      `/api/audits/${audit.id}/results?groupBy=indication`,
      `/api/audits/${audit.id}/results?groupBy=smoking`,
      `/api/audits/${audit.id}/results?cycleId=${first.id}&groupBy=operator`,
      `/api/audits/${audit.id}/results?cycleId=${second.id}`,
      `/api/audits/${audit.id}/funnel?measure=complication`,
      `/api/audits/${audit.id}/funnel?measure=relapse`,
      `/api/audits/${audit.id}/funnel?measure=relapse&cycleId=${first.id}`,
      `/api/audits/${audit.id}/trend`,
      `/api/audits/${audit.id}/survival`,
      `/api/audits/${audit.id}/calibration`,
      `/api/audits/${audit.id}/compare?first=${first.id}&second=${second.id}`,
    ];

    it('governance: no patient code, no operator name, no visit date in any audit response; operators are letters', async () => {
      const governance = w.as('governance');
      for (const url of endpoints()) {
        const response = await governance.get(url);
        expect(response.status, url).toBe(200);
        const json = jsonOf(response);
        for (const needle of [...codes, clinicianName, otherName, 'Dr Cal', 'Dr Sam', ...fixture.visitDates]) expect(json.includes(needle), `${url} contains ${needle}`).toBe(false);
        // Dates reach governance as months at most (DESIGN.md §7): no surgery day either.
        for (const surgery of Object.values(FIXTURE_SURGERY)) expect(json.includes(surgery), `${url} contains ${surgery}`).toBe(false);
      }
      const grouped = (await governance.get(`/api/audits/${audit.id}/results?groupBy=operator`)).body as AuditResults;
      // Letters follow operator ids (server/services/operator-labels.ts): the demo clinician has the lower id.
      expect(grouped.groups.map((group) => [group.key, group.label])).toEqual([
        ['Operator A', 'Operator A'],
        ['Operator B', 'Operator B'],
      ]);
      const funnel = (await governance.get(`/api/audits/${audit.id}/funnel`)).body as FunnelResult;
      expect(funnel.points.map((point) => [point.label, point.isSelf])).toEqual([
        ['Operator A', false],
        ['Operator B', false],
      ]);
    });

    it('a clinician sees their own name with "(you)" and the peer as a letter, never the peer’s name or patient codes', async () => {
      const clinician = w.as('clinician');
      for (const url of endpoints()) {
        const json = jsonOf(expectStatus(await clinician.get(url), 200));
        for (const needle of [...codes, otherName]) expect(json.includes(needle), `${url} contains ${needle}`).toBe(false);
      }
      const grouped = (await clinician.get(`/api/audits/${audit.id}/results?groupBy=operator`)).body as AuditResults;
      expect(grouped.groups.map((group) => group.label)).toEqual([`${clinicianName} (you)`, 'Operator B']);
      const funnel = (await clinician.get(`/api/audits/${audit.id}/funnel`)).body as FunnelResult;
      expect(funnel.points.map((point) => [point.label, point.isSelf])).toEqual([
        [`${clinicianName} (you)`, true],
        ['Operator B', false],
      ]);
      // The other clinician sees the same letters from their side.
      const other = (await w.as('other').get(`/api/audits/${audit.id}/results?groupBy=operator`)).body as AuditResults;
      expect(other.groups.map((group) => group.label)).toEqual(['Operator A', `${otherName} (you)`]);
    });

    it('partners and the lead see operator names, still no patient codes', async () => {
      for (const role of ['partner', 'audit_lead'] as const) {
        for (const url of endpoints()) {
          const json = jsonOf(expectStatus(await w.as(role).get(url), 200));
          for (const code of codes) expect(json.includes(code), `${role} ${url} contains ${code}`).toBe(false);
        }
        const grouped = (await w.as(role).get(`/api/audits/${audit.id}/results?groupBy=operator`)).body as AuditResults;
        expect(grouped.groups.map((group) => group.label), role).toEqual([clinicianName, otherName]);
      }
    });

    it('review notes stay with partners and the lead: 403 for governance and clinicians', async () => {
      for (const role of ['governance', 'clinician'] as const) {
        expect((await w.as(role).get(`/api/audits/${audit.id}/notes`)).status, role).toBe(403);
      }
      expect((await w.as('partner').get(`/api/audits/${audit.id}/notes`)).status).toBe(200);
    });
  });
});
