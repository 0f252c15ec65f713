import type { AuditResults, AuditView, CaseDetail, CohortDefinitionInput, CohortPreview, CycleView, StandardView } from '@tidemark/shared';
import { describeAuditAccess, type AuditAccessRoute } from './support/audit-access-matrix';
import {
  FIXTURE_STANDARDS,
  addCycle,
  addStandard,
  auditBody,
  buildOutcomeFixture,
  createAudit,
  defaultScheduleId,
  scheduleBody,
  storeFingerprint,
  type OutcomeFixture,
} from './support/audit-fixtures';
import { createCase, createClinicalWorld, expectStatus, todayUtc, type ClinicalWorld } from './support/clinical-fixtures';
import type { ApiClient } from './support/test-app';

/** Everything the access matrix acts on, made once by the audit lead. */
interface AccessBase {
  scheduleId: number;
  audit: AuditView;
  first: CycleView;
  second: CycleView;
  caseOfClinician: CaseDetail;
}

describe('audits: access for every route and role (DESIGN.md §2)', () => {
  let world: ClinicalWorld;
  let base: AccessBase;
  beforeAll(async () => {
    world = await createClinicalWorld();
    const lead = world.as('audit_lead');
    const scheduleId = await defaultScheduleId(lead);
    const audit = await createAudit(lead, auditBody(scheduleId));
    await addStandard(lead, audit.id, FIXTURE_STANDARDS[1]);
    const first = await addCycle(lead, audit.id, '2024-01-01', '2024-06-30');
    const second = await addCycle(lead, audit.id, '2024-07-01', '2024-12-31');
    // The clinician's own case: calibration readings are entered by those who may write the case.
    const caseOfClinician = await createCase(lead, world.ids.clinician);
    base = { scheduleId, audit, first, second, caseOfClinician };
  });
  afterAll(async () => {
    await world.close();
  });

  const lead = () => world.as('audit_lead');
  const freshAudit = () => createAudit(lead(), auditBody(base.scheduleId, { title: 'A fresh audit' }));
  const read = (name: string, url: (b: AccessBase) => string): AuditAccessRoute => ({
    name,
    kind: 'read',
    isWrite: false,
    success: 200,
    prepare: async () => (client) => client.get(url(base)),
  });

  const ROUTES: AuditAccessRoute[] = [
    read('GET /api/audits', () => '/api/audits'),
    { name: 'POST /api/audits', kind: 'write', isWrite: true, success: 201, prepare: async () => (client) => client.post('/api/audits', auditBody(base.scheduleId)) },
    {
      name: 'POST /api/audits/cohort-preview',
      kind: 'read',
      isWrite: false,
      success: 200,
      prepare: async () => (client) => client.post('/api/audits/cohort-preview', { cohort: { procedures: ['gingivectomy'] } }),
    },
    read('GET /api/audits/:id', (b) => `/api/audits/${b.audit.id}`),
    {
      name: 'PATCH /api/audits/:id',
      kind: 'write',
      isWrite: true,
      success: 200,
      prepare: async () => {
        const audit = await freshAudit();
        return (client) => client.patch(`/api/audits/${audit.id}`, { title: 'Renamed audit', version: audit.version });
      },
    },
    {
      name: 'DELETE /api/audits/:id',
      kind: 'write',
      isWrite: true,
      success: 204,
      prepare: async () => {
        const audit = await freshAudit();
        return (client) => client.delete(`/api/audits/${audit.id}`);
      },
    },
    {
      name: 'POST /api/audits/:id/standards',
      kind: 'write',
      isWrite: true,
      success: 201,
      prepare: async () => (client) => client.post(`/api/audits/${base.audit.id}/standards`, FIXTURE_STANDARDS[0]),
    },
    {
      name: 'PATCH /api/standards/:id',
      kind: 'write',
      isWrite: true,
      success: 200,
      prepare: async () => {
        const standard = await addStandard(lead(), base.audit.id, FIXTURE_STANDARDS[0]);
        return (client) => client.patch(`/api/standards/${standard.id}`, { ...FIXTURE_STANDARDS[0], target: 0.8, version: standard.version });
      },
    },
    {
      name: 'DELETE /api/standards/:id',
      kind: 'write',
      isWrite: true,
      success: 204,
      prepare: async () => {
        const standard = await addStandard(lead(), base.audit.id, FIXTURE_STANDARDS[0]);
        return (client) => client.delete(`/api/standards/${standard.id}`);
      },
    },
    {
      name: 'POST /api/audits/:id/cycles',
      kind: 'write',
      isWrite: true,
      success: 201,
      prepare: async () => {
        const audit = await freshAudit();
        return (client) => client.post(`/api/audits/${audit.id}/cycles`, { periodStart: '2024-01-01', periodEnd: '2024-12-31' });
      },
    },
    {
      name: 'PATCH /api/cycles/:id',
      kind: 'write',
      isWrite: true,
      success: 200,
      prepare: async () => {
        const cycle = await addCycle(lead(), (await freshAudit()).id, '2024-01-01', '2024-12-31');
        return (client) => client.patch(`/api/cycles/${cycle.id}`, { state: 'gathering', version: cycle.version });
      },
    },
    {
      name: 'DELETE /api/cycles/:id',
      kind: 'write',
      isWrite: true,
      success: 204,
      prepare: async () => {
        const cycle = await addCycle(lead(), (await freshAudit()).id, '2024-01-01', '2024-12-31');
        return (client) => client.delete(`/api/cycles/${cycle.id}`);
      },
    },
    {
      name: 'POST /api/cycles/:id/actions',
      kind: 'write',
      isWrite: true,
      success: 201,
      prepare: async () => (client) => client.post(`/api/cycles/${base.first.id}/actions`, { action: 'Recalibrate examiners', ownerId: world.ids.partner, dueDate: '2025-03-31' }),
    },
    {
      name: 'PATCH /api/actions/:id',
      kind: 'write',
      isWrite: true,
      success: 200,
      prepare: async () => {
        const action = expectStatus(await lead().post(`/api/cycles/${base.first.id}/actions`, { action: 'Review stents', ownerId: world.ids.partner, dueDate: '2025-03-31' }), 201).body;
        return (client) => client.patch(`/api/actions/${action.id}`, { state: 'done', version: action.version });
      },
    },
    {
      name: 'DELETE /api/actions/:id',
      kind: 'write',
      isWrite: true,
      success: 204,
      prepare: async () => {
        const action = expectStatus(await lead().post(`/api/cycles/${base.first.id}/actions`, { action: 'Review stents', ownerId: world.ids.partner, dueDate: '2025-03-31' }), 201).body;
        return (client) => client.delete(`/api/actions/${action.id}`);
      },
    },
    { name: 'GET /api/audits/:id/notes', kind: 'note', isWrite: false, success: 200, prepare: async () => (client) => client.get(`/api/audits/${base.audit.id}/notes`) },
    {
      name: 'POST /api/audits/:id/notes',
      kind: 'note',
      isWrite: true,
      success: 201,
      prepare: async () => (client) => client.post(`/api/audits/${base.audit.id}/notes`, { topic: 'chart:funnel', text: 'Check operator B at the next meeting.' }),
    },
    read('GET /api/audits/:id/results', (b) => `/api/audits/${b.audit.id}/results`),
    read('GET /api/audits/:id/results?groupBy=operator', (b) => `/api/audits/${b.audit.id}/results?groupBy=operator`),
    read('GET /api/audits/:id/funnel', (b) => `/api/audits/${b.audit.id}/funnel`),
    read('GET /api/audits/:id/trend', (b) => `/api/audits/${b.audit.id}/trend`),
    read('GET /api/audits/:id/survival', (b) => `/api/audits/${b.audit.id}/survival`),
    read('GET /api/audits/:id/calibration', (b) => `/api/audits/${b.audit.id}/calibration`),
    read('GET /api/audits/:id/compare', (b) => `/api/audits/${b.audit.id}/compare?first=${b.first.id}&second=${b.second.id}`),
    {
      name: 'POST /api/calibration-readings (on the clinician’s own case)',
      kind: 'reading',
      isWrite: true,
      success: 201,
      prepare: async () => (client) => client.post('/api/calibration-readings', { siteId: base.caseOfClinician.sites[0].id, measuredOn: todayUtc(), refGm: 9.5 }),
    },
  ];
  describeAuditAccess(() => world, ROUTES);

  it("a clinician may not enter calibration readings on another operator's case (404, nothing stored)", async () => {
    const others = await createCase(lead(), world.ids.other);
    const before = await storeFingerprint(world.t);
    const response = await world.as('clinician').post('/api/calibration-readings', { siteId: others.sites[0].id, measuredOn: todayUtc(), refGm: 9.5 });
    expect(response.status).toBe(404);
    expect(await storeFingerprint(world.t)).toEqual(before);
  });
});

describe('audits and standards: create, read, edit, delete', () => {
  let w: ClinicalWorld;
  let lead: ApiClient;
  let scheduleId: number;
  beforeAll(async () => {
    w = await createClinicalWorld();
    lead = w.as('audit_lead');
    scheduleId = await defaultScheduleId(lead);
  });
  afterAll(async () => {
    await w.close();
  });

  it('creates an audit with the lead, the schedule, default thresholds (DESIGN.md §3: 0.5 / 1.0 mm) and an open cohort', async () => {
    const audit = await createAudit(lead, auditBody(scheduleId, { reauditDate: '2025-09-30' }));
    expect(audit).toEqual(
      expect.objectContaining({
        title: 'Margin stability after crown lengthening',
        lead: { id: w.ids.audit_lead, displayName: 'Dr Lena Lead (demo)' },
        thresholds: { stable: 0.5, relapse: 1 },
        reauditDate: '2025-09-30',
        version: 1,
        standards: [],
        cycles: [],
      }),
    );
    expect(audit.schedule.id).toBe(scheduleId);
    expect(audit.cohort).toEqual({ surgeryFrom: null, surgeryTo: null, procedures: [], operatorIds: [], phenotypes: [], indications: [], smoking: [], diabetes: [], regions: [], teeth: [] });
    const listed = expectStatus(await w.as('partner').get('/api/audits'), 200).body as AuditView[];
    expect(listed.map((item) => item.id)).toContain(audit.id);
    expect(expectStatus(await w.as('governance').get(`/api/audits/${audit.id}`), 200).body).toEqual(audit);
  });

  it('edits title, thresholds and cohort with the version; the cohort reads back as sent', async () => {
    const audit = await createAudit(lead, auditBody(scheduleId));
    const cohort = { surgeryFrom: '2024-01-01', surgeryTo: '2024-06-30', procedures: ['gingivectomy'], regions: ['maxillary-anterior'], teeth: [14] };
    const edited = await lead.patch(`/api/audits/${audit.id}`, { title: 'Aesthetic zone audit', thresholds: { stable: 0.5, relapse: 1.5 }, cohort, version: 1 });
    expect(edited.status, JSON.stringify(edited.body)).toBe(200);
    expect(edited.body).toEqual(expect.objectContaining({ title: 'Aesthetic zone audit', thresholds: { stable: 0.5, relapse: 1.5 }, version: 2 }));
    const expected = { ...audit.cohort, ...cohort };
    expect(edited.body.cohort).toEqual(expected);
    expect((await lead.get(`/api/audits/${audit.id}`)).body.cohort).toEqual(expected);
  });

  it('refuses a stale audit version with 409 and the current version, storing nothing', async () => {
    const audit = await createAudit(lead, auditBody(scheduleId));
    expectStatus(await lead.patch(`/api/audits/${audit.id}`, { title: 'First edit wins', version: 1 }), 200);
    const before = await storeFingerprint(w.t);
    const stale = await lead.patch(`/api/audits/${audit.id}`, { title: 'Second edit loses', version: 1 });
    expect(stale.status).toBe(409);
    expect(stale.body.error.details).toEqual({ currentVersion: 2 });
    expect(await storeFingerprint(w.t)).toEqual(before);
    expect((await lead.get(`/api/audits/${audit.id}`)).body.title).toBe('First edit wins');
  });

  it('deletes an audit without reported cycles (204) and then answers 404', async () => {
    const audit = await createAudit(lead, auditBody(scheduleId));
    await addCycle(lead, audit.id, '2024-01-01', '2024-12-31');
    expect((await lead.delete(`/api/audits/${audit.id}`)).status).toBe(204);
    expect((await lead.get(`/api/audits/${audit.id}`)).status).toBe(404);
  });

  it('adds standards in order, edits one with its version (stale → 409) and deletes one', async () => {
    const audit = await createAudit(lead, auditBody(scheduleId));
    const first = await addStandard(lead, audit.id, FIXTURE_STANDARDS[0]);
    const second = await addStandard(lead, audit.id, FIXTURE_STANDARDS[2]);
    expect([first.position, second.position]).toEqual([1, 2]);
    expect(first).toEqual(
      expect.objectContaining({ auditId: audit.id, metric: 'mean-rebound', intervalKey: '6m', thresholdMm: null, thresholdPct: null, minGrade: null, comparator: '<=', target: 1, version: 1 }),
    );
    const edited = await lead.patch(`/api/standards/${first.id}`, { ...FIXTURE_STANDARDS[0], target: 0.8, version: 1 });
    expect(edited.status, JSON.stringify(edited.body)).toBe(200);
    expect(edited.body).toEqual(expect.objectContaining({ id: first.id, target: 0.8, version: 2 }));
    const before = await storeFingerprint(w.t);
    const stale = await lead.patch(`/api/standards/${first.id}`, { ...FIXTURE_STANDARDS[0], target: 0.5, version: 1 });
    expect(stale.status).toBe(409);
    expect(await storeFingerprint(w.t)).toEqual(before);
    expect((await lead.delete(`/api/standards/${second.id}`)).status).toBe(204);
    const view = (await lead.get(`/api/audits/${audit.id}`)).body as AuditView;
    expect(view.standards.map((standard: StandardView) => [standard.id, standard.target])).toEqual([[first.id, 0.8]]);
  });
});

describe('audits, standards and cohorts: bad input → 400 with field errors, nothing stored', () => {
  let w: ClinicalWorld;
  let lead: ApiClient;
  let scheduleId: number;
  let audit: AuditView;
  beforeAll(async () => {
    w = await createClinicalWorld();
    lead = w.as('audit_lead');
    scheduleId = await defaultScheduleId(lead);
    audit = await createAudit(lead, auditBody(scheduleId));
  });
  afterAll(async () => {
    await w.close();
  });

  async function expectRefused(method: 'post' | 'patch', url: string, body: object, fields: string[]): Promise<void> {
    const before = await storeFingerprint(w.t);
    const response = await lead[method](url, body);
    expect(response.status, JSON.stringify(response.body)).toBe(400);
    expect(response.body.error.code).toBe('validation');
    expect(Object.keys(response.body.error.fields).sort()).toEqual(fields);
    expect(await storeFingerprint(w.t)).toEqual(before);
  }

  const AUDITS: [string, () => object, string[]][] = [
    ['no title', () => ({ rationale: 'Untitled', scheduleId }), ['title']],
    ['a two-letter title', () => auditBody(scheduleId, { title: 'Ab' }), ['title']],
    ['no schedule', () => ({ title: 'No schedule audit' }), ['scheduleId']],
    ['an unknown schedule', () => auditBody(999_999), ['scheduleId']],
    ['a relapse threshold above 5 mm', () => auditBody(scheduleId, { thresholds: { stable: 0.5, relapse: 5.5 } }), ['thresholds.relapse']],
    ['a stable limit above the relapse threshold', () => auditBody(scheduleId, { thresholds: { stable: 1.5, relapse: 1 } }), ['thresholds.relapse']],
    ['a threshold off the 0.25 mm step', () => auditBody(scheduleId, { thresholds: { stable: 0.3, relapse: 1 } }), ['thresholds.stable']],
    ['a cohort ending before it starts', () => auditBody(scheduleId, { cohort: { surgeryFrom: '2024-06-01', surgeryTo: '2024-05-31' } }), ['cohort.surgeryTo']],
    // ISO 3950: there is no tooth 19 (permanent teeth end at 18).
    ['a cohort with tooth 19', () => auditBody(scheduleId, { cohort: { teeth: [19] } }), ['cohort.teeth.0']],
    ['a cohort with an unknown region', () => ({ ...auditBody(scheduleId), cohort: { regions: ['upper-left'] } }), ['cohort.regions.0']],
    ['a cohort with an unknown procedure', () => ({ ...auditBody(scheduleId), cohort: { procedures: ['laser-magic'] } }), ['cohort.procedures.0']],
    ['an audit lead who is not an audit lead', () => auditBody(scheduleId, { leadId: w.ids.partner }), ['leadId']],
  ];
  for (const [name, body, fields] of AUDITS) {
    it(`POST /api/audits refuses ${name}`, async () => {
      await expectRefused('post', '/api/audits', body(), fields);
    });
  }

  it('PATCH /api/audits/:id refuses a cohort ending before it starts and tooth 19', async () => {
    await expectRefused('patch', `/api/audits/${audit.id}`, { cohort: { surgeryFrom: '2024-06-01', surgeryTo: '2024-01-01', teeth: [19] }, version: audit.version }, [
      'cohort.surgeryTo',
      'cohort.teeth.0',
    ]);
  });

  it('the cohort preview refuses the same cohort errors', async () => {
    await expectRefused('post', '/api/audits/cohort-preview', { cohort: { surgeryFrom: '2024-06-01', surgeryTo: '2024-05-31' } }, ['cohort.surgeryTo']);
    await expectRefused('post', '/api/audits/cohort-preview', { cohort: { teeth: [19] } }, ['cohort.teeth.0']);
  });

  const base = FIXTURE_STANDARDS[1];
  const STANDARDS: [string, object, string[]][] = [
    ['an unknown metric', { ...base, metric: 'mean-happiness' }, ['metric']],
    ['mean rebound without its interval', { ...FIXTURE_STANDARDS[0], intervalKey: null }, ['intervalKey']],
    ['a share within a limit without the limit', { ...base, thresholdMm: null }, ['thresholdMm']],
    ['a rebound limit above 10 mm', { ...base, thresholdMm: 10.5 }, ['thresholdMm']],
    ['a complication share without the grade', { ...FIXTURE_STANDARDS[2], minGrade: null }, ['minGrade']],
    ['an unknown Clavien–Dindo grade', { ...FIXTURE_STANDARDS[2], minGrade: 'VI' }, ['minGrade']],
    ['a bleeding limit above 100%', { criterion: 'Bleeding under 15%', metric: 'share-cases-bleeding-under', thresholdPct: 101, comparator: '>=', target: 80 }, ['thresholdPct']],
    ['a target above 100', { ...base, target: 101 }, ['target']],
    ['an unknown comparator', { ...base, comparator: '>' }, ['comparator']],
    ['no criterion', { ...base, criterion: '' }, ['criterion']],
  ];
  for (const [name, body, fields] of STANDARDS) {
    it(`POST /api/audits/:id/standards refuses ${name}`, async () => {
      await expectRefused('post', `/api/audits/${audit.id}/standards`, body, fields);
    });
  }

  it("refuses a standard on an interval the audit's schedule does not have (the results could not be computed)", async () => {
    const short = expectStatus(await lead.post('/api/schedules', scheduleBody()), 201).body;
    const shortAudit = await createAudit(lead, auditBody(short.id));
    // scheduleBody() has 6w and 6m only: '12m' is unknown to this audit.
    await expectRefused('post', `/api/audits/${shortAudit.id}/standards`, { ...FIXTURE_STANDARDS[0], intervalKey: '12m' }, ['intervalKey']);
    const standard = await addStandard(lead, shortAudit.id, FIXTURE_STANDARDS[0]);
    await expectRefused('patch', `/api/standards/${standard.id}`, { ...FIXTURE_STANDARDS[0], intervalKey: '3m', version: standard.version }, ['intervalKey']);
    expect((await lead.get(`/api/audits/${shortAudit.id}/results`)).status).toBe(200);
  });

  it('PATCH /api/standards/:id refuses a missing parameter and a missing version', async () => {
    const standard = await addStandard(lead, audit.id, FIXTURE_STANDARDS[1]);
    await expectRefused('patch', `/api/standards/${standard.id}`, { ...FIXTURE_STANDARDS[1], thresholdMm: null, version: standard.version }, ['thresholdMm']);
    await expectRefused('patch', `/api/standards/${standard.id}`, { ...FIXTURE_STANDARDS[1] }, ['version']);
  });
});

/*
 * Cohort filters against the outcome fixture (support/audit-fixtures.ts). Every expected count is
 * read off the fixture table by hand; the planned case C6 (P4, tooth 11, aesthetic gingivectomy by A)
 * never counts. Sites per case: C1 11 & 21, C2 14, C3 12 & 24, C4 36, C5 41; patients C1 P1, C2 P2,
 * C3 P3, C4 P4, C5 P1. Region 'maxillary-anterior' = FDI 11–13, 21–23 (canine to canine, common practice).
 */
describe('cohort filters narrow the cohort: preview and results agree', () => {
  let w: ClinicalWorld;
  let lead: ApiClient;
  let scheduleId: number;
  let fixture: OutcomeFixture;
  beforeAll(async () => {
    w = await createClinicalWorld();
    lead = w.as('audit_lead');
    scheduleId = await defaultScheduleId(lead);
    fixture = await buildOutcomeFixture(w);
  });
  afterAll(async () => {
    await w.close();
  });

  const FILTERS: [string, (f: OutcomeFixture) => CohortDefinitionInput, CohortPreview][] = [
    ['no filter: C1–C5', () => ({}), { cases: 5, patients: 4, sites: 7 }],
    ['surgeryFrom 2024-02-14 (inclusive): C2–C5', () => ({ surgeryFrom: '2024-02-14' }), { cases: 4, patients: 4, sites: 5 }],
    ['surgeryTo 2024-02-14 (inclusive): C1, C2', () => ({ surgeryTo: '2024-02-14' }), { cases: 2, patients: 2, sites: 3 }],
    ['surgery 2024-02-15 … 2024-04-10: C3, C4', () => ({ surgeryFrom: '2024-02-15', surgeryTo: '2024-04-10' }), { cases: 2, patients: 2, sites: 3 }],
    ['procedures gingivectomy: C1, C3, C5 (P1 twice)', () => ({ procedures: ['gingivectomy'] }), { cases: 3, patients: 2, sites: 5 }],
    ['procedures both flaps: C2, C4', () => ({ procedures: ['apically-positioned-flap', 'apf-osseous-recontouring'] }), { cases: 2, patients: 2, sites: 2 }],
    ['operator A: C1, C2', (f) => ({ operatorIds: [f.operatorA] }), { cases: 2, patients: 2, sites: 3 }],
    ['operator B: C3, C4, C5', (f) => ({ operatorIds: [f.operatorB] }), { cases: 3, patients: 3, sites: 4 }],
    ['phenotype thick: C2, C4', () => ({ phenotypes: ['thick'] }), { cases: 2, patients: 2, sites: 2 }],
    ['indication aesthetic: C1, C3', () => ({ indications: ['aesthetic'] }), { cases: 2, patients: 2, sites: 4 }],
    ['smoking former or current: C2, C3', () => ({ smoking: ['former', 'current'] }), { cases: 2, patients: 2, sites: 3 }],
    ['diabetes controlled: C3', () => ({ diabetes: ['controlled'] }), { cases: 1, patients: 1, sites: 2 }],
    ['region maxillary-anterior: sites 11, 21 (C1) and 12 (C3), not 24 nor 14', () => ({ regions: ['maxillary-anterior'] }), { cases: 2, patients: 2, sites: 3 }],
    ['region mandibular-anterior: site 41 (C5)', () => ({ regions: ['mandibular-anterior'] }), { cases: 1, patients: 1, sites: 1 }],
    ['region maxillary-posterior or tooth 36: sites 14, 24, 36', () => ({ regions: ['maxillary-posterior'], teeth: [36] }), { cases: 3, patients: 3, sites: 3 }],
    ['teeth 36 and 41: C4, C5', () => ({ teeth: [36, 41] }), { cases: 2, patients: 2, sites: 2 }],
    ['tooth 13: nobody', () => ({ teeth: [13] }), { cases: 0, patients: 0, sites: 0 }],
    ['gingivectomy by operator B: C3, C5', (f) => ({ procedures: ['gingivectomy'], operatorIds: [f.operatorB] }), { cases: 2, patients: 2, sites: 3 }],
  ];

  for (const [name, cohortOf, expected] of FILTERS) {
    it(`${name} → ${expected.cases} cases, ${expected.patients} patients, ${expected.sites} sites`, async () => {
      const cohort = cohortOf(fixture);
      const preview = await w.as('partner').post('/api/audits/cohort-preview', { cohort });
      expect(preview.status, JSON.stringify(preview.body)).toBe(200);
      expect(preview.body).toEqual(expected);
      const audit = await createAudit(lead, auditBody(scheduleId, { cohort }));
      const results = expectStatus(await lead.get(`/api/audits/${audit.id}/results`), 200).body as AuditResults;
      expect(results.cohort).toEqual(expected);
    });
  }

  it('a region filter audits only the matching sites: 6 m rebound over 11, 21 and 12 only', async () => {
    const audit = await createAudit(lead, auditBody(scheduleId, { cohort: { regions: ['maxillary-anterior'] } }));
    const results = expectStatus(await lead.get(`/api/audits/${audit.id}/results`), 200).body as AuditResults;
    const sixMonths = results.summary.intervals.find((interval) => interval.intervalKey === '6m');
    // Hand computation: S1 10 − 9.5 = 0.5, S2 11 − 10 = 1.0, S4 9.5 − 9.5 = 0 → n 3, mean 1.5 / 3 = 0.5 (S5 on tooth 24 left out).
    expect(sixMonths?.rebound.nSites).toBe(3);
    expect(sixMonths?.rebound.site?.mean).toBeCloseTo(0.5, 10);
    expect(sixMonths?.rebound.site?.max).toBe(1);
  });
});
