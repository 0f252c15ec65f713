import type { CaseDetail, CaseListItem, CaseListPage } from '@tidemark/shared';
import type { MockInstance } from 'vitest';
import { createCase, createClinicalWorld, expectStatus, siteBody, visitBody, type ClinicalWorld } from './support/clinical-fixtures';
import type { ApiClient } from './support/test-app';

/*
 * The case list cache (server/services/case-list-cache.ts): an unchanged `GET /api/cases` is
 * answered from serialised pages without running the list query again; every write the list
 * shows — a new case, a corrected case, a new recall, a new site, a corrected patient, a renamed
 * operator — makes the next request recompute; and a page is only ever served within the viewer's
 * scope (a clinician's own cases, or every case for the roles that read all; DESIGN.md §2).
 * "Computed" is observed by spying on CaseService.list, the query every computation runs.
 */

const LIST = '/api/cases?pageSize=50';

describe('case list cache', () => {
  let w: ClinicalWorld;
  let lead: ApiClient;
  let computed: MockInstance;
  let ownCase: CaseDetail;
  let otherCase: CaseDetail;

  const page = async (client: ApiClient, url = LIST): Promise<CaseListPage> => expectStatus(await client.get(url), 200).body as CaseListPage;
  const itemOf = (listed: CaseListPage, id: number): CaseListItem | undefined => listed.items.find((item) => item.id === id);

  beforeAll(async () => {
    w = await createClinicalWorld();
    lead = w.as('audit_lead');
    ownCase = await createCase(lead, w.ids.clinician);
    otherCase = await createCase(lead, w.ids.other);
    computed = vi.spyOn(w.t.services.cases, 'list');
  });
  afterAll(async () => {
    await w.close();
  });
  beforeEach(() => {
    computed.mockClear();
  });

  it('answers an unchanged request from the cache, byte for byte, whatever order the query came in', async () => {
    const before = w.t.services.cases.listCacheStats();
    const first = await w.as('partner').get('/api/cases?page=0&pageSize=50');
    const second = await w.as('partner').get('/api/cases?pageSize=50&page=0');
    expect(second.status).toBe(200);
    expect(second.text).toBe(first.text);
    expect(computed).toHaveBeenCalledTimes(1);
    const after = w.t.services.cases.listCacheStats();
    expect([after.misses - before.misses, after.hits - before.hits]).toEqual([1, 1]);
  });

  it('sends what res.json sent: JSON with its charset, and the ETag Express computes, so an unchanged page revalidates with 304', async () => {
    const response = await w.as('partner').get(LIST);
    expect(response.headers['content-type']).toBe('application/json; charset=utf-8');
    expect(response.headers['cache-control']).toBe('no-store');
    // Express's own ETag function (the app's `etag fn` setting: weak, over the body's bytes).
    const etagOf = w.t.app.get('etag fn') as (body: Buffer) => string;
    expect(response.headers.etag).toBe(etagOf(Buffer.from(response.text, 'utf8')));
    const revalidated = await w.as('partner').agent.get(LIST).set('If-None-Match', response.headers.etag);
    expect(revalidated.status).toBe(304);
  });

  it('recomputes after every kind of write the list shows', async () => {
    const partner = w.as('partner');
    await page(partner);
    computed.mockClear();

    // A new case: a new highest id.
    const added = await createCase(lead, w.ids.clinician);
    expect(itemOf(await page(partner), added.id)).toBeDefined();

    // A corrected case: the update appends a change record.
    expectStatus(await lead.patch(`/api/cases/${ownCase.id}`, { procedure: 'apically-positioned-flap', version: 1, reason: 'Entered under the wrong procedure' }), 200);
    expect(itemOf(await page(partner), ownCase.id)?.procedure).toBe('apically-positioned-flap');

    // A first recall: a new visit (and the case moves on to its recall phase).
    expectStatus(await lead.post(`/api/cases/${ownCase.id}/visits`, visitBody([{ siteId: ownCase.sites[0].id, refGm: 9.5 }])), 201);
    expect(itemOf(await page(partner), ownCase.id)).toMatchObject({ visitCount: 1, status: 'in-recall' });

    // A new site: a new tooth in the list's teeth.
    expectStatus(await lead.post(`/api/cases/${ownCase.id}/sites`, siteBody({ tooth: 21 })), 201);
    expect(itemOf(await page(partner), ownCase.id)?.teeth).toEqual([11, 21]);

    // A corrected patient: the phenotype column comes from the patient.
    expectStatus(await lead.patch(`/api/patients/${ownCase.patient.id}`, { phenotype: 'thick', version: 1, reason: 'Re-assessed by probe transparency' }), 200);
    expect(itemOf(await page(partner), ownCase.id)?.phenotype).toBe('thick');

    // A renamed operator: no clinical write at all, the names are part of the generation.
    expectStatus(await w.as('admin').patch(`/api/users/${w.ids.other}`, { displayName: 'Dr Sam Renamed (test)' }), 200);
    expect(itemOf(await page(partner), otherCase.id)?.operator.displayName).toBe('Dr Sam Renamed (test)');

    // One computation per write, none more.
    expect(computed).toHaveBeenCalledTimes(6);
  });

  it('keeps a clinician’s page to their own cases: pages are cached per viewer scope, never shared', async () => {
    const own = await page(w.as('clinician'));
    const other = await page(w.as('other'));
    const everyone = await page(w.as('partner'));
    expect(own.items.length).toBeGreaterThan(0);
    expect(own.items.every((item) => item.operator.id === w.ids.clinician)).toBe(true);
    expect(other.items.map((item) => item.id)).toEqual([otherCase.id]);
    expect(everyone.total).toBe(own.total + other.total);
    // The same query again, by each: still each one's own page.
    expect(await page(w.as('other'))).toEqual(other);
    expect(await page(w.as('clinician'))).toEqual(own);
  });

  it('checks the role before the cache: governance is refused even while a page is cached', async () => {
    await page(w.as('partner'));
    const refused = await w.as('governance').get(LIST);
    expect(refused.status).toBe(403);
    expect(refused.body.error.code).toBe('forbidden');
  });
});
