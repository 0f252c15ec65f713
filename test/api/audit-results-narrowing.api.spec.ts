import type { AuditResults, AuditView, FunnelResult, IntervalOutcomeSummary, SurvivalResult, TrendResult } from '@tidemark/shared';
import { auditBody, buildOutcomeFixture, createAudit, defaultScheduleId, type OutcomeFixture } from './support/audit-fixtures';
import { createClinicalWorld, expectStatus, type ClinicalWorld } from './support/clinical-fixtures';
import type { ApiClient } from './support/test-app';

/*
 * Results narrowed to a phenotype and/or an operator, on the hand-built outcome fixture
 * (table in support/audit-fixtures.ts; rebound = post-op − recall REF→GM, DESIGN.md §3):
 *   thin:  C1 (A, P1), C3 (B, P3), C5 (B, P1)   → sites S1 S2 S4 S5 S7; 6 m rebound 0.5, 1.0, 0, −0.5
 *   thick: C2 (A, P2), C4 (B, P4)               → sites S3 S6;          6 m rebound 1.5 (S6 missed)
 *   A:     C1, C2                               → sites S1 S2 S3;       6 m rebound 0.5, 1.0, 1.5
 *   B:     C3, C4, C5                           → sites S4 S5 S6 S7;    6 m rebound 0, −0.5
 * Means worked by hand from those rows.
 */

const at = (results: AuditResults, key: string) => results.summary.intervals.find((interval) => interval.intervalKey === key) as IntervalOutcomeSummary;

describe('audit results narrowed to a phenotype and an operator', () => {
  let w: ClinicalWorld;
  let lead: ApiClient;
  let fixture: OutcomeFixture;
  let audit: AuditView;

  const results = async (client: ApiClient, query: string): Promise<AuditResults> =>
    expectStatus(await client.get(`/api/audits/${audit.id}/results?${query}`), 200).body as AuditResults;

  beforeAll(async () => {
    w = await createClinicalWorld();
    lead = w.as('audit_lead');
    fixture = await buildOutcomeFixture(w);
    audit = await createAudit(lead, auditBody(await defaultScheduleId(lead)));
  });
  afterAll(async () => {
    await w.close();
  });

  it('narrows to thin phenotype: 3 cases, 2 patients, 5 sites; 6 m mean rebound (0.5 + 1.0 + 0 − 0.5) / 4 = 0.25 mm', async () => {
    const thin = await results(lead, 'phenotype=thin');
    expect(thin.cohort).toEqual({ cases: 3, patients: 2, sites: 5 });
    expect(at(thin, '6m').nSites).toBe(4);
    expect(at(thin, '6m').rebound.site?.mean).toBeCloseTo(0.25, 10);
  });

  it('narrows to one operator, and to both at once (B and thin: C3, C5)', async () => {
    const operatorB = await results(lead, `operatorId=${fixture.operatorB}`);
    expect(operatorB.cohort).toEqual({ cases: 3, patients: 3, sites: 4 });
    // S4 0, S5 −0.5 → −0.25 mm.
    expect(at(operatorB, '6m').rebound.site?.mean).toBeCloseTo(-0.25, 10);
    const thinB = await results(lead, `operatorId=${fixture.operatorB}&phenotype=thin`);
    expect(thinB.cohort).toEqual({ cases: 2, patients: 2, sites: 3 });
    expect(at(thinB, '6m').nSites).toBe(2);
    // A narrowed view equals that group of the grouped view (same rule as groupDataset).
    const byPhenotype = await results(lead, `operatorId=${fixture.operatorB}&groupBy=phenotype`);
    expect(byPhenotype.groups.find((group) => group.key === 'thin')?.summary).toEqual(thinB.summary);
  });

  it('answers an empty narrowing with empty results, not an error', async () => {
    // No case in the cohort belongs to a made-up operator id.
    const nobody = await results(lead, `operatorId=${fixture.operatorB + 1000}`);
    expect(nobody.cohort).toEqual({ cases: 0, patients: 0, sites: 0 });
    expect(at(nobody, '6m').nSites).toBe(0);
  });

  it('narrows the control chart and time to relapse with the same filters', async () => {
    const survival = expectStatus(await lead.get(`/api/audits/${audit.id}/survival?phenotype=thin`), 200).body as SurvivalResult;
    // Thin sites S1 S2 S4 S5 S7; the only relapse (> 1.0 mm) is S3, thick → 0 events, 5 censored.
    expect([survival.nSites, survival.events, survival.censored]).toEqual([5, 0, 5]);
    const operatorA = expectStatus(await lead.get(`/api/audits/${audit.id}/survival?operatorId=${fixture.operatorA}`), 200).body as SurvivalResult;
    // A's sites S1 S2 S3; S3 relapses (1.5 mm) at 182 days.
    expect([operatorA.nSites, operatorA.events]).toEqual([3, 1]);
    const trend = expectStatus(await lead.get(`/api/audits/${audit.id}/trend?operatorId=${fixture.operatorA}&intervalKey=6m`), 200).body as TrendResult;
    // A at 6 m by month of surgery: January (C1) S1 0.5, S2 1.0 → 0.75; February (C2) S3 1.5. B's March cases are left out.
    expect(trend.rebound.points.map((point) => [point.month, point.value])).toEqual([
      ['2024-01', 0.75],
      ['2024-02', 1.5],
    ]);
  });

  it('narrows the funnel by phenotype only: every operator is still compared', async () => {
    const funnel = expectStatus(await lead.get(`/api/audits/${audit.id}/funnel?phenotype=thin`), 200).body as FunnelResult;
    // Thin cases: A has C1 (no complication), B has C3 (grade II) and C5 → 1 of 3 overall.
    expect([funnel.totalEvents, funnel.totalN]).toEqual([1, 3]);
    expect(funnel.points.map((point) => [point.events, point.n])).toEqual([
      [0, 1],
      [1, 2],
    ]);
  });

  it('lets the audit lead and partners narrow to any operator, a clinician only to themself, governance to none', async () => {
    const partner = w.as('partner');
    expect((await results(partner, `operatorId=${fixture.operatorA}`)).cohort.cases).toBe(2);
    // Partner first, so the narrowed entry is in the results cache before the clinician asks for it.
    const clinicianB = w.as('other');
    const refused = await clinicianB.get(`/api/audits/${audit.id}/results?operatorId=${fixture.operatorA}`);
    expect(refused.status).toBe(403);
    expect(refused.body.error).toEqual(expect.objectContaining({ code: 'forbidden', message: expect.stringMatching(/own cases/) }));
    expect((await results(clinicianB, `operatorId=${fixture.operatorB}`)).cohort.cases).toBe(3);
    for (const view of ['results', 'trend', 'survival', 'calibration']) {
      expect((await w.as('governance').get(`/api/audits/${audit.id}/${view}?operatorId=${fixture.operatorA}`)).status).toBe(403);
      expect((await clinicianB.get(`/api/audits/${audit.id}/${view}?operatorId=${fixture.operatorA}`)).status).toBe(403);
    }
    expect((await results(w.as('governance'), 'phenotype=thick')).cohort.cases).toBe(2);
  });

  it('refuses a phenotype or operator it does not know with a 400 naming the field', async () => {
    const phenotype = await lead.get(`/api/audits/${audit.id}/results?phenotype=medium`);
    expect(phenotype.status).toBe(400);
    expect(phenotype.body.error.fields).toEqual({ phenotype: 'Choose thin or thick.' });
    const operator = await lead.get(`/api/audits/${audit.id}/survival?operatorId=someone`);
    expect(operator.status).toBe(400);
    expect(operator.body.error.fields).toEqual({ operatorId: 'Choose an operator from the list.' });
  });
});
