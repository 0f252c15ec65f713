import type { PatientView } from '@tidemark/shared';
import {
  clinicalFingerprint,
  countRows,
  createCase,
  createClinicalWorld,
  describeAccessMatrix,
  expectStatus,
  patientBody,
  rowOf,
  versionOf,
  type AccessRoute,
  type ClinicalWorld,
} from './support/clinical-fixtures';

/** A patient on a case operated by `ownerId`, registered by the audit lead. */
async function patientOnCaseOf(w: ClinicalWorld, ownerId: number): Promise<number> {
  return (await createCase(w.as('audit_lead'), ownerId)).patient.id;
}

const ROUTES: AccessRoute[] = [
  { name: 'GET /api/patients', kind: 'list', success: 200, prepare: async () => (client) => client.get('/api/patients') },
  { name: 'POST /api/patients', kind: 'create', success: 201, prepare: async () => (client) => client.post('/api/patients', patientBody()) },
  {
    name: 'GET /api/patients/:id',
    kind: 'read',
    success: 200,
    prepare: async (w, ownerId) => {
      const id = await patientOnCaseOf(w, ownerId);
      return (client) => client.get(`/api/patients/${id}`);
    },
  },
  {
    name: 'PATCH /api/patients/:id',
    kind: 'write',
    success: 200,
    prepare: async (w, ownerId) => {
      const id = await patientOnCaseOf(w, ownerId);
      return async (client) => client.patch(`/api/patients/${id}`, { birthYear: 1979, version: await versionOf(w.t, 'patient', id), reason: 'Birth year misread' });
    },
  },
];

describe('patients: access for every role (DESIGN.md §2)', () => {
  let world: ClinicalWorld;
  beforeAll(async () => {
    world = await createClinicalWorld();
  });
  afterAll(async () => {
    await world.close();
  });
  describeAccessMatrix(() => world, ROUTES);
});

describe('patients: registration, validation and edits', () => {
  let w: ClinicalWorld;
  beforeAll(async () => {
    w = await createClinicalWorld();
  });
  afterAll(async () => {
    await w.close();
  });

  it('registers a patient, trimming and upper-casing the pseudonymous code', async () => {
    const response = await w.as('clinician').post('/api/patients', patientBody({ code: '  hp-0042 ', smoking: 'current', cigarettesPerDay: 10 }));
    expect(response.status).toBe(201);
    expect(response.body).toEqual({
      id: expect.any(Number),
      code: 'HP-0042',
      birthYear: 1980,
      sex: 'female',
      smoking: 'current',
      cigarettesPerDay: 10,
      diabetes: 'none',
      phenotype: 'thin',
      phenotypeMethod: 'probe-visibility',
      version: 1,
    });
    expect((await rowOf(w.t, 'patient', response.body.id)).code).toBe('HP-0042');
  });

  // Codes are pseudonyms: 3–20 letters, digits and hyphens (DESIGN.md §7: no names are stored).
  for (const code of ['HP 0042', 'Jane Doe', "O'Brien", 'Smith, John', 'AB', 'HP-00420000000000000000', '-HP42', 'hp_0042']) {
    it(`refuses the code ${JSON.stringify(code)} with a field error and stores nothing`, async () => {
      const before = await countRows(w.t, 'patient');
      const response = await w.as('audit_lead').post('/api/patients', patientBody({ code }));
      expect(response.status).toBe(400);
      expect(response.body.error.code).toBe('validation');
      expect(Object.keys(response.body.error.fields)).toEqual(['code']);
      expect(await countRows(w.t, 'patient')).toBe(before);
    });
  }

  it('refuses cigarettes a day without current smoking, and current smoking without them', async () => {
    const before = await countRows(w.t, 'patient');
    for (const body of [patientBody({ smoking: 'never', cigarettesPerDay: 10 }), patientBody({ smoking: 'former', cigarettesPerDay: 5 }), patientBody({ smoking: 'current', cigarettesPerDay: null })]) {
      const response = await w.as('audit_lead').post('/api/patients', body);
      expect(response.status).toBe(400);
      expect(Object.keys(response.body.error.fields)).toEqual(['cigarettesPerDay']);
    }
    expect(await countRows(w.t, 'patient')).toBe(before);
  });

  it('refuses unknown enum values, naming each field', async () => {
    const before = await countRows(w.t, 'patient');
    const response = await w.as('audit_lead').post(
      '/api/patients',
      patientBody({ sex: 'robot', smoking: 'sometimes', diabetes: 'type-9', phenotype: 'medium', phenotypeMethod: 'guess' } as unknown as Parameters<typeof patientBody>[0]),
    );
    expect(response.status).toBe(400);
    expect(Object.keys(response.body.error.fields).sort()).toEqual(['diabetes', 'phenotype', 'phenotypeMethod', 'sex', 'smoking']);
    expect(await countRows(w.t, 'patient')).toBe(before);
  });

  it('refuses a birth year in the future or before 1900', async () => {
    const before = await countRows(w.t, 'patient');
    for (const birthYear of [new Date().getUTCFullYear() + 1, 1899, 1980.5]) {
      const response = await w.as('audit_lead').post('/api/patients', patientBody({ birthYear }));
      expect(response.status).toBe(400);
      expect(Object.keys(response.body.error.fields)).toEqual(['birthYear']);
    }
    expect(await countRows(w.t, 'patient')).toBe(before);
  });

  it('answers 409 for a code already registered, whatever its letter case', async () => {
    expectStatus(await w.as('audit_lead').post('/api/patients', patientBody({ code: 'DUP-0001' })), 201);
    const before = await countRows(w.t, 'patient');
    const response = await w.as('clinician').post('/api/patients', patientBody({ code: 'dup-0001' }));
    expect(response.status).toBe(409);
    expect(response.body.error.fields).toHaveProperty('code');
    expect(await countRows(w.t, 'patient')).toBe(before);
  });

  it('lists only the patients a clinician registered or operates on; the audit lead sees all; ?code narrows', async () => {
    const own = expectStatus(await w.as('clinician').post('/api/patients', patientBody({ code: 'VIS-OWN1' })), 201).body as PatientView;
    const others = expectStatus(await w.as('other').post('/api/patients', patientBody({ code: 'VIS-OTH1' })), 201).body as PatientView;
    const onOwnCase = (await createCase(w.as('audit_lead'), w.ids.clinician, { patient: patientBody({ code: 'VIS-CASE1' }) })).patient;

    const clinicianCodes = ((await w.as('clinician').get('/api/patients?code=vis-')).body as PatientView[]).map((p) => p.code);
    expect(clinicianCodes).toEqual(['VIS-CASE1', 'VIS-OWN1']);
    const leadCodes = ((await w.as('audit_lead').get('/api/patients?code=VIS-')).body as PatientView[]).map((p) => p.code);
    expect(leadCodes).toEqual(['VIS-CASE1', 'VIS-OTH1', 'VIS-OWN1']);
    const narrowed = ((await w.as('audit_lead').get('/api/patients?code=oth')).body as PatientView[]).map((p) => p.id);
    expect(narrowed).toEqual([others.id]);
    expect((await w.as('clinician').get(`/api/patients/${own.id}`)).status).toBe(200);
    expect((await w.as('clinician').get(`/api/patients/${onOwnCase.id}`)).status).toBe(200);
    expect((await w.as('clinician').get(`/api/patients/${others.id}`)).status).toBe(404);
  });

  it('edits a patient with a reason, bumps the version and keeps a change record', async () => {
    const patient = expectStatus(await w.as('audit_lead').post('/api/patients', patientBody()), 201).body as PatientView;
    const response = await w.as('audit_lead').patch(`/api/patients/${patient.id}`, { smoking: 'current', cigarettesPerDay: 15, version: 1, reason: 'Patient started smoking' });
    expect(response.status).toBe(200);
    expect(response.body).toEqual(expect.objectContaining({ smoking: 'current', cigarettesPerDay: 15, version: 2 }));
    const history = (await w.as('audit_lead').get('/api/history')).body.items as { entity: string; entityId: number; field: string; oldValue: string | null; newValue: string | null; reason: string; changedBy: { id: number } }[];
    const mine = history.filter((record) => record.entity === 'patient' && record.entityId === patient.id);
    expect(mine.map(({ field, oldValue, newValue, reason, changedBy }) => ({ field, oldValue, newValue, reason, by: changedBy.id })).sort((a, b) => a.field.localeCompare(b.field))).toEqual([
      { field: 'cigarettesPerDay', oldValue: null, newValue: '15', reason: 'Patient started smoking', by: w.ids.audit_lead },
      { field: 'smoking', oldValue: 'never', newValue: 'current', reason: 'Patient started smoking', by: w.ids.audit_lead },
    ]);
  });

  it('refuses an edit without a reason (400, field reason) and leaves the row as it was', async () => {
    const patient = expectStatus(await w.as('audit_lead').post('/api/patients', patientBody()), 201).body as PatientView;
    const before = await rowOf(w.t, 'patient', patient.id);
    const response = await w.as('audit_lead').patch(`/api/patients/${patient.id}`, { birthYear: 1975, version: 1 });
    expect(response.status).toBe(400);
    expect(Object.keys(response.body.error.fields)).toEqual(['reason']);
    expect(await rowOf(w.t, 'patient', patient.id)).toEqual(before);
  });

  it('refuses an edit that leaves cigarettes a day on a non-smoker', async () => {
    const patient = expectStatus(await w.as('audit_lead').post('/api/patients', patientBody({ smoking: 'current', cigarettesPerDay: 20 })), 201).body as PatientView;
    const before = await clinicalFingerprint(w.t);
    const response = await w.as('audit_lead').patch(`/api/patients/${patient.id}`, { smoking: 'former', version: 1, reason: 'Stopped smoking' });
    expect(response.status).toBe(400);
    expect(Object.keys(response.body.error.fields)).toEqual(['cigarettesPerDay']);
    expect(await clinicalFingerprint(w.t)).toEqual(before);
    const fixed = await w.as('audit_lead').patch(`/api/patients/${patient.id}`, { smoking: 'former', cigarettesPerDay: null, version: 1, reason: 'Stopped smoking' });
    expect(fixed.status).toBe(200);
    expect(fixed.body).toEqual(expect.objectContaining({ smoking: 'former', cigarettesPerDay: null }));
  });

  it('answers 409 with the current version for a stale version, and changes nothing', async () => {
    const patient = expectStatus(await w.as('audit_lead').post('/api/patients', patientBody()), 201).body as PatientView;
    expectStatus(await w.as('audit_lead').patch(`/api/patients/${patient.id}`, { birthYear: 1981, version: 1, reason: 'First correction' }), 200);
    expectStatus(await w.as('audit_lead').patch(`/api/patients/${patient.id}`, { birthYear: 1982, version: 2, reason: 'Second correction' }), 200);
    const before = await rowOf(w.t, 'patient', patient.id);
    const history = await countRows(w.t, 'change_record');
    const stale = await w.as('audit_lead').patch(`/api/patients/${patient.id}`, { birthYear: 1990, version: 1, reason: 'Edited from an old screen' });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('conflict');
    expect(stale.body.error.details).toEqual({ currentVersion: 3 });
    expect(await rowOf(w.t, 'patient', patient.id)).toEqual(before);
    expect(before.birth_year).toBe(1982);
    expect(await countRows(w.t, 'change_record')).toBe(history);
  });

  it('never changes the code through an edit (unknown and fixed fields are stripped)', async () => {
    const patient = expectStatus(await w.as('audit_lead').post('/api/patients', patientBody({ code: 'KEEP-0001' })), 201).body as PatientView;
    const response = await w.as('audit_lead').patch(`/api/patients/${patient.id}`, { code: 'CHANGED-01', diabetes: 'controlled', version: 1, reason: 'Diagnosed last month' });
    expect(response.status).toBe(200);
    expect(response.body.code).toBe('KEEP-0001');
    expect(response.body.diabetes).toBe('controlled');
  });

  it('registers a new patient inline with a case, created by the clinician', async () => {
    const detail = await createCase(w.as('clinician'), w.ids.clinician, { patient: patientBody({ code: 'INLINE-01' }) });
    expect(detail.patient.code).toBe('INLINE-01');
    expect((await rowOf(w.t, 'patient', detail.patient.id)).created_by_id).toBe(w.ids.clinician);
  });
});
