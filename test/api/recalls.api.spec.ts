import type { RecallDueItem, RecallDueList } from '@tidemark/shared';
import { createCase, createClinicalWorld, expectStatus, patientBody, siteBody, visitBody, type ClinicalWorld } from './support/clinical-fixtures';
import { ApiClient } from './support/test-app';

/*
 * Default schedule (shared/types/recall-schedule.ts, DESIGN.md §1.3), target days after surgery and
 * window before/after the target: 2w 14 (−3/+7), 6w 42 (−7/+14), 3m 91 (−14/+21), 6m 182 (−21/+30),
 * 12m 365 (−30/+60). "Upcoming" = window opens within 14 days of asOf. Every date below is worked out
 * by hand from these numbers (2025 is not a leap year).
 */
const AS_OF = '2025-06-15';

describe('GET /api/recalls/due', () => {
  let w: ClinicalWorld;
  const ids: Record<string, number> = {};
  const codes: Record<string, string> = {};

  /** Registers an operated case with teeth 11 and 21 (post-op REF→GM 10 mm). */
  async function operated(label: string, client: ApiClient, operatorId: number, surgeryDate: string) {
    codes[label] = `DUE-${label}`;
    const found = await createCase(client, operatorId, {
      surgeryDate,
      status: 'operated',
      patient: patientBody({ code: codes[label] }),
      sites: [siteBody({ tooth: 21 }), siteBody({ tooth: 11 })],
    });
    ids[label] = found.id;
    return found;
  }

  beforeAll(async () => {
    w = await createClinicalWorld();
    const lead = w.as('audit_lead');
    const clinician = w.as('clinician');
    // A: 2025-06-01 + 14 = 06-15, window 06-12 … 06-22 → 2w in window. 6w opens 07-06 (> 06-29): not yet.
    await operated('A', clinician, w.ids.clinician, '2025-06-01');
    // B: 2w target 06-03, window 05-31 … 06-10 → overdue; 6w target 07-01, opens 06-24 (≤ 06-29) → upcoming.
    await operated('B', clinician, w.ids.clinician, '2025-05-20');
    // C (another operator): 2w target 06-24, opens 06-21 → upcoming.
    await operated('C', lead, w.ids.other, '2025-06-10');
    // D: 2w target 06-04, window 06-01 … 06-11 would be overdue, but the 2w visit is recorded;
    //    6w target 07-02, opens 06-25 → upcoming.
    const d = await operated('D', clinician, w.ids.clinician, '2025-05-21');
    expectStatus(await clinician.post(`/api/cases/${d.id}/visits`, visitBody([{ siteId: d.sites[0].id, refGm: 9.5 }], { intervalKey: '2w', visitDate: '2025-06-04' })), 201);
    // E (audit lead operates): 2w target 06-08, window 06-05 … 06-15 → in window on its last day;
    //    6w target 07-06, opens 06-29 = asOf + 14 → upcoming on the boundary.
    await operated('E', lead, w.ids.audit_lead, '2025-05-25');
    // F: 2w (closed 02-22), 6w (closed 03-29) and 3m (target 05-03, window 04-19 … 05-24) all missed;
    //    only the latest, 3m, is overdue. 6m target 08-02 opens 07-12: not yet.
    await operated('F', lead, w.ids.other, '2025-02-01');
    // G: 2w target 06-18, window opens 06-15 = asOf → in window on its first day.
    await operated('G', clinician, w.ids.clinician, '2025-06-04');
    // H: 2w target 06-07, window closed 06-14 (the day before asOf) → overdue; 6w opens 06-28 → upcoming.
    await operated('H', clinician, w.ids.clinician, '2025-05-24');
    // K: 3m target 05-31, window 05-17 … 06-21 → in window; the missed 6w (closed 04-26) is not listed as overdue.
    await operated('K', lead, w.ids.other, '2025-03-01');
    // L: like F, but the 3m recall was recorded (late): 2w, 6w and 3m all drop out; 6m not yet open.
    const l = await operated('L', lead, w.ids.other, '2025-02-01');
    expectStatus(await lead.post(`/api/cases/${l.id}/visits`, visitBody([{ siteId: l.sites[0].id, refGm: 9.5 }], { intervalKey: '3m', visitDate: '2025-05-05' })), 201);
    // M: 2024-06-20 + 365 = 2025-06-20, window 05-21 … 08-19 → 12m in window.
    await operated('M', lead, w.ids.other, '2024-06-20');
    // Not on the list whatever the dates: a concluded case, a planned one and a withdrawn one (all as A).
    const concluded = await operated('X1', clinician, w.ids.clinician, '2025-06-01');
    expectStatus(await clinician.patch(`/api/cases/${concluded.id}`, { status: 'concluded', version: 1, reason: 'Treatment finished' }), 200);
    const planned = await createCase(clinician, w.ids.clinician, { surgeryDate: '2025-06-01', status: 'planned' });
    ids.X2 = planned.id;
    const withdrawn = await operated('X3', lead, w.ids.other, '2025-06-01');
    expectStatus(await lead.patch(`/api/cases/${withdrawn.id}`, { status: 'withdrawn', withdrawnReason: 'Moved abroad', version: 1, reason: 'Withdrawn' }), 200);
  });
  afterAll(async () => {
    await w.close();
  });

  async function due(client: ApiClient, asOf = AS_OF): Promise<RecallDueList> {
    const response = await client.get(`/api/recalls/due?asOf=${asOf}`);
    expect(response.status, JSON.stringify(response.body)).toBe(200);
    return response.body as RecallDueList;
  }

  /** [case label, interval, target, window opens, window closes] of each item. */
  function rows(items: RecallDueItem[]): [string, string, string, string, string][] {
    const labels = new Map(Object.entries(ids).map(([label, id]) => [id, label]));
    return items.map((item) => [labels.get(item.caseId) ?? `?${item.caseId}`, item.intervalKey, item.targetDate, item.windowOpens, item.windowCloses]);
  }

  it('groups the audit lead’s list into in window, overdue and upcoming, for every operator', async () => {
    const list = await due(w.as('audit_lead'));
    expect(list.asOf).toBe(AS_OF);
    // In window, soonest closing first.
    expect(rows(list.inWindow)).toEqual([
      ['E', '2w', '2025-06-08', '2025-06-05', '2025-06-15'],
      ['K', '3m', '2025-05-31', '2025-05-17', '2025-06-21'],
      ['A', '2w', '2025-06-15', '2025-06-12', '2025-06-22'],
      ['G', '2w', '2025-06-18', '2025-06-15', '2025-06-25'],
      ['M', '12m', '2025-06-20', '2025-05-21', '2025-08-19'],
    ]);
    // Overdue, longest closed first; one per case (the latest missed interval).
    expect(rows(list.overdue)).toEqual([
      ['F', '3m', '2025-05-03', '2025-04-19', '2025-05-24'],
      ['B', '2w', '2025-06-03', '2025-05-31', '2025-06-10'],
      ['H', '2w', '2025-06-07', '2025-06-04', '2025-06-14'],
    ]);
    // Upcoming, soonest opening first.
    expect(rows(list.upcoming)).toEqual([
      ['C', '2w', '2025-06-24', '2025-06-21', '2025-07-01'],
      ['B', '6w', '2025-07-01', '2025-06-24', '2025-07-15'],
      ['D', '6w', '2025-07-02', '2025-06-25', '2025-07-16'],
      ['H', '6w', '2025-07-05', '2025-06-28', '2025-07-19'],
      ['E', '6w', '2025-07-06', '2025-06-29', '2025-07-20'],
    ]);
    expect(list.inWindow.every((item) => item.state === 'in-window')).toBe(true);
    expect(list.overdue.every((item) => item.state === 'overdue')).toBe(true);
    expect(list.upcoming.every((item) => item.state === 'upcoming')).toBe(true);
  });

  it('describes each item fully', async () => {
    const list = await due(w.as('audit_lead'));
    expect(list.inWindow.find((item) => item.caseId === ids.A)).toEqual({
      caseId: ids.A,
      patientCode: 'DUE-A',
      operator: { id: w.ids.clinician, displayName: 'Dr Cal Clinician (demo)' },
      surgeryDate: '2025-06-01',
      intervalKey: '2w',
      intervalLabel: '2 weeks',
      targetDate: '2025-06-15',
      windowOpens: '2025-06-12',
      windowCloses: '2025-06-22',
      state: 'in-window',
      teeth: [11, 21],
    });
  });

  it('drops an interval once its visit is recorded (D has no 2w; L none at all)', async () => {
    const list = await due(w.as('audit_lead'));
    const all = [...list.inWindow, ...list.overdue, ...list.upcoming];
    expect(all.filter((item) => item.caseId === ids.D).map((item) => item.intervalKey)).toEqual(['6w']);
    expect(all.filter((item) => item.caseId === ids.L)).toEqual([]);
  });

  it('leaves out concluded, planned and withdrawn cases', async () => {
    const list = await due(w.as('audit_lead'));
    const caseIds = new Set([...list.inWindow, ...list.overdue, ...list.upcoming].map((item) => item.caseId));
    for (const label of ['X1', 'X2', 'X3']) expect(caseIds.has(ids[label])).toBe(false);
  });

  it('shows a clinician only their own cases', async () => {
    const list = await due(w.as('clinician'));
    expect(rows(list.inWindow).map((row) => `${row[0]}:${row[1]}`)).toEqual(['A:2w', 'G:2w']);
    expect(rows(list.overdue).map((row) => `${row[0]}:${row[1]}`)).toEqual(['B:2w', 'H:2w']);
    expect(rows(list.upcoming).map((row) => `${row[0]}:${row[1]}`)).toEqual(['B:6w', 'D:6w', 'H:6w']);
    const other = await due(w.as('other'));
    expect(rows([...other.inWindow, ...other.overdue, ...other.upcoming]).map((row) => row[0]).sort()).toEqual(['C', 'F', 'K', 'M']);
  });

  it('moves with asOf: A is in window on its last day (06-22) and overdue the day after', async () => {
    // asOf 2025-06-22: A 2w window 06-12 … 06-22 (last day); G 2w window 06-15 … 06-25.
    const list = await due(w.as('clinician'), '2025-06-22');
    expect(rows(list.inWindow).map((row) => `${row[0]}:${row[1]}`)).toEqual(['A:2w', 'G:2w']);
    // 06-23: A's window closed the day before → overdue.
    const later = await due(w.as('clinician'), '2025-06-23');
    expect(rows(later.overdue).map((row) => `${row[0]}:${row[1]}`)).toEqual(['B:2w', 'H:2w', 'A:2w']);
  });

  it('answers 400 for a malformed asOf', async () => {
    for (const asOf of ['2025-13-01', '15-06-2025', '2025-02-29']) {
      const response = await w.as('audit_lead').get(`/api/recalls/due?asOf=${asOf}`);
      expect(response.status).toBe(400);
      expect(Object.keys(response.body.error.fields)).toEqual(['asOf']);
    }
  });

  it('answers 401 anonymously and 403 to partner, governance and admin (DESIGN.md §2: the Today list is for those who enter recalls)', async () => {
    expect((await new ApiClient(w.t.app).get('/api/recalls/due')).status).toBe(401);
    for (const role of ['partner', 'governance', 'admin'] as const) {
      const response = await w.as(role).get(`/api/recalls/due?asOf=${AS_OF}`);
      expect(response.status).toBe(403);
      expect(response.body.error.code).toBe('forbidden');
    }
  });
});
