import type { CaseDetail, ComplicationView } from '@tidemark/shared';
import {
  clinicalFingerprint,
  countRows,
  createCase,
  createClinicalWorld,
  daysAgo,
  describeAccessMatrix,
  expectStatus,
  rowOf,
  siteBody,
  todayUtc,
  versionOf,
  visitBody,
  type AccessRoute,
  type ClinicalWorld,
} from './support/clinical-fixtures';
import type { ApiClient } from './support/test-app';

/** A case operated 120 days ago (post-op REF→GM 10 mm) with its 6-week recall recorded at 9.5 mm. */
async function caseWithVisit(client: ApiClient, operatorId: number): Promise<CaseDetail> {
  const found = await createCase(client, operatorId);
  return expectStatus(await client.post(`/api/cases/${found.id}/visits`, visitBody([{ siteId: found.sites[0].id, refGm: 9.5 }])), 201).body as CaseDetail;
}

/** A complication of type pain, grade I, five days after a surgery 120 days ago. */
const complicationBody = (overrides: object = {}) => ({ type: 'pain', grade: 'I', onsetDate: daysAgo(115), resolutionDate: daysAgo(110), management: 'Analgesics', ...overrides });

const ROUTES: AccessRoute[] = [
  {
    name: 'POST /api/cases/:id/visits',
    kind: 'write',
    success: 201,
    prepare: async (w, ownerId) => {
      const found = await createCase(w.as('audit_lead'), ownerId);
      return (client) => client.post(`/api/cases/${found.id}/visits`, visitBody([{ siteId: found.sites[0].id, refGm: 9.5 }]));
    },
  },
  {
    name: 'PATCH /api/visits/:id',
    kind: 'write',
    success: 200,
    prepare: async (w, ownerId) => {
      const visit = (await caseWithVisit(w.as('audit_lead'), ownerId)).visits[0];
      return async (client) => client.patch(`/api/visits/${visit.id}`, { pain: 3, version: await versionOf(w.t, 'visit', visit.id), reason: 'Patient corrected the score' });
    },
  },
  {
    name: 'POST /api/cases/:id/complications',
    kind: 'write',
    success: 201,
    prepare: async (w, ownerId) => {
      const found = await createCase(w.as('audit_lead'), ownerId);
      return (client) => client.post(`/api/cases/${found.id}/complications`, complicationBody());
    },
  },
  {
    name: 'PATCH /api/complications/:id',
    kind: 'write',
    success: 200,
    prepare: async (w, ownerId) => {
      const found = await createCase(w.as('audit_lead'), ownerId);
      const complication = expectStatus(await w.as('audit_lead').post(`/api/cases/${found.id}/complications`, complicationBody()), 201).body as ComplicationView;
      return async (client) =>
        client.patch(`/api/complications/${complication.id}`, { grade: 'II', version: await versionOf(w.t, 'complication', complication.id), reason: 'Antibiotics were needed' });
    },
  },
];

describe('visits and complications: access for every role (DESIGN.md §2)', () => {
  let world: ClinicalWorld;
  beforeAll(async () => {
    world = await createClinicalWorld();
  });
  afterAll(async () => {
    await world.close();
  });
  describeAccessMatrix(() => world, ROUTES);
});

describe('visits: validation stores nothing', () => {
  let w: ClinicalWorld;
  let found: CaseDetail;
  let siteId: number;
  beforeAll(async () => {
    w = await createClinicalWorld();
    found = await createCase(w.as('clinician'), w.ids.clinician);
    siteId = found.sites[0].id;
  });
  afterAll(async () => {
    await w.close();
  });

  async function expectRefused(body: object, fields: string[], caseId = found.id): Promise<void> {
    const before = await clinicalFingerprint(w.t);
    const response = await w.as('clinician').post(`/api/cases/${caseId}/visits`, body);
    expect(response.status, JSON.stringify(response.body)).toBe(400);
    expect(response.body.error.code).toBe('validation');
    expect(Object.keys(response.body.error.fields).sort()).toEqual(fields);
    expect(await clinicalFingerprint(w.t)).toEqual(before);
  }

  it('refuses a visit dated in the future (tomorrow, UTC)', async () => {
    await expectRefused(visitBody([{ siteId, refGm: 9.5 }], { visitDate: daysAgo(-1) }), ['visitDate']);
  });

  it('refuses a visit before the surgery date (surgery 120 days ago, visit 121 days ago)', async () => {
    await expectRefused(visitBody([{ siteId, refGm: 9.5 }], { intervalKey: '2w', visitDate: daysAgo(121) }), ['visitDate']);
  });

  for (const pain of [11, -1, 2.5]) {
    it(`refuses pain ${pain} (0–10 scale)`, async () => {
      await expectRefused(visitBody([{ siteId, refGm: 9.5 }], { pain }), ['pain']);
    });
  }

  it('refuses satisfaction outside 0–10', async () => {
    await expectRefused(visitBody([{ siteId, refGm: 9.5 }], { satisfaction: 11 }), ['satisfaction']);
  });

  // DESIGN.md §3: millimetres 0–20 in 0.5 mm steps.
  for (const refGm of [-0.5, 20.5, 1.25]) {
    it(`refuses a REF→GM of ${refGm} mm`, async () => {
      await expectRefused(visitBody([{ siteId, refGm }]), ['measurements.0.refGm']);
    });
  }

  it('refuses a probing depth off the 0.5 mm step and a papilla score outside Jemt 0–4', async () => {
    await expectRefused(visitBody([{ siteId, refGm: 9.5, probingDepth: 2.25, papillaScore: 5 }]), ['measurements.0.papillaScore', 'measurements.0.probingDepth']);
  });

  it('refuses an interval that is not in the recall schedule', async () => {
    await expectRefused(visitBody([{ siteId, refGm: 9.5 }], { intervalKey: '5w' }), ['intervalKey']);
  });

  it("refuses a site of another case, naming the measurement's siteId", async () => {
    const otherCase = await createCase(w.as('clinician'), w.ids.clinician);
    await expectRefused(visitBody([{ siteId, refGm: 9.5 }, { siteId: otherCase.sites[0].id, refGm: 9.5 }]), ['measurements.1.siteId']);
  });

  it('refuses the same site twice in one visit', async () => {
    await expectRefused(visitBody([{ siteId, refGm: 9.5 }, { siteId, refGm: 9 }]), ['measurements']);
  });

  it('refuses an examiner who is not an operator', async () => {
    await expectRefused(visitBody([{ siteId, refGm: 9.5 }], { examinerId: w.ids.partner }), ['examinerId']);
  });

  it('accepts the edges: pain 0 and 10, a visit today and one on the surgery day', async () => {
    const edge = await createCase(w.as('clinician'), w.ids.clinician);
    const onSurgeryDay = await w.as('clinician').post(`/api/cases/${edge.id}/visits`, visitBody([{ siteId: edge.sites[0].id, refGm: 10 }], { intervalKey: '2w', visitDate: edge.surgeryDate, pain: 10 }));
    expect(onSurgeryDay.status).toBe(201);
    const today = await w.as('clinician').post(`/api/cases/${edge.id}/visits`, visitBody([{ siteId: edge.sites[0].id, refGm: 9.5 }], { intervalKey: '3m', visitDate: todayUtc(), pain: 0 }));
    expect(today.status).toBe(201);
    expect((today.body as CaseDetail).visits.map((visit) => [visit.intervalKey, visit.visitDate, visit.pain])).toEqual([
      ['2w', edge.surgeryDate, 10],
      ['3m', todayUtc(), 0],
    ]);
  });

  it('answers 409 for a recall already recorded, and for planned or withdrawn cases', async () => {
    const recorded = await caseWithVisit(w.as('clinician'), w.ids.clinician);
    const planned = await createCase(w.as('clinician'), w.ids.clinician, { status: 'planned' });
    const withdrawn = await createCase(w.as('clinician'), w.ids.clinician);
    expectStatus(await w.as('clinician').patch(`/api/cases/${withdrawn.id}`, { status: 'withdrawn', withdrawnReason: 'Lost to follow-up', version: 1, reason: 'Withdrawn' }), 200);
    const before = await clinicalFingerprint(w.t);
    for (const target of [recorded, planned, withdrawn]) {
      const response = await w.as('clinician').post(`/api/cases/${target.id}/visits`, visitBody([{ siteId: target.sites[0].id, refGm: 9.5 }]));
      expect(response.status).toBe(409);
    }
    expect(await clinicalFingerprint(w.t)).toEqual(before);
  });
});

describe('visits: > 3 mm REF→GM change needs a confirmation (DESIGN.md §3)', () => {
  let w: ClinicalWorld;
  beforeAll(async () => {
    w = await createClinicalWorld();
  });
  afterAll(async () => {
    await w.close();
  });

  it('compares the first recall with the post-op reading: 10 → 13.5 mm is 3.5 mm, refused until confirmed', async () => {
    const found = await createCase(w.as('clinician'), w.ids.clinician);
    const body = visitBody([{ siteId: found.sites[0].id, refGm: 13.5 }]);
    const before = await clinicalFingerprint(w.t);
    const refused = await w.as('clinician').post(`/api/cases/${found.id}/visits`, body);
    expect(refused.status).toBe(400);
    expect(refused.body.error.details).toEqual({ needsConfirmation: true });
    expect(Object.keys(refused.body.error.fields)).toEqual(['measurements.0.refGm']);
    expect(await clinicalFingerprint(w.t)).toEqual(before);
    const confirmed = await w.as('clinician').post(`/api/cases/${found.id}/visits`, { ...body, confirmLargeChange: true });
    expect(confirmed.status).toBe(201);
    expect((confirmed.body as CaseDetail).visits[0].measurements[0].refGm).toBe(13.5);
  });

  it('counts a decrease too: 10 → 6.5 mm is 3.5 mm', async () => {
    const found = await createCase(w.as('clinician'), w.ids.clinician);
    const refused = await w.as('clinician').post(`/api/cases/${found.id}/visits`, visitBody([{ siteId: found.sites[0].id, refGm: 6.5 }]));
    expect(refused.status).toBe(400);
    expect(refused.body.error.details.needsConfirmation).toBe(true);
  });

  it('takes exactly 3 mm without a confirmation (only more than 3 mm asks)', async () => {
    const found = await createCase(w.as('clinician'), w.ids.clinician);
    const response = await w.as('clinician').post(`/api/cases/${found.id}/visits`, visitBody([{ siteId: found.sites[0].id, refGm: 13 }]));
    expect(response.status).toBe(201);
  });

  it('compares consecutive visits, not the post-op reading: 9.5 → 13 mm is 3.5 mm (though 13 is only 3 mm from post-op 10)', async () => {
    const found = await caseWithVisit(w.as('clinician'), w.ids.clinician);
    const body = visitBody([{ siteId: found.sites[0].id, refGm: 13 }], { intervalKey: '3m', visitDate: daysAgo(29) });
    const before = await clinicalFingerprint(w.t);
    const refused = await w.as('clinician').post(`/api/cases/${found.id}/visits`, body);
    expect(refused.status).toBe(400);
    expect(refused.body.error.details).toEqual({ needsConfirmation: true });
    expect(await clinicalFingerprint(w.t)).toEqual(before);
    expect((await w.as('clinician').post(`/api/cases/${found.id}/visits`, { ...body, confirmLargeChange: true })).status).toBe(201);
  });

  it('asks for the confirmation on corrections too', async () => {
    const found = await caseWithVisit(w.as('clinician'), w.ids.clinician);
    const visit = found.visits[0];
    const before = await clinicalFingerprint(w.t);
    const body = { measurements: [{ siteId: found.sites[0].id, refGm: 14 }], version: visit.version, reason: 'Wrong reference point used' };
    const refused = await w.as('clinician').patch(`/api/visits/${visit.id}`, body);
    expect(refused.status).toBe(400);
    expect(refused.body.error.details).toEqual({ needsConfirmation: true });
    expect(await clinicalFingerprint(w.t)).toEqual(before);
    const confirmed = await w.as('clinician').patch(`/api/visits/${visit.id}`, { ...body, confirmLargeChange: true });
    expect(confirmed.status).toBe(200);
    expect((confirmed.body as CaseDetail).visits[0].measurements[0].refGm).toBe(14);
  });
});

describe('visits: edits after entry', () => {
  let w: ClinicalWorld;
  beforeAll(async () => {
    w = await createClinicalWorld();
  });
  afterAll(async () => {
    await w.close();
  });

  it('needs a reason for any visit edit', async () => {
    const visit = (await caseWithVisit(w.as('clinician'), w.ids.clinician)).visits[0];
    const before = await clinicalFingerprint(w.t);
    const response = await w.as('clinician').patch(`/api/visits/${visit.id}`, { pain: 4, version: visit.version });
    expect(response.status).toBe(400);
    expect(Object.keys(response.body.error.fields)).toEqual(['reason']);
    expect(await clinicalFingerprint(w.t)).toEqual(before);
  });

  it('corrects a measurement with a reason and records old and new value', async () => {
    const found = await caseWithVisit(w.as('clinician'), w.ids.clinician);
    const visit = found.visits[0];
    const response = await w.as('clinician').patch(`/api/visits/${visit.id}`, {
      measurements: [{ siteId: found.sites[0].id, refGm: 9 }],
      version: visit.version,
      reason: 'Probe slipped on the first reading',
    });
    expect(response.status).toBe(200);
    const detail = response.body as CaseDetail;
    // Rebound after the correction: 10 − 9 = 1.0 mm, minor (DESIGN.md §3 defaults).
    expect(detail.visits[0].measurements[0]).toEqual(expect.objectContaining({ refGm: 9, outcome: expect.objectContaining({ rebound: 1, stability: 'minor' }) }));
    expect(detail.visits[0].version).toBe(visit.version + 1);
    expect(detail.history.map(({ entity, field, oldValue, newValue, reason, changedBy }) => ({ entity, field, oldValue, newValue, reason, by: changedBy.id }))).toEqual([
      { entity: 'site_measurement', field: 'refGm', oldValue: '9.5', newValue: '9', reason: 'Probe slipped on the first reading', by: w.ids.clinician },
      // Written when the first recall moved the case from operated to in-recall.
      { entity: 'case', field: 'status', oldValue: 'operated', newValue: 'in-recall', reason: 'First recall recorded.', by: w.ids.clinician },
    ]);
  });

  it('refuses a visit date moved into the future or before the surgery', async () => {
    const found = await caseWithVisit(w.as('clinician'), w.ids.clinician);
    const visit = found.visits[0];
    const before = await clinicalFingerprint(w.t);
    for (const visitDate of [daysAgo(-1), daysAgo(121)]) {
      const response = await w.as('clinician').patch(`/api/visits/${visit.id}`, { visitDate, version: visit.version, reason: 'Date typo' });
      expect(response.status).toBe(400);
      expect(Object.keys(response.body.error.fields)).toEqual(['visitDate']);
    }
    expect(await clinicalFingerprint(w.t)).toEqual(before);
  });

  it('answers 409 with the current version for a stale visit version, and the row stays as it was', async () => {
    const visit = (await caseWithVisit(w.as('clinician'), w.ids.clinician)).visits[0];
    expectStatus(await w.as('audit_lead').patch(`/api/visits/${visit.id}`, { pain: 2, version: 1, reason: 'Checked with the patient' }), 200);
    const before = await rowOf(w.t, 'visit', visit.id);
    const history = await countRows(w.t, 'change_record');
    const stale = await w.as('clinician').patch(`/api/visits/${visit.id}`, { pain: 7, version: 1, reason: 'Old screen' });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('conflict');
    expect(stale.body.error.details).toEqual({ currentVersion: 2 });
    expect(await rowOf(w.t, 'visit', visit.id)).toEqual(before);
    expect(before.pain).toBe(2);
    expect(await countRows(w.t, 'change_record')).toBe(history);
  });
});

describe('complications (Clavien–Dindo 2004)', () => {
  let w: ClinicalWorld;
  let found: CaseDetail;
  beforeAll(async () => {
    w = await createClinicalWorld();
    found = await createCase(w.as('clinician'), w.ids.clinician);
  });
  afterAll(async () => {
    await w.close();
  });

  it('records a complication', async () => {
    const response = await w.as('clinician').post(`/api/cases/${found.id}/complications`, complicationBody({ type: 'infection', grade: 'IIIa' }));
    expect(response.status).toBe(201);
    expect(response.body).toEqual({
      id: expect.any(Number),
      visitId: null,
      type: 'infection',
      grade: 'IIIa',
      onsetDate: daysAgo(115),
      resolutionDate: daysAgo(110),
      management: 'Analgesics',
      version: 1,
    });
  });

  async function expectRefused(body: object, fields: string[]): Promise<void> {
    const before = await clinicalFingerprint(w.t);
    const response = await w.as('clinician').post(`/api/cases/${found.id}/complications`, body);
    expect(response.status, JSON.stringify(response.body)).toBe(400);
    expect(Object.keys(response.body.error.fields).sort()).toEqual(fields);
    expect(await clinicalFingerprint(w.t)).toEqual(before);
  }

  it('refuses grades outside Clavien–Dindo 2004 (III is split into IIIa/IIIb) and unknown types', async () => {
    await expectRefused(complicationBody({ grade: 'III' }), ['grade']);
    await expectRefused(complicationBody({ grade: 'VI' }), ['grade']);
    await expectRefused(complicationBody({ type: 'bad-luck' }), ['type']);
  });

  it('refuses an onset before the surgery or in the future, and a resolution before onset', async () => {
    await expectRefused(complicationBody({ onsetDate: daysAgo(121), resolutionDate: null }), ['onsetDate']);
    await expectRefused(complicationBody({ onsetDate: daysAgo(-1), resolutionDate: null }), ['onsetDate']);
    await expectRefused(complicationBody({ onsetDate: daysAgo(110), resolutionDate: daysAgo(115) }), ['resolutionDate']);
  });

  it("refuses a visit of another case", async () => {
    const otherVisit = (await caseWithVisit(w.as('clinician'), w.ids.clinician)).visits[0];
    await expectRefused(complicationBody({ visitId: otherVisit.id }), ['visitId']);
  });

  it('answers 409 with the current version for a stale complication version, and the row stays as it was', async () => {
    const complication = expectStatus(await w.as('clinician').post(`/api/cases/${found.id}/complications`, complicationBody()), 201).body as ComplicationView;
    const edited = await w.as('audit_lead').patch(`/api/complications/${complication.id}`, { grade: 'II', version: 1, reason: 'Antibiotics were prescribed' });
    expect(edited.status).toBe(200);
    expect(edited.body).toEqual(expect.objectContaining({ grade: 'II', version: 2 }));
    const before = await rowOf(w.t, 'complication', complication.id);
    const history = await countRows(w.t, 'change_record');
    const stale = await w.as('clinician').patch(`/api/complications/${complication.id}`, { grade: 'I', version: 1, reason: 'Old screen' });
    expect(stale.status).toBe(409);
    expect(stale.body.error.details).toEqual({ currentVersion: 2 });
    expect(await rowOf(w.t, 'complication', complication.id)).toEqual(before);
    expect(await countRows(w.t, 'change_record')).toBe(history);
  });

  it('needs a reason for an edit and refuses a resolution before the stored onset', async () => {
    const complication = expectStatus(await w.as('clinician').post(`/api/cases/${found.id}/complications`, complicationBody({ resolutionDate: null })), 201).body as ComplicationView;
    const before = await clinicalFingerprint(w.t);
    const noReason = await w.as('clinician').patch(`/api/complications/${complication.id}`, { grade: 'II', version: 1 });
    expect(noReason.status).toBe(400);
    expect(Object.keys(noReason.body.error.fields)).toEqual(['reason']);
    const early = await w.as('clinician').patch(`/api/complications/${complication.id}`, { resolutionDate: daysAgo(116), version: 1, reason: 'Resolved' });
    expect(early.status).toBe(400);
    expect(Object.keys(early.body.error.fields)).toEqual(['resolutionDate']);
    expect(await clinicalFingerprint(w.t)).toEqual(before);
  });
});

describe('visits: partial corrections and concurrency', () => {
  let w: ClinicalWorld;
  beforeAll(async () => {
    w = await createClinicalWorld();
  });
  afterAll(async () => {
    await w.close();
  });

  it('keeps the readings a correction does not mention', async () => {
    const found = await caseWithVisit(w.as('clinician'), w.ids.clinician);
    const visit = found.visits[0];
    const before = visit.measurements[0];
    const response = await w.as('clinician').patch(`/api/visits/${visit.id}`, {
      version: visit.version,
      reason: 'Re-read the probe',
      measurements: [{ siteId: before.siteId, refGm: 9 }],
    });
    expect(response.status).toBe(200);
    const after = (response.body as CaseDetail).visits[0].measurements[0];
    expect(after.refGm).toBe(9);
    expect(after.probingDepth).toBe(before.probingDepth);
    expect(after.bleedingOnProbing).toBe(before.bleedingOnProbing);
    expect(after.ktWidth).toBe(before.ktWidth);
  });

  it('lets only one of two people correcting the same visit win (409 for the other)', async () => {
    const found = await caseWithVisit(w.as('clinician'), w.ids.clinician);
    const visit = found.visits[0];
    const siteId = visit.measurements[0].siteId;
    const first = await w.as('clinician').patch(`/api/visits/${visit.id}`, { version: visit.version, reason: 'First correction', measurements: [{ siteId, refGm: 9 }] });
    const second = await w.as('audit_lead').patch(`/api/visits/${visit.id}`, { version: visit.version, reason: 'Second correction', measurements: [{ siteId, refGm: 8.5 }] });
    expect(first.status).toBe(200);
    expect(second.status).toBe(409);
    expect(second.body.error.details.currentVersion).toBe(visit.version + 1);
    const detail = (await w.as('clinician').get(`/api/cases/${found.id}`)).body as CaseDetail;
    expect(detail.visits[0].measurements[0].refGm).toBe(9);
  });
});
