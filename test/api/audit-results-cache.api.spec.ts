import type { AuditResults, AuditView, CaseDetail, CycleView, StandardView } from '@tidemark/shared';
import type { MockInstance } from 'vitest';
import { FIXTURE_STANDARDS, FIXTURE_SURGERY, addCycle, addDays, addStandard, auditBody, buildOutcomeFixture, createAudit, defaultScheduleId, moveCycle, type OutcomeFixture } from './support/audit-fixtures';
import { createClinicalWorld, expectStatus, visitBody, type ClinicalWorld } from './support/clinical-fixtures';
import type { ApiClient } from './support/test-app';

/*
 * The results cache (server/services/audit-results-cache.ts): an unchanged request is answered
 * without reading the dataset again; any write the results depend on makes the next request
 * recompute. "Computed" is observed by spying on AuditDatasetService.build, the dataset read
 * every computation starts with. Expected numbers are worked by hand from the outcome fixture
 * (table in support/audit-fixtures.ts) with DESIGN.md §3: rebound = post-op − recall REF→GM.
 */

const sixMonths = (results: AuditResults) => results.summary.intervals.find((interval) => interval.intervalKey === '6m');

describe('audit results cache', () => {
  let w: ClinicalWorld;
  let lead: ApiClient;
  let fixture: OutcomeFixture;
  let audit: AuditView;
  let standards: StandardView[];
  let builds: MockInstance;

  const results = async (client: ApiClient, query = ''): Promise<AuditResults> =>
    expectStatus(await client.get(`/api/audits/${audit.id}/results${query}`), 200).body as AuditResults;

  beforeAll(async () => {
    w = await createClinicalWorld();
    lead = w.as('audit_lead');
    fixture = await buildOutcomeFixture(w);
    audit = await createAudit(lead, auditBody(await defaultScheduleId(lead)));
    standards = [];
    for (const standard of FIXTURE_STANDARDS) standards.push(await addStandard(lead, audit.id, standard));
    builds = vi.spyOn(w.t.services.datasets, 'build');
  });
  afterAll(async () => {
    await w.close();
  });
  beforeEach(() => {
    builds.mockClear();
  });

  it('answers an unchanged request from the cache, with the same body', async () => {
    const before = w.t.services.results.cacheStats();
    const first = await results(lead);
    const second = await results(lead);
    expect(second).toEqual(first);
    expect(builds).toHaveBeenCalledTimes(1);
    const after = w.t.services.results.cacheStats();
    expect([after.misses - before.misses, after.hits - before.hits]).toEqual([1, 1]);
  });

  it('recomputes after a new recall measurement (a new visit writes no change record)', async () => {
    const before = await results(lead);
    // Fixture: at 6 m S1 0.5, S2 1.0, S3 1.5, S4 0, S5 −0.5 → 5 sites, mean 2.5 / 5 = 0.5 mm.
    expect(sixMonths(before)?.nSites).toBe(5);
    expect(sixMonths(before)?.rebound.site?.mean).toBeCloseTo(0.5, 10);
    builds.mockClear();
    expect(sixMonths(await results(lead))?.nSites).toBe(5);
    expect(builds).not.toHaveBeenCalled();

    // S6 (post-op 7.5) seen at 6 m at 6.5 → rebound 1.0: 6 sites, mean (2.5 + 1.0) / 6 = 0.583333 mm.
    expectStatus(
      await lead.post(
        `/api/cases/${fixture.cases.C4}/visits`,
        visitBody([{ siteId: fixture.sites.S6, refGm: 6.5 }], { intervalKey: '6m', visitDate: addDays(FIXTURE_SURGERY.C4, 182) }),
      ),
      201,
    );
    const after = await results(lead);
    expect(builds).toHaveBeenCalledTimes(1);
    expect(sixMonths(after)?.nSites).toBe(6);
    expect(sixMonths(after)?.rebound.site?.mean).toBeCloseTo(3.5 / 6, 10);
  });

  it('recomputes after a corrected measurement (recorded in the change history)', async () => {
    const before = sixMonths(await results(lead))?.rebound.site?.mean ?? NaN;
    const c1 = expectStatus(await lead.get(`/api/cases/${fixture.cases.C1}`), 200).body as CaseDetail;
    const visit = c1.visits.find((candidate) => candidate.intervalKey === '6m');
    if (!visit) throw new Error('C1 has no 6-month visit');
    builds.mockClear();
    // S1 at 6 m: 9.5 → 9.0, so its rebound (post-op 10) goes from 0.5 to 1.0: the site sum rises by 0.5.
    expectStatus(
      await lead.patch(`/api/visits/${visit.id}`, { measurements: [{ siteId: fixture.sites.S1, refGm: 9 }], version: visit.version, reason: 'Misread probe' }),
      200,
    );
    const after = sixMonths(await results(lead));
    expect(builds).toHaveBeenCalledTimes(1);
    expect(after?.rebound.site?.mean).toBeCloseTo(before + 0.5 / (after?.nSites ?? NaN), 10);
  });

  it('recomputes after a standard is changed, added or removed', async () => {
    await results(lead);
    const [meanRebound] = standards;
    builds.mockClear();
    const changed = expectStatus(await lead.patch(`/api/standards/${meanRebound.id}`, { ...FIXTURE_STANDARDS[0], target: 0.25, version: meanRebound.version }), 200).body as StandardView;
    const afterEdit = await results(lead);
    expect(builds).toHaveBeenCalledTimes(1);
    expect(afterEdit.standards.find((result) => result.standard.id === meanRebound.id)?.standard).toEqual(expect.objectContaining({ target: 0.25, version: changed.version }));

    const added = await addStandard(lead, audit.id, { ...FIXTURE_STANDARDS[0], criterion: 'Mean rebound at 6 weeks within 1 mm', intervalKey: '6w' });
    expect((await results(lead)).standards.map((result) => result.standard.id)).toContain(added.id);
    expectStatus(await lead.delete(`/api/standards/${added.id}`), 204);
    expect((await results(lead)).standards.map((result) => result.standard.id)).not.toContain(added.id);
    expect(builds).toHaveBeenCalledTimes(3);
  });

  it('keeps entries per grouping and applies operator labels for each viewer', async () => {
    const names = await results(lead, '?groupBy=operator');
    const letters = await results(w.as('governance'), '?groupBy=operator');
    // One computation for both viewers; the lead sees names, governance letters (DESIGN.md §2).
    expect(builds).toHaveBeenCalledTimes(1);
    expect(names.groups.map((group) => group.label)).toEqual(['Dr Cal Clinician (demo)', 'Dr Sam Second (test)']);
    expect(letters.groups.map((group) => group.label)).toEqual(['Operator A', 'Operator B']);
    expect(letters.groups.map((group) => group.summary)).toEqual(names.groups.map((group) => group.summary));
    await results(lead, '?groupBy=procedure');
    expect(builds).toHaveBeenCalledTimes(2);
  });

  it('recomputes a cycle when its period changes; a frozen cycle reads its snapshot', async () => {
    const cycle: CycleView = await addCycle(lead, audit.id, '2024-01-01', '2024-02-29');
    const query = `?cycleId=${cycle.id}`;
    expect((await results(lead, query)).cohort.cases).toBe(2);
    const widened = expectStatus(await lead.patch(`/api/cycles/${cycle.id}`, { periodEnd: '2024-03-31', version: cycle.version }), 200).body as CycleView;
    // C1, C2 and now C3 (2024-03-06).
    expect((await results(lead, query)).cohort.cases).toBe(3);
    expect(builds).toHaveBeenCalledTimes(2);
    const reported = await moveCycle(lead, widened, ['gathering', 'weighing', 'reported']);
    builds.mockClear();
    const frozen = await results(lead, query);
    expect(frozen.frozenAt).toBe(reported.frozenAt);
    expect(await results(lead, query)).toEqual(frozen);
    // Reporting froze the snapshot (one build); reading it never builds a dataset.
    expect(builds).not.toHaveBeenCalled();
  });

  it('answers 404, not a stale entry, once the audit is deleted', async () => {
    const doomed = await createAudit(lead, auditBody(await defaultScheduleId(lead), { title: 'Short-lived audit' }));
    expectStatus(await lead.get(`/api/audits/${doomed.id}/results`), 200);
    expectStatus(await lead.delete(`/api/audits/${doomed.id}`), 204);
    expectStatus(await lead.get(`/api/audits/${doomed.id}/results`), 404);
  });

  it('marks results private, no-cache and answers a matching If-None-Match with 304', async () => {
    const response = expectStatus(await lead.get(`/api/audits/${audit.id}/results`), 200);
    expect(response.headers['cache-control']).toBe('private, no-cache');
    const etag = response.headers.etag as string | undefined;
    expect(etag).toBeTruthy();
    const revalidated = await lead.agent.get(`/api/audits/${audit.id}/results`).set('If-None-Match', etag ?? '');
    expect(revalidated.status).toBe(304);
    expect(revalidated.text).toBe('');
  });
});
