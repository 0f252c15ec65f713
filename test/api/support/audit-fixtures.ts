import type { Response } from 'supertest';
import type { AuditCreateRequest, AuditView, CaseDetail, CycleState, CycleView, ScheduleCreateRequest, ScheduleView, StandardCreateRequest, StandardView } from '@tidemark/shared';
import { clinicalFingerprint, createCase, expectStatus, patientBody, siteBody, visitBody, type ClinicalWorld } from './clinical-fixtures';
import type { ApiClient, TestApp } from './test-app';

/*
 * Builders for the audit API specs and one small, hand-built outcome fixture whose results
 * every spec works out by hand. Every builder returns a body the API accepts as it is.
 */

const DAY_MS = 86_400_000;

/** `iso` + `days` calendar days (UTC). */
export function addDays(iso: string, days: number): string {
  return new Date(Date.parse(`${iso}T00:00:00Z`) + days * DAY_MS).toISOString().slice(0, 10);
}

/** Audit tables; those with a version column also contribute the sum of versions. */
const AUDIT_TABLES = ['recall_schedule', 'audit', 'audit_standard', 'audit_cycle', 'action_item', 'review_note', 'calibration_reading'] as const;
const VERSIONED_AUDIT_TABLES: ReadonlySet<string> = new Set(['recall_schedule', 'audit', 'audit_standard', 'audit_cycle', 'action_item']);

/** Row counts and version sums of every audit and clinical table: any stored write changes it. */
export async function storeFingerprint(t: TestApp): Promise<Record<string, number>> {
  const fingerprint = await clinicalFingerprint(t);
  for (const table of AUDIT_TABLES) {
    const [row] = (await t.dataSource.query(`SELECT COUNT(*) AS n FROM ${table}`)) as { n: number }[];
    fingerprint[table] = Number(row.n);
    if (VERSIONED_AUDIT_TABLES.has(table)) {
      const [sum] = (await t.dataSource.query(`SELECT COALESCE(SUM(version), 0) AS v FROM ${table}`)) as { v: number }[];
      fingerprint[`${table}.versions`] = Number(sum.v);
    }
  }
  return fingerprint;
}

/** A valid schedule: 6 weeks and 6 months (targets 42 and 182 days). */
export function scheduleBody(overrides: Partial<ScheduleCreateRequest> = {}): ScheduleCreateRequest {
  return {
    name: 'Short audit schedule',
    intervals: [
      { key: '6w', label: '6 weeks', targetDays: 42, windowBeforeDays: 7, windowAfterDays: 14 },
      { key: '6m', label: '6 months', targetDays: 182, windowBeforeDays: 21, windowAfterDays: 30 },
    ],
    ...overrides,
  };
}

/** The practice (default) schedule's id, read through the API. */
export async function defaultScheduleId(client: ApiClient): Promise<number> {
  const schedules = expectStatus(await client.get('/api/schedules'), 200).body as ScheduleView[];
  const found = schedules.find((schedule) => schedule.isDefault);
  if (!found) throw new Error('No default schedule');
  return found.id;
}

/** A valid audit body on the given schedule: whole cohort, default thresholds (DESIGN.md §3: 0.5 / 1.0 mm). */
export function auditBody(scheduleId: number, overrides: Partial<AuditCreateRequest> = {}): AuditCreateRequest {
  return { title: 'Margin stability after crown lengthening', rationale: 'Does the new margin stay put?', scheduleId, ...overrides };
}

/** Creates an audit through the API (as the audit lead). */
export async function createAudit(lead: ApiClient, body: AuditCreateRequest): Promise<AuditView> {
  return expectStatus(await lead.post('/api/audits', body), 201).body as AuditView;
}

/**
 * The fixture's standards, one per verdict (hand-computed in audit-results.api.spec.ts):
 * mean rebound at 6 m ≤ 1 mm; ≥ 30% of sites within 1.0 mm at 6 m; ≤ 2% of cases with a grade II+
 * complication; ≥ 80% recall completion at 6 m; ≥ 90% final impressions after 6 weeks.
 */
export const FIXTURE_STANDARDS: readonly StandardCreateRequest[] = [
  { criterion: 'Mean rebound at 6 months within 1 mm', metric: 'mean-rebound', intervalKey: '6m', comparator: '<=', target: 1, evidenceSource: 'Arora et al. 2013' },
  { criterion: 'Sites within 1.0 mm of rebound at 6 months', metric: 'share-sites-rebound-within', intervalKey: '6m', thresholdMm: 1, comparator: '>=', target: 30 },
  { criterion: 'Cases with a grade II or worse complication', metric: 'share-cases-complication-grade', minGrade: 'II', comparator: '<=', target: 2 },
  { criterion: 'Six-month recall attended', metric: 'recall-completion', intervalKey: '6m', comparator: '>=', target: 80 },
  { criterion: 'Final impressions no earlier than 6 weeks', metric: 'share-cases-impression-after-6w', comparator: '>=', target: 90 },
];

/** Adds a standard through the API (as the audit lead). */
export async function addStandard(lead: ApiClient, auditId: number, body: StandardCreateRequest): Promise<StandardView> {
  return expectStatus(await lead.post(`/api/audits/${auditId}/standards`, body), 201).body as StandardView;
}

/** Adds a cycle for a surgery period (as the audit lead). */
export async function addCycle(lead: ApiClient, auditId: number, periodStart: string, periodEnd: string): Promise<CycleView> {
  return expectStatus(await lead.post(`/api/audits/${auditId}/cycles`, { periodStart, periodEnd }), 201).body as CycleView;
}

/** Moves a cycle through the given states in order, returning its last view. */
export async function moveCycle(lead: ApiClient, cycle: CycleView, states: CycleState[]): Promise<CycleView> {
  let current = cycle;
  for (const state of states) current = expectStatus(await lead.patch(`/api/cycles/${current.id}`, { state, version: current.version }), 200).body as CycleView;
  return current;
}

/** scoping → gathering → weighing → reported: freezes the cycle's results. */
export function reportCycle(lead: ApiClient, cycle: CycleView): Promise<CycleView> {
  return moveCycle(lead, cycle, ['gathering', 'weighing', 'reported']);
}

/** The JSON text of a response, for de-identification scans. */
export function jsonOf(response: Response): string {
  return JSON.stringify(response.body);
}

/*
 * The outcome fixture (invented; all dates 2024, so every recall window of the default schedule
 * — 12 months + 60 days at most — has closed long before the tests run). Operator A = the demo
 * clinician, operator B = the second clinician (higher id). REF→GM in mm, rebound = post-op − recall
 * (DESIGN.md §3).
 *
 * patient  phenotype smoking  diabetes    case  op  procedure                 indication            surgery
 * P1       thin      never    none        C1    A   gingivectomy              aesthetic             2024-01-10
 * P2       thick     current  none        C2    A   apically-positioned-flap  restorative-caries    2024-02-14
 * P3       thin      former   controlled  C3    B   gingivectomy              aesthetic             2024-03-06  (complication grade II)
 * P4       thick     never    none        C4    B   apf-osseous-recontouring  restorative-fracture  2024-04-10
 * P1                                      C5    B   gingivectomy              restorative-ferrule   2024-05-08  (withdrawn after 2 w)
 * P4                                      C6    A   gingivectomy (planned: never in a cohort)        2024-03-20
 *
 * site case tooth  baseline post-op  2w    6w (rebound)   6m (rebound)
 * S1   C1   11     8        10             9.5 (0.5)      9.5 (0.5)
 * S2   C1   21     8.5      11             10.5 (0.5)     10 (1.0)
 * S3   C2   14     6        8              7.5 (0.5)      6.5 (1.5)
 * S4   C3   12     7        9.5            9.5 (0)        9.5 (0)
 * S5   C3   24     7.5      10             10 (0)         10.5 (−0.5)
 * S6   C4   36     5        7.5            7 (0.5)        — (missed)
 * S7   C5   41     6        8       7 (1.0)
 * Visits fall exactly on target: 2w = surgery + 14, 6w = + 42, 6m = + 182 days.
 */
export const FIXTURE_SURGERY = { C1: '2024-01-10', C2: '2024-02-14', C3: '2024-03-06', C4: '2024-04-10', C5: '2024-05-08', C6: '2024-03-20' } as const;
export const FIXTURE_CODES = { P1: 'KX-7101', P2: 'KX-7102', P3: 'KX-7103', P4: 'KX-7104' } as const;

type CaseKey = keyof typeof FIXTURE_SURGERY;
type SiteKey = 'S1' | 'S2' | 'S3' | 'S4' | 'S5' | 'S6' | 'S7';

/** Ids of everything the fixture made. */
export interface OutcomeFixture {
  operatorA: number;
  operatorB: number;
  cases: Record<CaseKey, number>;
  sites: Record<SiteKey, number>;
  /** Visit ids by `<case>-<interval>`, e.g. `C1-6m`. */
  visits: Record<string, number>;
  visitDates: string[];
}

/** Registers the fixture through the API as the audit lead. */
export async function buildOutcomeFixture(w: ClinicalWorld): Promise<OutcomeFixture> {
  const lead = w.as('audit_lead');
  const operatorA = w.ids.clinician;
  const operatorB = w.ids.other;
  const fixture: OutcomeFixture = { operatorA, operatorB, cases: {} as Record<CaseKey, number>, sites: {} as Record<SiteKey, number>, visits: {}, visitDates: [] };
  const siteOf = (found: CaseDetail, tooth: number) => {
    const site = found.sites.find((candidate) => candidate.tooth === tooth);
    if (!site) throw new Error(`No site on tooth ${tooth}`);
    return site.id;
  };
  const recall = async (caseKey: CaseKey, found: CaseDetail, intervalKey: string, days: number, readings: [SiteKey, number][]) => {
    const visitDate = addDays(FIXTURE_SURGERY[caseKey], days);
    const detail = expectStatus(
      await lead.post(`/api/cases/${found.id}/visits`, visitBody(readings.map(([site, refGm]) => ({ siteId: fixture.sites[site], refGm })), { intervalKey, visitDate })),
      201,
    ).body as CaseDetail;
    const visit = detail.visits.find((candidate) => candidate.intervalKey === intervalKey);
    if (!visit) throw new Error('Visit not stored');
    fixture.visits[`${caseKey}-${intervalKey}`] = visit.id;
    fixture.visitDates.push(visitDate);
    return detail;
  };

  const c1 = await createCase(lead, operatorA, {
    patient: patientBody({ code: FIXTURE_CODES.P1, phenotype: 'thin', smoking: 'never', diabetes: 'none' }),
    surgeryDate: FIXTURE_SURGERY.C1,
    status: 'operated',
    procedure: 'gingivectomy',
    indication: 'aesthetic',
    sites: [siteBody({ tooth: 11, baselineRefGm: 8, postOpRefGm: 10 }), siteBody({ tooth: 21, baselineRefGm: 8.5, postOpRefGm: 11 })],
  });
  fixture.cases.C1 = c1.id;
  fixture.sites.S1 = siteOf(c1, 11);
  fixture.sites.S2 = siteOf(c1, 21);
  await recall('C1', c1, '6w', 42, [['S1', 9.5], ['S2', 10.5]]);
  await recall('C1', c1, '6m', 182, [['S1', 9.5], ['S2', 10]]);

  const c2 = await createCase(lead, operatorA, {
    patient: patientBody({ code: FIXTURE_CODES.P2, phenotype: 'thick', smoking: 'current', cigarettesPerDay: 10, diabetes: 'none' }),
    surgeryDate: FIXTURE_SURGERY.C2,
    status: 'operated',
    procedure: 'apically-positioned-flap',
    indication: 'restorative-caries',
    sites: [siteBody({ tooth: 14, baselineRefGm: 6, postOpRefGm: 8 })],
  });
  fixture.cases.C2 = c2.id;
  fixture.sites.S3 = siteOf(c2, 14);
  await recall('C2', c2, '6w', 42, [['S3', 7.5]]);
  await recall('C2', c2, '6m', 182, [['S3', 6.5]]);

  const c3 = await createCase(lead, operatorB, {
    patient: patientBody({ code: FIXTURE_CODES.P3, phenotype: 'thin', smoking: 'former', diabetes: 'controlled' }),
    surgeryDate: FIXTURE_SURGERY.C3,
    status: 'operated',
    procedure: 'gingivectomy',
    indication: 'aesthetic',
    sites: [siteBody({ tooth: 12, baselineRefGm: 7, postOpRefGm: 9.5 }), siteBody({ tooth: 24, baselineRefGm: 7.5, postOpRefGm: 10 })],
  });
  fixture.cases.C3 = c3.id;
  fixture.sites.S4 = siteOf(c3, 12);
  fixture.sites.S5 = siteOf(c3, 24);
  await recall('C3', c3, '6w', 42, [['S4', 9.5], ['S5', 10]]);
  await recall('C3', c3, '6m', 182, [['S4', 9.5], ['S5', 10.5]]);
  // Clavien–Dindo grade II: treated with drugs beyond analgesics (Dindo et al. 2004).
  expectStatus(
    await lead.post(`/api/cases/${c3.id}/complications`, {
      type: 'delayed-healing',
      grade: 'II',
      onsetDate: addDays(FIXTURE_SURGERY.C3, 5),
      resolutionDate: addDays(FIXTURE_SURGERY.C3, 19),
      management: 'Chlorhexidine rinse, review',
    }),
    201,
  );

  const c4 = await createCase(lead, operatorB, {
    patient: patientBody({ code: FIXTURE_CODES.P4, phenotype: 'thick', smoking: 'never', diabetes: 'none' }),
    surgeryDate: FIXTURE_SURGERY.C4,
    status: 'operated',
    procedure: 'apf-osseous-recontouring',
    indication: 'restorative-fracture',
    sites: [siteBody({ tooth: 36, baselineRefGm: 5, postOpRefGm: 7.5 })],
  });
  fixture.cases.C4 = c4.id;
  fixture.sites.S6 = siteOf(c4, 36);
  await recall('C4', c4, '6w', 42, [['S6', 7]]);

  const c5 = await createCase(lead, operatorB, {
    patient: undefined,
    patientId: c1.patient.id,
    surgeryDate: FIXTURE_SURGERY.C5,
    status: 'operated',
    procedure: 'gingivectomy',
    indication: 'restorative-ferrule',
    sites: [siteBody({ tooth: 41, baselineRefGm: 6, postOpRefGm: 8 })],
  });
  fixture.cases.C5 = c5.id;
  fixture.sites.S7 = siteOf(c5, 41);
  const afterRecall = await recall('C5', c5, '2w', 14, [['S7', 7]]);
  expectStatus(
    await lead.patch(`/api/cases/${c5.id}`, { status: 'withdrawn', withdrawnReason: 'Moved away after the first recall', version: afterRecall.version, reason: 'Patient withdrew' }),
    200,
  );

  const c6 = await createCase(lead, operatorA, {
    patient: undefined,
    patientId: c4.patient.id,
    surgeryDate: FIXTURE_SURGERY.C6,
    status: 'planned',
    procedure: 'gingivectomy',
    indication: 'aesthetic',
    sites: [siteBody({ tooth: 11 })],
  });
  fixture.cases.C6 = c6.id;
  return fixture;
}
