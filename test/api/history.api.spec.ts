import type { CaseDetail, ChangeRecordView, SiteView } from '@tidemark/shared';
import { clinicalFingerprint, countRows, createCase, createClinicalWorld, expectStatus, rowOf, siteBody, type ClinicalWorld } from './support/clinical-fixtures';
import { ApiClient } from './support/test-app';
import { queryRows } from './support/test-database';

type HistoryPage = { items: ChangeRecordView[]; total: number };

/** The parts of a change record a reviewer reads: what, old → new, who, why (DESIGN.md §7). */
const summary = ({ entity, entityId, caseId, field, oldValue, newValue, changedBy, reason }: ChangeRecordView) => ({ entity, entityId, caseId, field, oldValue, newValue, by: changedBy.id, reason });

describe('change history of measurements (DESIGN.md §7: append-only, who, when, old → new, reason)', () => {
  let w: ClinicalWorld;
  beforeAll(async () => {
    w = await createClinicalWorld();
  });
  afterAll(async () => {
    await w.close();
  });

  /** A clinician's case whose only site has no post-op reading yet (baseline 8 mm, KT 5 mm). */
  async function siteWithoutPostOp(): Promise<{ caseId: number; site: SiteView }> {
    const found = await createCase(w.as('clinician'), w.ids.clinician, { sites: [siteBody({ postOpRefGm: null })] });
    return { caseId: found.id, site: found.sites[0] };
  }

  it('takes the first entry of an empty value without a reason, and records it', async () => {
    const { caseId, site } = await siteWithoutPostOp();
    const response = await w.as('clinician').patch(`/api/sites/${site.id}`, { postOpRefGm: 10, version: 1 });
    expect(response.status, JSON.stringify(response.body)).toBe(200);
    // Crown gain = 10 − 8 = 2 mm once the post-op reading exists (DESIGN.md §3).
    expect(response.body).toEqual(expect.objectContaining({ postOpRefGm: 10, crownGain: 2, version: 2 }));
    const detail = (await w.as('clinician').get(`/api/cases/${caseId}`)).body as CaseDetail;
    expect(detail.history.map(summary)).toEqual([{ entity: 'site', entityId: site.id, caseId, field: 'postOpRefGm', oldValue: null, newValue: '10', by: w.ids.clinician, reason: null }]);
  });

  it('refuses to change a recorded value without a reason (400, field reason) and changes nothing', async () => {
    const { site } = await siteWithoutPostOp();
    expectStatus(await w.as('clinician').patch(`/api/sites/${site.id}`, { postOpRefGm: 10, version: 1 }), 200);
    const before = await clinicalFingerprint(w.t);
    const row = await rowOf(w.t, 'site', site.id);
    for (const body of [
      { postOpRefGm: 10.5, version: 2 },
      { postOpRefGm: 10.5, version: 2, reason: '' },
      { postOpRefGm: 10.5, version: 2, reason: '  ' },
      // A first entry (papilla score was empty) mixed with a correction (KT was 5 mm) still needs the reason.
      { papillaScore: 2, ktWidth: 4.5, version: 2 },
    ]) {
      const response = await w.as('clinician').patch(`/api/sites/${site.id}`, body);
      expect(response.status, JSON.stringify(body)).toBe(400);
      expect(Object.keys(response.body.error.fields)).toEqual(['reason']);
    }
    expect(await clinicalFingerprint(w.t)).toEqual(before);
    expect(await rowOf(w.t, 'site', site.id)).toEqual(row);
  });

  it('records a correction with entity, field, old and new value, who and why, in the case and in GET /api/history', async () => {
    const { caseId, site } = await siteWithoutPostOp();
    expectStatus(await w.as('clinician').patch(`/api/sites/${site.id}`, { postOpRefGm: 10, version: 1 }), 200);
    const corrected = await w.as('audit_lead').patch(`/api/sites/${site.id}`, { postOpRefGm: 10.5, ktWidth: 5, version: 2, reason: 'Stent notch misread at entry' });
    expect(corrected.status).toBe(200);
    // Unchanged values (KT still 5 mm) leave no record; crown gain now 10.5 − 8 = 2.5 mm.
    expect(corrected.body).toEqual(expect.objectContaining({ postOpRefGm: 10.5, crownGain: 2.5, version: 3 }));
    const expected = [
      { entity: 'site', entityId: site.id, caseId, field: 'postOpRefGm', oldValue: '10', newValue: '10.5', by: w.ids.audit_lead, reason: 'Stent notch misread at entry' },
      { entity: 'site', entityId: site.id, caseId, field: 'postOpRefGm', oldValue: null, newValue: '10', by: w.ids.clinician, reason: null },
    ];
    const detail = (await w.as('clinician').get(`/api/cases/${caseId}`)).body as CaseDetail;
    expect(detail.history.map(summary)).toEqual(expected);
    expect(detail.history[0].changedBy.displayName).toBe('Dr Lena Lead (demo)');
    expect(Number.isNaN(Date.parse(detail.history[0].changedAt))).toBe(false);
    for (const role of ['audit_lead', 'clinician', 'partner', 'admin'] as const) {
      const page = (await w.as(role).get(`/api/history?caseId=${caseId}`)).body as HistoryPage;
      expect(page.items.map(summary)).toEqual(expected);
      expect(page.total).toBe(2);
    }
  });

  it('records case edits with their reason', async () => {
    const found = await createCase(w.as('clinician'), w.ids.clinician);
    expectStatus(await w.as('clinician').patch(`/api/cases/${found.id}`, { deepestProbingMm: 3.5, instrument: 'laser', version: 1, reason: 'Completing the surgical record' }), 200);
    const page = (await w.as('clinician').get(`/api/history?caseId=${found.id}`)).body as HistoryPage;
    expect(page.items.map(summary).sort((a, b) => a.field.localeCompare(b.field))).toEqual([
      { entity: 'case', entityId: found.id, caseId: found.id, field: 'deepestProbingMm', oldValue: null, newValue: '3.5', by: w.ids.clinician, reason: 'Completing the surgical record' },
      { entity: 'case', entityId: found.id, caseId: found.id, field: 'instrument', oldValue: 'scalpel', newValue: 'laser', by: w.ids.clinician, reason: 'Completing the surgical record' },
    ]);
  });

  it('the database refuses UPDATE and DELETE on the history table', async () => {
    const { site } = await siteWithoutPostOp();
    expectStatus(await w.as('clinician').patch(`/api/sites/${site.id}`, { postOpRefGm: 10, version: 1 }), 200);
    const [record] = (await w.t.dataSource.query('SELECT * FROM change_record ORDER BY id DESC LIMIT 1')) as Record<string, unknown>[];
    const count = await countRows(w.t, 'change_record');
    const id = record.id;
    await expect(queryRows(w.t.dataSource, "UPDATE change_record SET new_value = '12', reason = 'tampered' WHERE id = :id", { id })).rejects.toThrow(/append-only/);
    await expect(queryRows(w.t.dataSource, 'DELETE FROM change_record WHERE id = :id', { id })).rejects.toThrow(/append-only/);
    await expect(w.t.dataSource.query('DELETE FROM change_record')).rejects.toThrow(/append-only/);
    expect(await countRows(w.t, 'change_record')).toBe(count);
    const [after] = await queryRows(w.t.dataSource, 'SELECT * FROM change_record WHERE id = :id', { id });
    expect(after).toEqual(record);
  });
});

describe('GET /api/history: who sees what (DESIGN.md §2: view change history)', () => {
  let w: ClinicalWorld;
  let ownCase: number;
  let othersCase: number;
  beforeAll(async () => {
    w = await createClinicalWorld();
    const own = await createCase(w.as('clinician'), w.ids.clinician);
    const others = await createCase(w.as('other'), w.ids.other);
    ownCase = own.id;
    othersCase = others.id;
    expectStatus(await w.as('clinician').patch(`/api/sites/${own.sites[0].id}`, { ktWidth: 4, version: 1, reason: 'Re-measured' }), 200);
    expectStatus(await w.as('other').patch(`/api/sites/${others.sites[0].id}`, { ktWidth: 3.5, version: 1, reason: 'Re-measured' }), 200);
    expectStatus(await w.as('other').patch(`/api/cases/${others.id}`, { notes: 'Sutures removed', version: 1, reason: 'Note added' }), 200);
  });
  afterAll(async () => {
    await w.close();
  });

  it('answers 401 anonymously and 403 to governance', async () => {
    expect((await new ApiClient(w.t.app).get('/api/history')).status).toBe(401);
    const governance = await w.as('governance').get('/api/history');
    expect(governance.status).toBe(403);
    expect(governance.body.error.code).toBe('forbidden');
  });

  it('shows admin, partner and audit lead every record, newest first', async () => {
    for (const role of ['admin', 'partner', 'audit_lead'] as const) {
      const page = (await w.as(role).get('/api/history')).body as HistoryPage;
      expect(page.total).toBe(3);
      expect(page.items.map((record) => [record.caseId, record.field])).toEqual([
        [othersCase, 'notes'],
        [othersCase, 'ktWidth'],
        [ownCase, 'ktWidth'],
      ]);
    }
  });

  it("shows a clinician only their own cases' records, even when asking for another case", async () => {
    const own = (await w.as('clinician').get('/api/history')).body as HistoryPage;
    expect(own.items.map((record) => [record.caseId, record.field, record.oldValue, record.newValue])).toEqual([[ownCase, 'ktWidth', '5', '4']]);
    expect(own.total).toBe(1);
    const asking = (await w.as('clinician').get(`/api/history?caseId=${othersCase}`)).body as HistoryPage;
    expect(asking).toEqual({ items: [], total: 0 });
    expect((await w.as('clinician').get(`/api/cases/${othersCase}`)).status).toBe(404);
  });

  it('pages, and answers 400 for pageSize 0 or over 200', async () => {
    const first = (await w.as('audit_lead').get('/api/history?pageSize=2&page=0')).body as HistoryPage;
    const second = (await w.as('audit_lead').get('/api/history?pageSize=2&page=1')).body as HistoryPage;
    expect(first.items.map((record) => record.field)).toEqual(['notes', 'ktWidth']);
    expect(second.items.map((record) => record.caseId)).toEqual([ownCase]);
    expect(first.total).toBe(3);
    for (const query of ['pageSize=0', 'pageSize=201', 'page=-1', 'caseId=abc']) {
      const response = await w.as('audit_lead').get(`/api/history?${query}`);
      expect(response.status).toBe(400);
      expect(Object.keys(response.body.error.fields)).toEqual([query.split('=')[0]]);
    }
  });
});
