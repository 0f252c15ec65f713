import type { CaseDetail, CaseListItem, CaseListPage, SiteView } from '@tidemark/shared';
import {
  caseBody,
  clinicalFingerprint,
  countRows,
  createCase,
  createClinicalWorld,
  daysAgo,
  describeAccessMatrix,
  expectStatus,
  patientBody,
  rowOf,
  siteBody,
  versionOf,
  visitBody,
  type AccessRoute,
  type ClinicalWorld,
} from './support/clinical-fixtures';
import { ApiClient, signedInAs } from './support/test-app';

const ROUTES: AccessRoute[] = [
  { name: 'GET /api/cases', kind: 'list', success: 200, prepare: async () => (client) => client.get('/api/cases') },
  { name: 'POST /api/cases', kind: 'create', success: 201, prepare: async (_w, ownerId) => (client) => client.post('/api/cases', caseBody(ownerId)) },
  {
    name: 'GET /api/cases/:id',
    kind: 'read',
    success: 200,
    prepare: async (w, ownerId) => {
      const found = await createCase(w.as('audit_lead'), ownerId);
      return (client) => client.get(`/api/cases/${found.id}`);
    },
  },
  {
    name: 'PATCH /api/cases/:id',
    kind: 'write',
    success: 200,
    prepare: async (w, ownerId) => {
      const found = await createCase(w.as('audit_lead'), ownerId);
      return async (client) => client.patch(`/api/cases/${found.id}`, { notes: 'Provisional crowns fitted', version: await versionOf(w.t, 'surgical_case', found.id), reason: 'Completing the record' });
    },
  },
  {
    name: 'POST /api/cases/:id/sites',
    kind: 'write',
    success: 201,
    prepare: async (w, ownerId) => {
      const found = await createCase(w.as('audit_lead'), ownerId);
      return (client) => client.post(`/api/cases/${found.id}/sites`, siteBody({ tooth: 21 }));
    },
  },
  {
    name: 'PATCH /api/sites/:id',
    kind: 'write',
    success: 200,
    prepare: async (w, ownerId) => {
      const site = (await createCase(w.as('audit_lead'), ownerId)).sites[0];
      return async (client) => client.patch(`/api/sites/${site.id}`, { ktWidth: 4.5, version: await versionOf(w.t, 'site', site.id), reason: 'Re-measured with a calibrated probe' });
    },
  },
];

describe('cases and sites: access for every role (DESIGN.md §2)', () => {
  let world: ClinicalWorld;
  beforeAll(async () => {
    world = await createClinicalWorld();
  });
  afterAll(async () => {
    await world.close();
  });
  describeAccessMatrix(() => world, ROUTES);

  it('a clinician cannot register a case for another operator, and nothing is stored', async () => {
    const before = await clinicalFingerprint(world.t);
    const response = await world.as('clinician').post('/api/cases', caseBody(world.ids.other));
    expect(response.status).toBe(400);
    expect(Object.keys(response.body.error.fields)).toEqual(['operatorId']);
    expect(await clinicalFingerprint(world.t)).toEqual(before);
  });

  it('the operator must be an active clinician or audit lead', async () => {
    const before = await clinicalFingerprint(world.t);
    for (const operatorId of [world.ids.admin, world.ids.partner, world.ids.governance, 99_999]) {
      const response = await world.as('audit_lead').post('/api/cases', caseBody(operatorId));
      expect(response.status).toBe(400);
      expect(Object.keys(response.body.error.fields)).toEqual(['operatorId']);
    }
    expect(await clinicalFingerprint(world.t)).toEqual(before);
  });

  it('governance gets 403, not 404, for unknown ids too: no probing for which records exist', async () => {
    const governance = world.as('governance');
    const unknown = 999_999;
    const calls: [string, () => Promise<{ status: number }>][] = [
      ['GET case', () => governance.get(`/api/cases/${unknown}`)],
      ['PATCH case', () => governance.patch(`/api/cases/${unknown}`, { notes: 'x', version: 1, reason: 'Probing' })],
      ['POST site', () => governance.post(`/api/cases/${unknown}/sites`, siteBody())],
      ['POST visit', () => governance.post(`/api/cases/${unknown}/visits`, visitBody([{ siteId: 1, refGm: 9.5 }]))],
      ['POST complication', () => governance.post(`/api/cases/${unknown}/complications`, { type: 'pain', grade: 'I', onsetDate: daysAgo(100) })],
      ['PATCH site', () => governance.patch(`/api/sites/${unknown}`, { ktWidth: 4, version: 1, reason: 'Probing' })],
      ['PATCH visit', () => governance.patch(`/api/visits/${unknown}`, { pain: 1, version: 1, reason: 'Probing' })],
      ['PATCH complication', () => governance.patch(`/api/complications/${unknown}`, { grade: 'II', version: 1, reason: 'Probing' })],
      ['GET photo', () => governance.get(`/api/photos/${unknown}`)],
      ['GET thumbnail', () => governance.get(`/api/photos/${unknown}/thumbnail`)],
      ['GET patient', () => governance.get(`/api/patients/${unknown}`)],
      ['PATCH patient', () => governance.patch(`/api/patients/${unknown}`, { birthYear: 1970, version: 1, reason: 'Probing' })],
    ];
    for (const [name, call] of calls) expect((await call()).status, name).toBe(403);
  });

  it('answers 404 for an unknown case and 400 for a malformed id', async () => {
    expect((await world.as('audit_lead').get('/api/cases/999999')).status).toBe(404);
    const malformed = await world.as('audit_lead').get('/api/cases/abc');
    expect(malformed.status).toBe(400);
    expect(malformed.body.error.fields).toHaveProperty('id');
  });
});

describe('cases: validation stores nothing', () => {
  let w: ClinicalWorld;
  beforeAll(async () => {
    w = await createClinicalWorld();
  });
  afterAll(async () => {
    await w.close();
  });

  /** Posts a case with one overridden site and expects a 400 naming exactly `field`, with nothing stored. */
  async function expectRefused(body: object, fields: string[]): Promise<void> {
    const before = await clinicalFingerprint(w.t);
    const response = await w.as('audit_lead').post('/api/cases', body);
    expect(response.status, JSON.stringify(response.body)).toBe(400);
    expect(response.body.error.code).toBe('validation');
    expect(Object.keys(response.body.error.fields).sort()).toEqual(fields);
    expect(await clinicalFingerprint(w.t)).toEqual(before);
  }

  // ISO 3950 (FDI): quadrants 1–4 teeth 1–8, quadrants 5–8 teeth 1–5. 19, 10, 49, 00 and 91 name no tooth.
  for (const tooth of [19, 10, 49, '00', 91, 0, 56, 11.5]) {
    it(`refuses tooth ${JSON.stringify(tooth)} (ISO 3950)`, async () => {
      await expectRefused(caseBody(w.ids.audit_lead, { sites: [siteBody({ tooth: tooth as number })] }), ['sites.0.tooth']);
    });
  }

  it('accepts the ISO 3950 edge teeth 11, 18, 48, 55 and 85', async () => {
    const teeth = [11, 18, 48, 55, 85];
    const response = await w.as('audit_lead').post('/api/cases', caseBody(w.ids.audit_lead, { sites: teeth.map((tooth) => siteBody({ tooth })) }));
    expect(response.status).toBe(201);
    expect((response.body as CaseDetail).sites.map((site) => site.tooth)).toEqual(teeth);
  });

  // DESIGN.md §3: millimetres 0–20 in 0.5 mm steps.
  for (const value of [-0.5, 20.5, 1.25]) {
    it(`refuses ${value} mm as a baseline or post-op reading`, async () => {
      await expectRefused(caseBody(w.ids.audit_lead, { sites: [siteBody({ baselineRefGm: value })] }), ['sites.0.baselineRefGm']);
      await expectRefused(caseBody(w.ids.audit_lead, { sites: [siteBody({ postOpRefGm: value, ktWidth: value })] }), ['sites.0.ktWidth', 'sites.0.postOpRefGm']);
    });
  }

  it('accepts the range edges 0 mm and 20 mm (DESIGN.md §3)', async () => {
    const response = await w.as('audit_lead').post('/api/cases', caseBody(w.ids.audit_lead, { sites: [siteBody({ baselineRefGm: 0, postOpRefGm: 20, plannedExcision: null })] }));
    expect(response.status).toBe(201);
    // Crown gain = post-op − baseline = 20 − 0 = 20 mm (DESIGN.md §3).
    expect(response.body.sites[0]).toEqual(expect.objectContaining({ baselineRefGm: 0, postOpRefGm: 20, crownGain: 20 }));
  });

  it('refuses the same tooth and location twice in one case', async () => {
    await expectRefused(caseBody(w.ids.audit_lead, { sites: [siteBody({ tooth: 21 }), siteBody({ tooth: 21, baselineRefGm: 7 })] }), ['sites']);
  });

  it('refuses unknown enum values, naming each field', async () => {
    await expectRefused(caseBody(w.ids.audit_lead, { procedure: 'laser-sculpting', indication: 'vanity', instrument: 'chisel' } as unknown as Parameters<typeof caseBody>[1]), [
      'indication',
      'instrument',
      'procedure',
    ]);
    await expectRefused(caseBody(w.ids.audit_lead, { sites: [siteBody({ location: 'lingual', referencePoint: 'nose-tip' } as unknown as Parameters<typeof siteBody>[0])] }), [
      'sites.0.location',
      'sites.0.referencePoint',
    ]);
    await expectRefused(caseBody(w.ids.audit_lead, { status: 'concluded' } as unknown as Parameters<typeof caseBody>[1]), ['status']);
  });

  it('refuses a bad inline patient: a name-like code, cigarettes without current smoking', async () => {
    await expectRefused(caseBody(w.ids.audit_lead, { patient: patientBody({ code: 'Jane Doe' }) }), ['patient.code']);
    await expectRefused(caseBody(w.ids.audit_lead, { patient: patientBody({ smoking: 'never', cigarettesPerDay: 5 }) }), ['patient.cigarettesPerDay']);
  });

  it('needs exactly one of patientId and patient', async () => {
    const existing = expectStatus(await w.as('audit_lead').post('/api/patients', patientBody()), 201).body.id as number;
    await expectRefused(caseBody(w.ids.audit_lead, { patientId: existing }), ['patientId']);
    await expectRefused(caseBody(w.ids.audit_lead, { patient: undefined }), ['patientId']);
    const forExisting = await w.as('audit_lead').post('/api/cases', caseBody(w.ids.audit_lead, { patient: undefined, patientId: existing }));
    expect(forExisting.status).toBe(201);
    expect(forExisting.body.patient.id).toBe(existing);
  });

  it('refuses an operated case dated in the future, but takes a planned one', async () => {
    const tomorrow = daysAgo(-1);
    await expectRefused(caseBody(w.ids.audit_lead, { surgeryDate: tomorrow, status: 'operated' }), ['surgeryDate']);
    const planned = await w.as('audit_lead').post('/api/cases', caseBody(w.ids.audit_lead, { surgeryDate: tomorrow, status: 'planned' }));
    expect(planned.status).toBe(201);
    expect(planned.body.status).toBe('planned');
  });

  it('refuses impossible dates and a final restoration before the surgery', async () => {
    await expectRefused(caseBody(w.ids.audit_lead, { surgeryDate: '2025-02-30' }), ['surgeryDate']);
    await expectRefused(caseBody(w.ids.audit_lead, { surgeryDate: '2025-03-10', finalRestorationDate: '2025-03-01' }), ['finalRestorationDate']);
  });

  it('refuses a case without sites', async () => {
    await expectRefused(caseBody(w.ids.audit_lead, { sites: [] }), ['sites']);
  });
});

describe('sites: adding and editing', () => {
  let w: ClinicalWorld;
  beforeAll(async () => {
    w = await createClinicalWorld();
  });
  afterAll(async () => {
    await w.close();
  });

  it('adds a site and shows it in the case', async () => {
    const found = await createCase(w.as('clinician'), w.ids.clinician);
    const response = await w.as('clinician').post(`/api/cases/${found.id}/sites`, siteBody({ tooth: 12, location: 'distal-papilla', papillaScore: 3 }));
    expect(response.status).toBe(201);
    expect(response.body).toEqual(expect.objectContaining({ tooth: 12, location: 'distal-papilla', papillaScore: 3, version: 1 }));
    const detail = (await w.as('clinician').get(`/api/cases/${found.id}`)).body as CaseDetail;
    expect(detail.sites.map((site) => `${site.tooth}/${site.location}`)).toEqual(['11/mid-facial', '12/distal-papilla']);
  });

  it('refuses a duplicate tooth and location with a 400 naming the fields, and stores nothing', async () => {
    const found = await createCase(w.as('clinician'), w.ids.clinician);
    const before = await countRows(w.t, 'site');
    const response = await w.as('clinician').post(`/api/cases/${found.id}/sites`, siteBody({ tooth: 11, location: 'mid-facial' }));
    expect(response.status).toBe(400);
    expect(response.body.error.code).toBe('validation');
    expect(Object.keys(response.body.error.fields).sort()).toEqual(['location', 'tooth']);
    expect(await countRows(w.t, 'site')).toBe(before);
    // The same tooth at another location is a different site.
    expect((await w.as('clinician').post(`/api/cases/${found.id}/sites`, siteBody({ tooth: 11, location: 'mesial-papilla' }))).status).toBe(201);
  });

  it('refuses invalid teeth, millimetres and papilla scores on a new site', async () => {
    const found = await createCase(w.as('clinician'), w.ids.clinician);
    const before = await clinicalFingerprint(w.t);
    const cases: [object, string[]][] = [
      [siteBody({ tooth: 19 }), ['tooth']],
      [siteBody({ tooth: '00' as unknown as number }), ['tooth']],
      [siteBody({ tooth: 91 }), ['tooth']],
      [siteBody({ tooth: 22, marginToCrest: 1.25 }), ['marginToCrest']],
      [siteBody({ tooth: 22, plannedExcision: -0.5 }), ['plannedExcision']],
      [siteBody({ tooth: 22, probingDepth: 20.5 }), ['probingDepth']],
      // Jemt 1997 papilla index: whole scores 0–4.
      [siteBody({ tooth: 22, papillaScore: 5 }), ['papillaScore']],
    ];
    for (const [body, fields] of cases) {
      const response = await w.as('clinician').post(`/api/cases/${found.id}/sites`, body);
      expect(response.status, JSON.stringify(body)).toBe(400);
      expect(Object.keys(response.body.error.fields)).toEqual(fields);
    }
    expect(await clinicalFingerprint(w.t)).toEqual(before);
  });

  it('answers 409 with the current version for a stale site version, and the row stays as it was', async () => {
    const site = (await createCase(w.as('audit_lead'), w.ids.clinician)).sites[0];
    expectStatus(await w.as('audit_lead').patch(`/api/sites/${site.id}`, { ktWidth: 4.5, version: 1, reason: 'Re-measured' }), 200);
    const before = await rowOf(w.t, 'site', site.id);
    const history = await countRows(w.t, 'change_record');
    const stale = await w.as('clinician').patch(`/api/sites/${site.id}`, { ktWidth: 3, version: 1, reason: 'Edited from an old screen' });
    expect(stale.status).toBe(409);
    expect(stale.body.error.details).toEqual({ currentVersion: 2 });
    expect(await rowOf(w.t, 'site', site.id)).toEqual(before);
    expect(before.kt_width).toBe(4.5);
    expect(await countRows(w.t, 'change_record')).toBe(history);
  });

  it('refuses out-of-range edits of a site', async () => {
    const site = (await createCase(w.as('audit_lead'), w.ids.clinician)).sites[0];
    const before = await rowOf(w.t, 'site', site.id);
    for (const value of [-0.5, 20.5, 1.25]) {
      const response = await w.as('audit_lead').patch(`/api/sites/${site.id}`, { postOpRefGm: value, version: 1, reason: 'Typo' });
      expect(response.status).toBe(400);
      expect(Object.keys(response.body.error.fields)).toEqual(['postOpRefGm']);
    }
    expect(await rowOf(w.t, 'site', site.id)).toEqual(before);
  });
});

describe('cases: computed outcomes and planning checks in GET /api/cases/:id', () => {
  let w: ClinicalWorld;
  beforeAll(async () => {
    w = await createClinicalWorld();
  });
  afterAll(async () => {
    await w.close();
  });

  it('computes crown gain per site and rebound, retained gain, % retained and stability per measurement (DESIGN.md §3)', async () => {
    const lead = w.as('audit_lead');
    const found = await createCase(lead, w.ids.clinician, {
      sites: [
        siteBody({ tooth: 11, baselineRefGm: 8, postOpRefGm: 10 }),
        siteBody({ tooth: 12, baselineRefGm: 7.5, postOpRefGm: 9 }),
        siteBody({ tooth: 13, baselineRefGm: 6, postOpRefGm: null }),
        siteBody({ tooth: 21, baselineRefGm: 8, postOpRefGm: 8 }),
      ],
    });
    const byTooth = new Map(found.sites.map((site) => [site.tooth, site]));
    const id = (tooth: number) => (byTooth.get(tooth) as SiteView).id;
    // Crown gain = REF→GM(post-op) − REF→GM(baseline): 10 − 8 = 2; 9 − 7.5 = 1.5; none without post-op; 8 − 8 = 0.
    expect(found.sites.map((site) => [site.tooth, site.crownGain])).toEqual([
      [11, 2],
      [12, 1.5],
      [13, null],
      [21, 0],
    ]);

    expectStatus(
      await lead.post(
        `/api/cases/${found.id}/visits`,
        visitBody([
          { siteId: id(11), refGm: 9.5 },
          { siteId: id(12), refGm: 8 },
          { siteId: id(13), refGm: 7 },
          { siteId: id(21), refGm: 8.5 },
        ]),
      ),
      201,
    );
    expectStatus(
      await lead.post(
        `/api/cases/${found.id}/visits`,
        visitBody(
          [
            { siteId: id(11), refGm: 8.5 },
            { siteId: id(12), refGm: 10 },
          ],
          { intervalKey: '3m', visitDate: daysAgo(29) },
        ),
      ),
      201,
    );

    const detail = (await lead.get(`/api/cases/${found.id}`)).body as CaseDetail;
    const outcome = (intervalKey: string, tooth: number) => {
      const visit = detail.visits.find((candidate) => candidate.intervalKey === intervalKey);
      return visit?.measurements.find((measurement) => measurement.siteId === id(tooth))?.outcome;
    };
    // Rebound = post-op − recall; retained = recall − baseline; % = retained / gain × 100 (DESIGN.md §3).
    // Stability defaults: stable ≤ 0.5 mm, minor ≤ 1.0 mm, relapse > 1.0 mm; negative rebound is stable and flagged.
    // 11 at 6 weeks: 10 − 9.5 = 0.5 (stable, at the bound); 9.5 − 8 = 1.5; 1.5 / 2 × 100 = 75 %.
    expect(outcome('6w', 11)).toEqual({ rebound: 0.5, retainedGain: 1.5, percentRetained: 75, stability: 'stable', isFlaggedForReview: false });
    // 12 at 6 weeks: 9 − 8 = 1 (minor, at the bound); 8 − 7.5 = 0.5; 0.5 / 1.5 × 100 = 33.33 %.
    const tooth12 = outcome('6w', 12);
    expect(tooth12).toEqual({ rebound: 1, retainedGain: 0.5, percentRetained: expect.any(Number), stability: 'minor', isFlaggedForReview: false });
    expect(tooth12?.percentRetained).toBeCloseTo(33.333, 3);
    // 13 has no post-op reading: only retained gain 7 − 6 = 1.
    expect(outcome('6w', 13)).toEqual({ rebound: null, retainedGain: 1, percentRetained: null, stability: null, isFlaggedForReview: false });
    // 21: 8 − 8.5 = −0.5, negative → stable and flagged; crown gain 0 → % retained undefined.
    expect(outcome('6w', 21)).toEqual({ rebound: -0.5, retainedGain: 0.5, percentRetained: null, stability: 'stable', isFlaggedForReview: true });
    // 11 at 3 months: 10 − 8.5 = 1.5 (relapse); 8.5 − 8 = 0.5; 0.5 / 2 × 100 = 25 %.
    expect(outcome('3m', 11)).toEqual({ rebound: 1.5, retainedGain: 0.5, percentRetained: 25, stability: 'relapse', isFlaggedForReview: false });
    // 12 at 3 months: 9 − 10 = −1 (stable, flagged); 10 − 7.5 = 2.5; 2.5 / 1.5 × 100 = 166.67 %.
    const tooth12Later = outcome('3m', 12);
    expect(tooth12Later).toEqual(expect.objectContaining({ rebound: -1, retainedGain: 2.5, stability: 'stable', isFlaggedForReview: true }));
    expect(tooth12Later?.percentRetained).toBeCloseTo(166.667, 3);
    expect(detail.visits.map((visit) => [visit.intervalKey, visit.intervalLabel])).toEqual([
      ['6w', '6 weeks'],
      ['3m', '3 months'],
    ]);
  });

  it('warns when KT − excision < 2 mm (Lang & Löe 1972) and margin-to-crest − excision < 3 mm (common practice)', async () => {
    const found = await createCase(w.as('audit_lead'), w.ids.clinician, {
      sites: [
        // 3 − 1.5 = 1.5 mm KT left (< 2: warn); 5 − 1.5 = 3.5 mm to the crest (fine).
        siteBody({ tooth: 11, ktWidth: 3, marginToCrest: 5, plannedExcision: 1.5 }),
        // 3.5 − 1.5 = 2.0 (not under 2) and 4.5 − 1.5 = 3.0 (not under 3): no warning at the bounds.
        siteBody({ tooth: 12, ktWidth: 3.5, marginToCrest: 4.5, plannedExcision: 1.5 }),
        // 6 − 2 = 4 KT (fine); 4.5 − 2 = 2.5 mm to the crest (< 3: warn).
        siteBody({ tooth: 13, ktWidth: 6, marginToCrest: 4.5, plannedExcision: 2 }),
        // 2 − 1 = 1 and 2 − 1 = 1: both warnings.
        siteBody({ tooth: 21, ktWidth: 2, marginToCrest: 2, plannedExcision: 1 }),
        // No planned excision: nothing to check.
        siteBody({ tooth: 22, ktWidth: 1, marginToCrest: 1, plannedExcision: null }),
      ],
    });
    const siteId = (tooth: number) => found.sites.find((site) => site.tooth === tooth)?.id;
    expect(found.planningChecks.map(({ siteId: id, tooth, kind }) => ({ siteId: id, tooth, kind }))).toEqual([
      { siteId: siteId(11), tooth: 11, kind: 'keratinized-tissue' },
      { siteId: siteId(13), tooth: 13, kind: 'crest-distance' },
      { siteId: siteId(21), tooth: 21, kind: 'keratinized-tissue' },
      { siteId: siteId(21), tooth: 21, kind: 'crest-distance' },
    ]);
    expect(found.planningChecks[0].message).toContain('1.5 mm');
    expect(found.planningChecks[1].message).toContain('2.5 mm');
    const detail = (await w.as('clinician').get(`/api/cases/${found.id}`)).body as CaseDetail;
    expect(detail.planningChecks).toEqual(found.planningChecks);
  });
});

describe('cases: status moves (planned → operated → in-recall → concluded; withdrawn)', () => {
  let w: ClinicalWorld;
  beforeAll(async () => {
    w = await createClinicalWorld();
  });
  afterAll(async () => {
    await w.close();
  });

  async function move(caseId: number, body: object) {
    return w.as('clinician').patch(`/api/cases/${caseId}`, { version: await versionOf(w.t, 'surgical_case', caseId), reason: 'Status update', ...body });
  }

  it('moves a case along its life cycle; the first recall makes an operated case in-recall', async () => {
    const found = await createCase(w.as('clinician'), w.ids.clinician, { status: 'planned' });
    expect(found.status).toBe('planned');
    const operated = await move(found.id, { status: 'operated' });
    expect(operated.status).toBe(200);
    expect(operated.body.status).toBe('operated');
    const versionBefore = await versionOf(w.t, 'surgical_case', found.id);
    const visit = await w.as('clinician').post(`/api/cases/${found.id}/visits`, visitBody([{ siteId: found.sites[0].id, refGm: 9.5 }]));
    expect(visit.status).toBe(201);
    expect(visit.body.status).toBe('in-recall');
    expect(await versionOf(w.t, 'surgical_case', found.id)).toBe(versionBefore + 1);
    const concluded = await move(found.id, { status: 'concluded' });
    expect(concluded.status).toBe(200);
    expect(concluded.body.status).toBe('concluded');
    expect((concluded.body as CaseDetail).history.filter((record) => record.field === 'status').map((record) => [record.oldValue, record.newValue])).toEqual([
      ['in-recall', 'concluded'],
      // The automatic move at the first recall is in the history too.
      ['operated', 'in-recall'],
      ['planned', 'operated'],
    ]);
  });

  it('refuses illegal moves with 400 on status and changes nothing', async () => {
    const concluded = await createCase(w.as('clinician'), w.ids.clinician);
    expectStatus(await move(concluded.id, { status: 'concluded' }), 200);
    const planned = await createCase(w.as('clinician'), w.ids.clinician, { status: 'planned' });
    for (const [caseId, status] of [
      [concluded.id, 'planned'],
      [concluded.id, 'operated'],
      [concluded.id, 'withdrawn'],
      [planned.id, 'in-recall'],
      [planned.id, 'concluded'],
    ] as const) {
      const before = await clinicalFingerprint(w.t);
      const response = await move(caseId, { status, withdrawnReason: 'Patient moved away' });
      expect(response.status, `${caseId} → ${status}`).toBe(400);
      expect(Object.keys(response.body.error.fields)).toEqual(['status']);
      expect(await clinicalFingerprint(w.t)).toEqual(before);
    }
  });

  it('needs a reason to withdraw, and keeps it', async () => {
    const found = await createCase(w.as('clinician'), w.ids.clinician);
    const before = await clinicalFingerprint(w.t);
    for (const withdrawnReason of [undefined, '', 'no']) {
      const response = await move(found.id, { status: 'withdrawn', withdrawnReason });
      expect(response.status).toBe(400);
      expect(Object.keys(response.body.error.fields)).toEqual(['withdrawnReason']);
    }
    expect(await clinicalFingerprint(w.t)).toEqual(before);
    const withdrawn = await move(found.id, { status: 'withdrawn', withdrawnReason: 'Patient moved abroad' });
    expect(withdrawn.status).toBe(200);
    expect(withdrawn.body).toEqual(expect.objectContaining({ status: 'withdrawn', withdrawnReason: 'Patient moved abroad' }));
    // A withdrawn case takes no more moves.
    expect((await move(found.id, { status: 'in-recall' })).status).toBe(400);
  });

  it('will not mark a case operated while its surgery date is in the future', async () => {
    const found = await createCase(w.as('clinician'), w.ids.clinician, { status: 'planned', surgeryDate: daysAgo(-3) });
    const before = await clinicalFingerprint(w.t);
    const response = await move(found.id, { status: 'operated' });
    expect(response.status).toBe(400);
    expect(Object.keys(response.body.error.fields)).toEqual(['surgeryDate']);
    expect(await clinicalFingerprint(w.t)).toEqual(before);
    const moved = await move(found.id, { status: 'operated', surgeryDate: daysAgo(0) });
    expect(moved.status).toBe(200);
    expect(moved.body).toEqual(expect.objectContaining({ status: 'operated', surgeryDate: daysAgo(0) }));
  });

  it('answers 409 with the current version for a stale case version, and the row stays as it was', async () => {
    const found = await createCase(w.as('clinician'), w.ids.clinician);
    expectStatus(await w.as('clinician').patch(`/api/cases/${found.id}`, { notes: 'First note', version: 1, reason: 'Adding a note' }), 200);
    expectStatus(await w.as('audit_lead').patch(`/api/cases/${found.id}`, { notes: 'Second note', version: 2, reason: 'Adding a note' }), 200);
    const before = await rowOf(w.t, 'surgical_case', found.id);
    const history = await countRows(w.t, 'change_record');
    const stale = await w.as('clinician').patch(`/api/cases/${found.id}`, { notes: 'Overwritten', status: 'concluded', version: 2, reason: 'Old screen' });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('conflict');
    expect(stale.body.error.details).toEqual({ currentVersion: 3 });
    expect(await rowOf(w.t, 'surgical_case', found.id)).toEqual(before);
    expect(before.notes).toBe('Second note');
    expect(await countRows(w.t, 'change_record')).toBe(history);
  });

  it('needs a reason for any case edit', async () => {
    const found = await createCase(w.as('clinician'), w.ids.clinician);
    const before = await rowOf(w.t, 'surgical_case', found.id);
    const response = await w.as('clinician').patch(`/api/cases/${found.id}`, { notes: 'No reason given', version: 1 });
    expect(response.status).toBe(400);
    expect(Object.keys(response.body.error.fields)).toEqual(['reason']);
    expect(await rowOf(w.t, 'surgical_case', found.id)).toEqual(before);
  });
});

describe('GET /api/cases: paging, sorting and filters', () => {
  let w: ClinicalWorld;
  /** Case ids by label; see the table in beforeAll. */
  const ids: Record<string, number> = {};

  beforeAll(async () => {
    w = await createClinicalWorld();
    const lead = w.as('audit_lead');
    // label   operator    surgery      procedure                   status    phenotype  code      teeth
    // A       clinician   2024-01-10   gingivectomy                operated  thin       LST-E05   11, 21
    // B       other       2024-02-20   gingivectomy                operated  thick      LST-A01   13
    // C       lead        2024-03-15   apf-osseous-recontouring    planned   thin       LST-D04   36
    // D       clinician   2024-04-05   apically-positioned-flap    planned   thick      LST-B02   11
    // E       other       2024-05-30   other                       operated  thin       LST-C03   45
    const rows = [
      ['A', w.ids.clinician, '2024-01-10', 'gingivectomy', 'operated', 'thin', 'LST-E05', [11, 21]],
      ['B', w.ids.other, '2024-02-20', 'gingivectomy', 'operated', 'thick', 'LST-A01', [13]],
      ['C', w.ids.audit_lead, '2024-03-15', 'apf-osseous-recontouring', 'planned', 'thin', 'LST-D04', [36]],
      ['D', w.ids.clinician, '2024-04-05', 'apically-positioned-flap', 'planned', 'thick', 'LST-B02', [11]],
      ['E', w.ids.other, '2024-05-30', 'other', 'operated', 'thin', 'LST-C03', [45]],
    ] as const;
    for (const [label, operatorId, surgeryDate, procedure, status, phenotype, code, teeth] of rows) {
      const found = await createCase(lead, operatorId, {
        surgeryDate,
        procedure,
        status,
        patient: patientBody({ code, phenotype }),
        sites: teeth.map((tooth) => siteBody({ tooth })),
      });
      ids[label] = found.id;
    }
  });
  afterAll(async () => {
    await w.close();
  });

  async function labels(query: string, client: ApiClient = w.as('audit_lead')): Promise<{ labels: string[]; total: number; items: CaseListItem[] }> {
    const response = await client.get(`/api/cases${query}`);
    expect(response.status, JSON.stringify(response.body)).toBe(200);
    const page = response.body as CaseListPage;
    const byId = new Map(Object.entries(ids).map(([label, id]) => [id, label]));
    return { labels: page.items.map((item) => byId.get(item.id) ?? `?${item.id}`), total: page.total, items: page.items };
  }

  it('lists every case for the audit lead, partner and admin, newest surgery first by default', async () => {
    for (const role of ['audit_lead', 'partner', 'admin'] as const) {
      const page = await labels('', w.as(role));
      expect(page.labels).toEqual(['E', 'D', 'C', 'B', 'A']);
      expect(page.total).toBe(5);
    }
  });

  it('shows a clinician only their own cases, whatever the filters say', async () => {
    const own = await labels('', w.as('clinician'));
    expect(own.labels).toEqual(['D', 'A']);
    expect(own.total).toBe(2);
    const asking = await labels(`?operatorId=${w.ids.other}`, w.as('clinician'));
    expect(asking.labels).toEqual([]);
    expect(asking.total).toBe(0);
  });

  it('describes each row', async () => {
    const page = await labels('?patientCode=LST-E05');
    expect(page.items).toEqual([
      {
        id: ids.A,
        patientCode: 'LST-E05',
        operator: { id: w.ids.clinician, displayName: 'Dr Cal Clinician (demo)' },
        surgeryDate: '2024-01-10',
        procedure: 'gingivectomy',
        indication: 'aesthetic',
        status: 'operated',
        phenotype: 'thin',
        teeth: [11, 21],
        visitCount: 0,
      },
    ]);
  });

  it('pages with page and pageSize and reports the total', async () => {
    expect(await labels('?sort=surgeryDate&direction=asc&pageSize=2&page=0')).toEqual(expect.objectContaining({ labels: ['A', 'B'], total: 5 }));
    expect(await labels('?sort=surgeryDate&direction=asc&pageSize=2&page=1')).toEqual(expect.objectContaining({ labels: ['C', 'D'], total: 5 }));
    expect(await labels('?sort=surgeryDate&direction=asc&pageSize=2&page=2')).toEqual(expect.objectContaining({ labels: ['E'], total: 5 }));
    expect(await labels('?sort=surgeryDate&direction=asc&pageSize=2&page=3')).toEqual(expect.objectContaining({ labels: [], total: 5 }));
  });

  it('sorts by surgery date both ways and by patient code', async () => {
    expect((await labels('?sort=surgeryDate&direction=asc')).labels).toEqual(['A', 'B', 'C', 'D', 'E']);
    expect((await labels('?sort=surgeryDate&direction=desc')).labels).toEqual(['E', 'D', 'C', 'B', 'A']);
    expect((await labels('?sort=patientCode&direction=asc')).labels).toEqual(['B', 'D', 'E', 'C', 'A']);
    expect((await labels('?sort=patientCode&direction=desc')).labels).toEqual(['A', 'C', 'E', 'D', 'B']);
  });

  it('narrows by each filter', async () => {
    const asc = '&sort=surgeryDate&direction=asc';
    expect((await labels(`?operatorId=${w.ids.clinician}${asc}`)).labels).toEqual(['A', 'D']);
    expect((await labels(`?operatorId=${w.ids.other}${asc}`)).labels).toEqual(['B', 'E']);
    expect((await labels(`?procedure=gingivectomy${asc}`)).labels).toEqual(['A', 'B']);
    expect((await labels(`?procedure=apf-osseous-recontouring${asc}`)).labels).toEqual(['C']);
    expect((await labels(`?status=planned${asc}`)).labels).toEqual(['C', 'D']);
    expect((await labels(`?status=operated${asc}`)).labels).toEqual(['A', 'B', 'E']);
    expect((await labels(`?phenotype=thick${asc}`)).labels).toEqual(['B', 'D']);
    // from/to are inclusive.
    expect((await labels(`?from=2024-02-20&to=2024-04-05${asc}`)).labels).toEqual(['B', 'C', 'D']);
    expect((await labels(`?from=2024-04-06${asc}`)).labels).toEqual(['E']);
    expect((await labels(`?to=2024-01-10${asc}`)).labels).toEqual(['A']);
    expect((await labels(`?tooth=11${asc}`)).labels).toEqual(['A', 'D']);
    expect((await labels(`?tooth=36${asc}`)).labels).toEqual(['C']);
    expect((await labels(`?patientCode=lst-b${asc}`)).labels).toEqual(['D']);
    expect((await labels(`?patientCode=LST${asc}`)).total).toBe(5);
    const combined = await labels(`?operatorId=${w.ids.other}&phenotype=thin&status=operated${asc}`);
    expect(combined).toEqual(expect.objectContaining({ labels: ['E'], total: 1 }));
  });

  for (const query of ['pageSize=0', 'pageSize=1000', 'sort=favourite', 'direction=sideways', 'page=-1', 'status=lost', 'tooth=19', 'from=2024-13-01', 'procedure=magic']) {
    it(`answers 400 for ?${query}`, async () => {
      const response = await w.as('audit_lead').get(`/api/cases?${query}`);
      expect(response.status).toBe(400);
      expect(response.body.error.code).toBe('validation');
      expect(Object.keys(response.body.error.fields)).toEqual([query.split('=')[0]]);
    });
  }
});

describe('GET /api/operators', () => {
  let w: ClinicalWorld;
  beforeAll(async () => {
    w = await createClinicalWorld();
  });
  afterAll(async () => {
    await w.close();
  });

  it('lists active clinicians and audit leads only, by name', async () => {
    const admin = w.as('admin');
    const retired = expectStatus(
      await admin.post('/api/users', { email: 'retired.operator@example.org', displayName: 'Dr Rae Retired (test)', role: 'clinician', password: 'retired-operator-passphrase' }),
      201,
    );
    expectStatus(await admin.patch(`/api/users/${retired.body.id}`, { active: false }), 200);
    const response = await w.as('audit_lead').get('/api/operators');
    expect(response.status).toBe(200);
    expect(response.body).toEqual([
      { id: w.ids.clinician, displayName: 'Dr Cal Clinician (demo)' },
      { id: w.ids.audit_lead, displayName: 'Dr Lena Lead (demo)' },
      { id: w.ids.other, displayName: 'Dr Sam Second (test)' },
    ]);
  });

  it('answers 401 anonymously and 403 to governance; the other roles may pick operators', async () => {
    expect((await new ApiClient(w.t.app).get('/api/operators')).status).toBe(401);
    expect((await w.as('governance').get('/api/operators')).status).toBe(403);
    for (const role of ['admin', 'audit_lead', 'clinician', 'partner'] as const) {
      expect((await (await signedInAs(w.t.app, role)).get('/api/operators')).status).toBe(200);
    }
  });
});

describe('cases: updates keep what they do not mention', () => {
  it('keeps the suture size when only the status moves', async () => {
    const w = await createClinicalWorld();
    try {
      const lead = w.as('audit_lead');
      const created = await lead.post('/api/cases', caseBody(w.ids.clinician, { sutureResorbable: true, sutureSize: '6-0', status: 'operated' }));
      expect(created.status).toBe(201);
      const moved = await lead.patch(`/api/cases/${created.body.id}`, { version: created.body.version, reason: 'Patient moved away', status: 'withdrawn', withdrawnReason: 'Moved away' });
      expect(moved.status).toBe(200);
      expect(moved.body.sutureSize).toBe('6-0');
      expect((moved.body as CaseDetail).history.some((record) => record.field === 'sutureSize')).toBe(false);
    } finally {
      await w.close();
    }
  });
});
