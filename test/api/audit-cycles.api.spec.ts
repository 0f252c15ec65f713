import type { ActionItemView, AuditResults, AuditView, CycleState, CycleView, ReviewNoteView } from '@tidemark/shared';
import {
  FIXTURE_STANDARDS,
  addCycle,
  addDays,
  addStandard,
  auditBody,
  buildOutcomeFixture,
  createAudit,
  defaultScheduleId,
  moveCycle,
  reportCycle,
  storeFingerprint,
  type OutcomeFixture,
} from './support/audit-fixtures';
import { createCase, createClinicalWorld, expectStatus, patientBody, siteBody, todayUtc, versionOf, visitBody, type ClinicalWorld } from './support/clinical-fixtures';
import type { ApiClient } from './support/test-app';

/*
 * Audit cycle stages (shared/schemas/audit-cycle.ts, after NICE/CHI 2002 and REFERENCES.md §C):
 * scoping → gathering → weighing → reported → closed, with weighing → gathering allowed to gather more.
 */

describe('audit cycles: stages', () => {
  let w: ClinicalWorld;
  let lead: ApiClient;
  let audit: AuditView;
  beforeAll(async () => {
    w = await createClinicalWorld();
    lead = w.as('audit_lead');
    audit = await createAudit(lead, auditBody(await defaultScheduleId(lead)));
  });
  afterAll(async () => {
    await w.close();
  });

  it('numbers cycles 1, 2, … and starts each in scoping, unfrozen', async () => {
    const first = await addCycle(lead, audit.id, '2024-01-01', '2024-06-30');
    const second = await addCycle(lead, audit.id, '2024-07-01', '2024-12-31');
    expect(first).toEqual({
      id: expect.any(Number),
      auditId: audit.id,
      number: 1,
      periodStart: '2024-01-01',
      periodEnd: '2024-06-30',
      state: 'scoping',
      frozenAt: null,
      presentedDate: null,
      notes: '',
      version: 1,
      actions: [],
    });
    expect(second.number).toBe(2);
  });

  it('moves scoping → gathering → weighing → gathering → weighing → reported → closed; reporting freezes it', async () => {
    let cycle = await addCycle(lead, audit.id, '2024-01-01', '2024-06-30');
    const seen: [CycleState, string | null][] = [];
    for (const state of ['gathering', 'weighing', 'gathering', 'weighing'] as const) {
      cycle = await moveCycle(lead, cycle, [state]);
      seen.push([cycle.state, cycle.frozenAt]);
    }
    expect(seen).toEqual([
      ['gathering', null],
      ['weighing', null],
      ['gathering', null],
      ['weighing', null],
    ]);
    const startedAt = Date.now();
    cycle = await moveCycle(lead, cycle, ['reported']);
    expect(cycle.state).toBe('reported');
    expect(cycle.frozenAt).toEqual(expect.stringMatching(/^\d{4}-\d{2}-\d{2}T/));
    expect(Math.abs(Date.parse(cycle.frozenAt as string) - startedAt)).toBeLessThan(60_000);
    // Presented today unless a date was given (audit-cycle.service).
    expect(cycle.presentedDate).toBe(todayUtc());
    const frozenAt = cycle.frozenAt;
    cycle = await moveCycle(lead, cycle, ['closed']);
    expect([cycle.state, cycle.frozenAt]).toEqual(['closed', frozenAt]);
  });

  it('refuses illegal moves with 400 on state and stores nothing', async () => {
    const at = async (states: CycleState[]) => moveCycle(lead, await addCycle(lead, audit.id, '2024-01-01', '2024-06-30'), states);
    const cycles: Record<CycleState, CycleView> = {
      scoping: await at([]),
      gathering: await at(['gathering']),
      weighing: await at(['gathering', 'weighing']),
      reported: await at(['gathering', 'weighing', 'reported']),
      closed: await at(['gathering', 'weighing', 'reported', 'closed']),
    };
    const ILLEGAL: [CycleState, CycleState][] = [
      ['scoping', 'weighing'],
      ['scoping', 'reported'],
      ['scoping', 'closed'],
      ['gathering', 'scoping'],
      ['gathering', 'reported'],
      ['weighing', 'scoping'],
      ['weighing', 'closed'],
      ['reported', 'weighing'],
      ['reported', 'gathering'],
      ['closed', 'reported'],
      ['closed', 'scoping'],
    ];
    for (const [from, to] of ILLEGAL) {
      const before = await storeFingerprint(w.t);
      const response = await lead.patch(`/api/cycles/${cycles[from].id}`, { state: to, version: cycles[from].version });
      expect(response.status, `${from} → ${to}`).toBe(400);
      expect(Object.keys(response.body.error.fields)).toEqual(['state']);
      expect(await storeFingerprint(w.t)).toEqual(before);
    }
    const unknown = await lead.patch(`/api/cycles/${cycles.scoping.id}`, { state: 'archived', version: 1 });
    expect(unknown.status).toBe(400);
    expect(Object.keys(unknown.body.error.fields)).toEqual(['state']);
  });

  it('refuses a stale version with 409 and the current version, storing nothing', async () => {
    const cycle = await addCycle(lead, audit.id, '2024-01-01', '2024-06-30');
    expectStatus(await lead.patch(`/api/cycles/${cycle.id}`, { notes: 'Data clerk assigned', version: 1 }), 200);
    const before = await storeFingerprint(w.t);
    const stale = await lead.patch(`/api/cycles/${cycle.id}`, { state: 'gathering', version: 1 });
    expect(stale.status).toBe(409);
    expect(stale.body.error.details).toEqual({ currentVersion: 2 });
    expect(await storeFingerprint(w.t)).toEqual(before);
  });

  it('refuses a period ending before it starts (create and edit), storing nothing', async () => {
    const before = await storeFingerprint(w.t);
    const created = await lead.post(`/api/audits/${audit.id}/cycles`, { periodStart: '2024-06-01', periodEnd: '2024-05-31' });
    expect(created.status).toBe(400);
    expect(Object.keys(created.body.error.fields)).toEqual(['periodEnd']);
    expect(await storeFingerprint(w.t)).toEqual(before);
    const cycle = await addCycle(lead, audit.id, '2024-01-01', '2024-06-30');
    const middle = await storeFingerprint(w.t);
    const edited = await lead.patch(`/api/cycles/${cycle.id}`, { periodEnd: '2023-12-31', version: 1 });
    expect(edited.status).toBe(400);
    expect(Object.keys(edited.body.error.fields)).toEqual(['periodEnd']);
    expect(await storeFingerprint(w.t)).toEqual(middle);
  });

  it('deletes a cycle that is not reported (204)', async () => {
    const cycle = await addCycle(lead, audit.id, '2024-01-01', '2024-06-30');
    expect((await lead.delete(`/api/cycles/${cycle.id}`)).status).toBe(204);
    expect(((await lead.get(`/api/audits/${audit.id}`)).body as AuditView).cycles.some((item) => item.id === cycle.id)).toBe(false);
  });
});

describe('audit cycles: a reported cycle keeps its results whatever happens to the data later', () => {
  let w: ClinicalWorld;
  let lead: ApiClient;
  let fixture: OutcomeFixture;
  let audit: AuditView;
  let frozen: CycleView;
  const views = ['results', 'results?groupBy=operator', 'funnel?measure=complication', 'funnel?measure=relapse', 'trend', 'survival', 'calibration'] as const;
  const frozenBefore: Record<string, unknown> = {};
  let liveBefore: AuditResults;

  beforeAll(async () => {
    w = await createClinicalWorld();
    lead = w.as('audit_lead');
    fixture = await buildOutcomeFixture(w);
    audit = await createAudit(lead, auditBody(await defaultScheduleId(lead)));
    for (const standard of FIXTURE_STANDARDS) await addStandard(lead, audit.id, standard);
    // Cycle 1 covers surgery in January–February 2024: C1 and C2.
    frozen = await reportCycle(lead, await addCycle(lead, audit.id, '2024-01-01', '2024-02-29'));
    for (const view of views) frozenBefore[view] = expectStatus(await lead.get(`/api/audits/${audit.id}/${view}${view.includes('?') ? '&' : '?'}cycleId=${frozen.id}`), 200).body;
    liveBefore = expectStatus(await lead.get(`/api/audits/${audit.id}/results`), 200).body as AuditResults;
  });
  afterAll(async () => {
    await w.close();
  });

  const sixMonths = (results: AuditResults) => results.summary.intervals.find((interval) => interval.intervalKey === '6m');

  it('the frozen results are those of the period when reported', () => {
    const results = frozenBefore['results'] as AuditResults;
    expect(results.cycleId).toBe(frozen.id);
    expect(results.frozenAt).toBe(frozen.frozenAt);
    // C1 (sites S1, S2; patient P1) and C2 (S3; P2).
    expect(results.cohort).toEqual({ cases: 2, patients: 2, sites: 3 });
    // Rebound at 6 m: S1 10 − 9.5 = 0.5, S2 11 − 10 = 1.0, S3 8 − 6.5 = 1.5 → mean 3.0 / 3 = 1.0 (hand computation).
    expect(sixMonths(results)?.rebound.site?.mean).toBeCloseTo(1, 10);
    expect(results.standards).toHaveLength(FIXTURE_STANDARDS.length);
  });

  it('after a corrected measurement, a new case, a new standard and new calibration readings the frozen views are unchanged; live ones moved', async () => {
    // Correct S1 at 6 m from 9.5 to 9 mm (rebound 1.0), with a reason (DESIGN.md §7).
    const visitId = fixture.visits['C1-6m'];
    const corrected = await lead.patch(`/api/visits/${visitId}`, {
      measurements: [{ siteId: fixture.sites.S1, refGm: 9 }],
      version: await versionOf(w.t, 'visit', visitId),
      reason: 'Re-read against the stent notch',
    });
    expect(corrected.status, JSON.stringify(corrected.body)).toBe(200);
    // A new case inside cycle 1's period: surgery 2024-02-01, tooth 22, post-op 9, 6 m at 8 (rebound 1.0).
    const added = await createCase(lead, fixture.operatorA, {
      patient: patientBody({ code: 'KX-7199' }),
      surgeryDate: '2024-02-01',
      status: 'operated',
      sites: [siteBody({ tooth: 22, baselineRefGm: 7, postOpRefGm: 9 })],
    });
    expectStatus(await lead.post(`/api/cases/${added.id}/visits`, visitBody([{ siteId: added.sites[0].id, refGm: 8 }], { intervalKey: '6m', visitDate: addDays('2024-02-01', 182) })), 201);
    // The criteria move on too: a stricter target and one more standard.
    const standards = ((await lead.get(`/api/audits/${audit.id}`)).body as AuditView).standards;
    expectStatus(await lead.patch(`/api/standards/${standards[1].id}`, { ...FIXTURE_STANDARDS[1], target: 95, version: standards[1].version }), 200);
    await addStandard(lead, audit.id, { criterion: 'Bleeding score under 15% before surgery', metric: 'share-cases-bleeding-under', thresholdPct: 15, comparator: '>=', target: 90 });
    for (const refGm of [9.5, 10]) expectStatus(await lead.post('/api/calibration-readings', { siteId: fixture.sites.S2, measuredOn: todayUtc(), refGm }), 201);
    // Notes and the presented date may still be written on a reported cycle.
    expectStatus(await lead.patch(`/api/cycles/${frozen.id}`, { notes: 'Presented to the committee', version: frozen.version }), 200);

    for (const view of views) {
      const after = expectStatus(await lead.get(`/api/audits/${audit.id}/${view}${view.includes('?') ? '&' : '?'}cycleId=${frozen.id}`), 200).body;
      expect(after, view).toEqual(frozenBefore[view]);
    }

    const liveAfter = expectStatus(await lead.get(`/api/audits/${audit.id}/results`), 200).body as AuditResults;
    // Live: C1–C5 plus the new case; patients P1–P4 plus one; sites S1–S7 plus one.
    expect(liveBefore.cohort).toEqual({ cases: 5, patients: 4, sites: 7 });
    expect(liveAfter.cohort).toEqual({ cases: 6, patients: 5, sites: 8 });
    // Live 6 m rebound: before (0.5 + 1.0 + 1.5 + 0 − 0.5) / 5 = 0.5; after (1.0 + 1.0 + 1.5 + 0 − 0.5 + 1.0) / 6 = 4.0 / 6.
    expect(sixMonths(liveBefore)?.rebound.site?.mean).toBeCloseTo(0.5, 10);
    expect(sixMonths(liveAfter)?.rebound.site?.mean).toBeCloseTo(4 / 6, 10);
    expect(liveAfter.standards.map((result) => result.standard.target)).toEqual([1, 95, 2, 80, 90, 90]);

    // The same period, not reported, reads today's data: C1 (S1 now 1.0, S2 1.0), C2 (S3 1.5), the new case (1.0) → 4.5 / 4.
    const open = await addCycle(lead, audit.id, '2024-01-01', '2024-02-29');
    const openResults = expectStatus(await lead.get(`/api/audits/${audit.id}/results?cycleId=${open.id}`), 200).body as AuditResults;
    expect(openResults.frozenAt).toBeNull();
    expect(openResults.cohort).toEqual({ cases: 3, patients: 3, sites: 4 });
    expect(sixMonths(openResults)?.rebound.site?.mean).toBeCloseTo(1.125, 10);
  });

  it('refuses to change the period of a reported cycle (409), storing nothing', async () => {
    const current = ((await lead.get(`/api/audits/${audit.id}`)).body as AuditView).cycles.find((cycle) => cycle.id === frozen.id) as CycleView;
    const before = await storeFingerprint(w.t);
    for (const change of [{ periodStart: '2023-12-01' }, { periodEnd: '2024-03-31' }]) {
      const response = await lead.patch(`/api/cycles/${frozen.id}`, { ...change, version: current.version });
      expect(response.status).toBe(409);
      expect(response.body.error.code).toBe('conflict');
    }
    expect(await storeFingerprint(w.t)).toEqual(before);
  });

  it('refuses to delete a reported cycle or its audit (409), storing nothing', async () => {
    const before = await storeFingerprint(w.t);
    expect((await lead.delete(`/api/cycles/${frozen.id}`)).status).toBe(409);
    expect((await lead.delete(`/api/audits/${audit.id}`)).status).toBe(409);
    expect(await storeFingerprint(w.t)).toEqual(before);
  });

  it("answers 404 for a cycle of another audit in a result's cycleId", async () => {
    const other = await createAudit(lead, auditBody(await defaultScheduleId(lead)));
    expect((await lead.get(`/api/audits/${other.id}/results?cycleId=${frozen.id}`)).status).toBe(404);
  });
});

describe('audit cycles: action plans (action, owner, due date; HQIP 2020)', () => {
  let w: ClinicalWorld;
  let lead: ApiClient;
  let audit: AuditView;
  let cycle: CycleView;
  beforeAll(async () => {
    w = await createClinicalWorld();
    lead = w.as('audit_lead');
    audit = await createAudit(lead, auditBody(await defaultScheduleId(lead)));
    // Actions follow the report, so they go on a reported cycle.
    cycle = await reportCycle(lead, await addCycle(lead, audit.id, '2024-01-01', '2024-12-31'));
  });
  afterAll(async () => {
    await w.close();
  });

  const actionsOf = async () => (((await lead.get(`/api/audits/${audit.id}`)).body as AuditView).cycles.find((item) => item.id === cycle.id) as CycleView).actions;

  it('adds, lists by due date, edits with the version (stale → 409) and deletes actions', async () => {
    const later = await lead.post(`/api/cycles/${cycle.id}/actions`, { action: 'Re-audit thick phenotype cases', ownerId: w.ids.partner, dueDate: '2025-06-30' });
    expect(later.status, JSON.stringify(later.body)).toBe(201);
    expect(later.body).toEqual({
      id: expect.any(Number),
      cycleId: cycle.id,
      action: 'Re-audit thick phenotype cases',
      owner: { id: w.ids.partner, displayName: 'Dr Pat Partner (demo)' },
      dueDate: '2025-06-30',
      state: 'open',
      version: 1,
    });
    const sooner = expectStatus(await lead.post(`/api/cycles/${cycle.id}/actions`, { action: 'Calibrate probing', ownerId: w.ids.audit_lead, dueDate: '2025-02-28', state: 'under-way' }), 201)
      .body as ActionItemView;
    expect((await actionsOf()).map((action) => [action.id, action.dueDate, action.state])).toEqual([
      [sooner.id, '2025-02-28', 'under-way'],
      [later.body.id, '2025-06-30', 'open'],
    ]);

    const edited = await lead.patch(`/api/actions/${sooner.id}`, { state: 'done', ownerId: w.ids.partner, version: 1 });
    expect(edited.status).toBe(200);
    expect(edited.body).toEqual(expect.objectContaining({ state: 'done', owner: { id: w.ids.partner, displayName: 'Dr Pat Partner (demo)' }, version: 2 }));
    const before = await storeFingerprint(w.t);
    const stale = await lead.patch(`/api/actions/${sooner.id}`, { state: 'dropped', version: 1 });
    expect(stale.status).toBe(409);
    expect(stale.body.error.details).toEqual({ currentVersion: 2 });
    expect(await storeFingerprint(w.t)).toEqual(before);

    expect((await lead.delete(`/api/actions/${later.body.id}`)).status).toBe(204);
    expect((await actionsOf()).map((action) => action.id)).toEqual([sooner.id]);
    expect((await lead.delete(`/api/actions/${later.body.id}`)).status).toBe(404);
  });

  const BAD: [string, object, string[]][] = [
    ['no action text', { action: '', ownerId: 1, dueDate: '2025-01-31' }, ['action']],
    ['no owner', { action: 'Calibrate probing', dueDate: '2025-01-31' }, ['ownerId']],
    ['no due date', { action: 'Calibrate probing', ownerId: 1 }, ['dueDate']],
    ['a due date that does not exist', { action: 'Calibrate probing', ownerId: 1, dueDate: '2025-02-30' }, ['dueDate']],
    ['an unknown state', { action: 'Calibrate probing', ownerId: 1, dueDate: '2025-01-31', state: 'someday' }, ['state']],
    ['an owner who does not exist', { action: 'Calibrate probing', ownerId: 999_999, dueDate: '2025-01-31' }, ['ownerId']],
  ];
  for (const [name, body, fields] of BAD) {
    it(`refuses an action with ${name} (400), storing nothing`, async () => {
      const before = await storeFingerprint(w.t);
      const response = await lead.post(`/api/cycles/${cycle.id}/actions`, body);
      expect(response.status, JSON.stringify(response.body)).toBe(400);
      expect(Object.keys(response.body.error.fields)).toEqual(fields);
      expect(await storeFingerprint(w.t)).toEqual(before);
    });
  }
});

describe('review notes (partners and the audit lead)', () => {
  let w: ClinicalWorld;
  let audit: AuditView;
  let cycle: CycleView;
  beforeAll(async () => {
    w = await createClinicalWorld();
    const lead = w.as('audit_lead');
    audit = await createAudit(lead, auditBody(await defaultScheduleId(lead)));
    cycle = await addCycle(lead, audit.id, '2024-01-01', '2024-12-31');
  });
  afterAll(async () => {
    await w.close();
  });

  it('stores a partner’s note with its author and lists notes newest first to the lead', async () => {
    const first = await w.as('partner').post(`/api/audits/${audit.id}/notes`, { topic: 'chart:funnel', text: 'Operator B sits near the upper limit.' });
    expect(first.status, JSON.stringify(first.body)).toBe(201);
    expect(first.body).toEqual(
      expect.objectContaining({ auditId: audit.id, cycleId: null, topic: 'chart:funnel', text: 'Operator B sits near the upper limit.', author: { id: w.ids.partner, displayName: 'Dr Pat Partner (demo)' } }),
    );
    const second = expectStatus(await w.as('audit_lead').post(`/api/audits/${audit.id}/notes`, { cycleId: cycle.id, topic: 'standard:2', text: 'Agreed.' }), 201).body as ReviewNoteView;
    const listed = expectStatus(await w.as('audit_lead').get(`/api/audits/${audit.id}/notes`), 200).body as ReviewNoteView[];
    expect(listed.map((note) => note.id)).toEqual([second.id, first.body.id]);
  });

  it('refuses an unknown topic, an empty text and a cycle of another audit (400), storing nothing', async () => {
    const other = await createAudit(w.as('audit_lead'), auditBody(await defaultScheduleId(w.as('audit_lead'))));
    const otherCycle = await addCycle(w.as('audit_lead'), other.id, '2024-01-01', '2024-12-31');
    for (const [body, fields] of [
      [{ topic: 'Chart Funnel!', text: 'Hmm' }, ['topic']],
      [{ topic: 'chart:funnel', text: '   ' }, ['text']],
      [{ topic: 'chart:funnel', text: 'Wrong cycle', cycleId: otherCycle.id }, ['cycleId']],
    ] as const) {
      const before = await storeFingerprint(w.t);
      const response = await w.as('partner').post(`/api/audits/${audit.id}/notes`, body);
      expect(response.status, JSON.stringify(response.body)).toBe(400);
      expect(Object.keys(response.body.error.fields)).toEqual(fields);
      expect(await storeFingerprint(w.t)).toEqual(before);
    }
  });

  it('is 403 for governance, clinicians and the admin, who see no notes', async () => {
    for (const role of ['governance', 'clinician', 'admin'] as const) {
      expect((await w.as(role).get(`/api/audits/${audit.id}/notes`)).status, role).toBe(403);
      expect((await w.as(role).post(`/api/audits/${audit.id}/notes`, { topic: 'chart:funnel', text: 'Hello' })).status, role).toBe(403);
    }
  });
});
