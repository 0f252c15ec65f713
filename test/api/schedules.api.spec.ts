import type { ScheduleView } from '@tidemark/shared';
import { describeAuditAccess, type AuditAccessRoute } from './support/audit-access-matrix';
import { auditBody, createAudit, defaultScheduleId, scheduleBody, storeFingerprint } from './support/audit-fixtures';
import { createClinicalWorld, expectStatus, type ClinicalWorld } from './support/clinical-fixtures';
import type { ApiClient } from './support/test-app';

async function createSchedule(lead: ApiClient, overrides: Parameters<typeof scheduleBody>[0] = {}): Promise<ScheduleView> {
  return expectStatus(await lead.post('/api/schedules', scheduleBody(overrides)), 201).body as ScheduleView;
}

const ROUTES: AuditAccessRoute[] = [
  { name: 'GET /api/schedules', kind: 'read', isWrite: false, success: 200, prepare: async () => (client) => client.get('/api/schedules') },
  { name: 'POST /api/schedules', kind: 'write', isWrite: true, success: 201, prepare: async () => (client) => client.post('/api/schedules', scheduleBody()) },
  {
    name: 'PATCH /api/schedules/:id',
    kind: 'write',
    isWrite: true,
    success: 200,
    prepare: async (w) => {
      const schedule = await createSchedule(w.as('audit_lead'));
      return (client) => client.patch(`/api/schedules/${schedule.id}`, { name: 'Renamed schedule', version: schedule.version });
    },
  },
  {
    name: 'DELETE /api/schedules/:id',
    kind: 'write',
    isWrite: true,
    success: 204,
    prepare: async (w) => {
      const schedule = await createSchedule(w.as('audit_lead'));
      return (client) => client.delete(`/api/schedules/${schedule.id}`);
    },
  },
];

describe('schedules: access for every role (DESIGN.md §2: the audit lead defines schedules)', () => {
  let world: ClinicalWorld;
  beforeAll(async () => {
    world = await createClinicalWorld();
  });
  afterAll(async () => {
    await world.close();
  });
  describeAuditAccess(() => world, ROUTES);
});

describe('schedules: create, edit, delete', () => {
  let w: ClinicalWorld;
  let lead: ApiClient;
  beforeAll(async () => {
    w = await createClinicalWorld();
    lead = w.as('audit_lead');
  });
  afterAll(async () => {
    await w.close();
  });

  it('lists the practice schedule seeded by the migration (DESIGN.md §1.3: 2 w, 6 w, 3, 6, 12 months)', async () => {
    const schedules = expectStatus(await w.as('governance').get('/api/schedules'), 200).body as ScheduleView[];
    const practice = schedules.filter((schedule) => schedule.isDefault);
    expect(practice).toHaveLength(1);
    // Target days: 14, 42, 91, 182, 365 (shared/types/recall-schedule.ts; 6 months ≈ 182 days, common practice).
    expect(practice[0].intervals.map((interval) => [interval.key, interval.targetDays])).toEqual([
      ['2w', 14],
      ['6w', 42],
      ['3m', 91],
      ['6m', 182],
      ['12m', 365],
    ]);
  });

  it('creates a schedule as sent, never as the default, at version 1', async () => {
    const created = await createSchedule(lead, { name: '  Aesthetic zone recalls  ' });
    expect(created).toEqual({ id: expect.any(Number), name: 'Aesthetic zone recalls', intervals: scheduleBody().intervals, isDefault: false, version: 1 });
    const listed = (await lead.get('/api/schedules')).body as ScheduleView[];
    expect(listed.find((schedule) => schedule.id === created.id)).toEqual(created);
  });

  it('edits name and intervals with the version, and refuses a stale version with 409 storing nothing', async () => {
    const created = await createSchedule(lead);
    const intervals = [{ key: '3m', label: '3 months', targetDays: 91, windowBeforeDays: 14, windowAfterDays: 21 }];
    const edited = await lead.patch(`/api/schedules/${created.id}`, { name: 'Three-month only', intervals, version: 1 });
    expect(edited.status, JSON.stringify(edited.body)).toBe(200);
    expect(edited.body).toEqual({ id: created.id, name: 'Three-month only', intervals, isDefault: false, version: 2 });
    const before = await storeFingerprint(w.t);
    const stale = await lead.patch(`/api/schedules/${created.id}`, { name: 'Lost update', version: 1 });
    expect(stale.status).toBe(409);
    expect(stale.body.error).toEqual(expect.objectContaining({ code: 'conflict', details: { currentVersion: 2 } }));
    expect(await storeFingerprint(w.t)).toEqual(before);
  });

  it('deletes an unused schedule (204), then answers 404 for it', async () => {
    const created = await createSchedule(lead);
    expect((await lead.delete(`/api/schedules/${created.id}`)).status).toBe(204);
    expect(((await lead.get('/api/schedules')).body as ScheduleView[]).some((schedule) => schedule.id === created.id)).toBe(false);
    expect((await lead.delete(`/api/schedules/${created.id}`)).status).toBe(404);
  });

  it('refuses to delete the practice schedule (409) and stores nothing', async () => {
    const id = await defaultScheduleId(lead);
    const before = await storeFingerprint(w.t);
    const response = await lead.delete(`/api/schedules/${id}`);
    expect(response.status).toBe(409);
    expect(response.body.error.code).toBe('conflict');
    expect(await storeFingerprint(w.t)).toEqual(before);
  });

  it('refuses to delete a schedule an audit uses (409) and stores nothing', async () => {
    const created = await createSchedule(lead);
    await createAudit(lead, auditBody(created.id));
    const before = await storeFingerprint(w.t);
    const response = await lead.delete(`/api/schedules/${created.id}`);
    expect(response.status).toBe(409);
    expect(response.body.error.code).toBe('conflict');
    expect(await storeFingerprint(w.t)).toEqual(before);
  });
});

describe('schedules: bad input → 400 with field errors, nothing stored', () => {
  let w: ClinicalWorld;
  beforeAll(async () => {
    w = await createClinicalWorld();
  });
  afterAll(async () => {
    await w.close();
  });

  const interval = (key: string, targetDays: number) => ({ key, label: key, targetDays, windowBeforeDays: 3, windowAfterDays: 7 });
  const CASES: [string, object, string[]][] = [
    ['no name', { ...scheduleBody(), name: '' }, ['name']],
    ['no intervals', scheduleBody({ intervals: [] }), ['intervals']],
    ['duplicate interval keys', scheduleBody({ intervals: [interval('6w', 42), interval('6w', 91)] }), ['intervals']],
    ['decreasing days', scheduleBody({ intervals: [interval('6m', 182), interval('6w', 42)] }), ['intervals']],
    ['equal days (not increasing)', scheduleBody({ intervals: [interval('6w', 42), interval('7w', 42)] }), ['intervals']],
    ['a key with spaces and capitals', scheduleBody({ intervals: [interval('Six Months', 182)] }), ['intervals.0.key']],
    ['a target of 0 days', scheduleBody({ intervals: [interval('0d', 0)] }), ['intervals.0.targetDays']],
    ['a negative window', scheduleBody({ intervals: [{ ...interval('6w', 42), windowBeforeDays: -1 }] }), ['intervals.0.windowBeforeDays']],
  ];
  for (const [name, body, fields] of CASES) {
    it(`POST refuses ${name}`, async () => {
      const before = await storeFingerprint(w.t);
      const response = await w.as('audit_lead').post('/api/schedules', body);
      expect(response.status, JSON.stringify(response.body)).toBe(400);
      expect(response.body.error.code).toBe('validation');
      expect(Object.keys(response.body.error.fields).sort()).toEqual(fields);
      expect(await storeFingerprint(w.t)).toEqual(before);
    });
  }

  it('PATCH refuses decreasing days and a missing version, and keeps the schedule', async () => {
    const created = await createSchedule(w.as('audit_lead'));
    const before = await storeFingerprint(w.t);
    const decreasing = await w.as('audit_lead').patch(`/api/schedules/${created.id}`, { intervals: [interval('6m', 182), interval('6w', 42)], version: 1 });
    expect(decreasing.status).toBe(400);
    expect(Object.keys(decreasing.body.error.fields)).toEqual(['intervals']);
    const versionless = await w.as('audit_lead').patch(`/api/schedules/${created.id}`, { name: 'No version' });
    expect(versionless.status).toBe(400);
    expect(Object.keys(versionless.body.error.fields)).toEqual(['version']);
    expect(await storeFingerprint(w.t)).toEqual(before);
  });
});
