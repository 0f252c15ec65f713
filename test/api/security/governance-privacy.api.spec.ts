import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import unzipper from 'unzipper';
import { GROUP_BY_OPTIONS, type AuditView, type CaseDetail, type CycleView } from '@tidemark/shared';
import { FIXTURE_CODES, FIXTURE_STANDARDS, addCycle, addStandard, auditBody, buildOutcomeFixture, createAudit, defaultScheduleId, reportCycle, type OutcomeFixture } from '../support/audit-fixtures';
import { createClinicalWorld, expectStatus, type ClinicalWorld } from '../support/clinical-fixtures';
import type { ApiClient } from '../support/test-app';
import { ROUTE_ACCESS } from './route-access-table';

/*
 * What the governance committee may see through the API and its workbook, decided from
 * DESIGN.md §2 (governance: dashboards and charts "de-identified", the workbook export, no
 * patient-level records, no change history) and §7 (de-identified: "patient codes replaced per
 * export, dates reduced to month"):
 *
 * ALLOWED  counts, statistics, standards met or not, operator letters; months (YYYY-MM) of
 *          clinical events; audit metadata the committee governs — titles, cohort bounds, cycle
 *          periods, presented and frozen dates, action plans with due dates, re-audit dates —
 *          and the analysis date (asOf); team-written free text once redacted as the workbook
 *          redacts it (server/export/free-text-redactor.ts).
 * REFUSED  any patient code held in the database (also inside team-written text); any full date
 *          (day precision) of a clinical event — surgery, recall visit, complication onset or
 *          resolution, final impression or restoration, calibration reading — in any field and,
 *          in the workbook, also as a spreadsheet date serial; any full date at all outside the
 *          metadata fields above; any free text written about a patient or case (case notes,
 *          intra-operative events, withdrawal reasons, visit notes, complication management,
 *          reasons given for corrections) and review notes (partners and the audit lead only).
 *
 * The fixture (support/audit-fixtures.ts) plus notes, correction reasons, final-restoration
 * dates and a calibration reading, and team text that names a patient code and a full date.
 * Every GET route the access table opens to governance is called with real ids (all cycles,
 * every grouping), and the workbook of the live data and of a reported cycle is unzipped.
 */

/** JSON keys whose full dates are audit metadata, the analysis date or the member's own sign-in times, not clinical events. */
const METADATA_DATE_KEYS: ReadonlySet<string> = new Set(['asOf', 'frozenAt', 'periodStart', 'periodEnd', 'presentedDate', 'dueDate', 'reauditDate', 'surgeryFrom', 'surgeryTo', 'signedInAt', 'lastActiveAt']);
const FULL_DATE = /\d{4}-\d{2}-\d{2}/;

/** Excel 1900 date system: serial 1 = 1900-01-01 with the 1900 leap-year bug, so day 0 is 1899-12-30 (ECMA-376 Part 1, §18.17.4.1). */
function excelSerial(isoDay: string): number {
  return (Date.parse(`${isoDay}T00:00:00Z`) - Date.UTC(1899, 11, 30)) / 86_400_000;
}

interface Finding {
  where: string;
  kind: string;
  value: string;
}

/** What must never reach governance, read from the database as it stands. */
interface Forbidden {
  codes: string[];
  clinicalDates: string[];
  freeTexts: string[];
}

async function forbiddenValues(w: ClinicalWorld): Promise<Forbidden> {
  const column = async (sql: string): Promise<string[]> =>
    ((await w.t.dataSource.query(sql)) as { v: string | null }[]).map((row) => row.v).filter((value): value is string => typeof value === 'string' && value.trim().length > 0);
  const codes = await column('SELECT code AS v FROM patient');
  const clinicalDates = [
    ...(await column('SELECT surgery_date AS v FROM surgical_case')),
    ...(await column('SELECT final_impression_date AS v FROM surgical_case')),
    ...(await column('SELECT final_restoration_date AS v FROM surgical_case')),
    ...(await column('SELECT visit_date AS v FROM visit')),
    ...(await column('SELECT onset_date AS v FROM complication')),
    ...(await column('SELECT resolution_date AS v FROM complication')),
    ...(await column('SELECT measured_on AS v FROM calibration_reading')),
  ];
  const freeTexts = [
    ...(await column('SELECT notes AS v FROM surgical_case')),
    ...(await column('SELECT intra_operative_events AS v FROM surgical_case')),
    ...(await column('SELECT withdrawn_reason AS v FROM surgical_case')),
    ...(await column('SELECT notes AS v FROM visit')),
    ...(await column('SELECT management AS v FROM complication')),
    ...(await column('SELECT reason AS v FROM change_record')),
    ...(await column('SELECT text AS v FROM review_note')),
  ];
  return { codes: [...new Set(codes)], clinicalDates: [...new Set(clinicalDates)], freeTexts: [...new Set(freeTexts)] };
}

/** Raw-text checks shared by JSON and workbook XML. */
function scanText(where: string, text: string, forbidden: Forbidden): Finding[] {
  const findings: Finding[] = [];
  const upper = text.toUpperCase();
  for (const code of forbidden.codes) if (upper.includes(code.toUpperCase())) findings.push({ where, kind: 'patient code', value: code });
  for (const day of forbidden.clinicalDates) if (text.includes(day)) findings.push({ where, kind: 'clinical full date', value: day });
  for (const note of forbidden.freeTexts) if (text.includes(note)) findings.push({ where, kind: 'free-text note', value: note });
  return findings;
}

/** Every full date in a JSON body must sit under a metadata key. */
function scanJsonDates(where: string, value: unknown, key: string, findings: Finding[]): void {
  if (typeof value === 'string') {
    if (FULL_DATE.test(value) && !METADATA_DATE_KEYS.has(key)) findings.push({ where: `${where} @ ${key}`, kind: 'full date outside metadata', value });
  } else if (Array.isArray(value)) {
    value.forEach((item) => scanJsonDates(where, item, key, findings));
  } else if (value !== null && typeof value === 'object') {
    for (const [childKey, child] of Object.entries(value)) scanJsonDates(where, child, childKey, findings);
  }
}

/** Every entry of an xlsx (a zip of XML parts), as text. */
async function workbookText(bytes: Buffer, directory: string): Promise<{ name: string; text: string }[]> {
  const file = path.join(directory, `workbook-${Date.now()}-${Math.random().toString(36).slice(2)}.xlsx`);
  writeFileSync(file, bytes);
  const zip = await unzipper.Open.file(file);
  const parts: { name: string; text: string }[] = [];
  for (const entry of zip.files) {
    if (entry.type === 'File' && /\.(xml|rels)$/.test(entry.path)) parts.push({ name: entry.path, text: (await entry.buffer()).toString('utf8') });
  }
  return parts;
}

interface Ids {
  auditId: number;
  cycleIds: [number, number];
  exportJobs: string[];
}

/** The URLs governance calls per GET route of the table, with real ids. */
const GOVERNANCE_READS: Readonly<Record<string, (ids: Ids) => string[]>> = {
  'GET /api/health': () => ['/api/health'],
  'GET /api/auth/me': () => ['/api/auth/me'],
  'GET /api/auth/sign-in-options': () => ['/api/auth/sign-in-options'],
  'GET /api/auth/second-factor': () => ['/api/auth/second-factor'],
  'GET /api/auth/sessions': () => ['/api/auth/sessions'],
  'GET /api/schedules': () => ['/api/schedules'],
  'GET /api/audits': () => ['/api/audits'],
  'GET /api/audits/:id': ({ auditId }) => [`/api/audits/${auditId}`],
  'GET /api/audits/:id/results': ({ auditId, cycleIds }) => [
    ...['', ...cycleIds.map((id) => `cycleId=${id}`)].map((scope) => `/api/audits/${auditId}/results?${scope}`),
    ...GROUP_BY_OPTIONS.flatMap((groupBy) => ['', ...cycleIds.map((id) => `&cycleId=${id}`)].map((scope) => `/api/audits/${auditId}/results?groupBy=${groupBy}${scope}`)),
  ],
  'GET /api/audits/:id/funnel': ({ auditId, cycleIds }) =>
    ['complication', 'relapse'].flatMap((measure) => ['', ...cycleIds.map((id) => `&cycleId=${id}`)].map((scope) => `/api/audits/${auditId}/funnel?measure=${measure}${scope}`)),
  'GET /api/audits/:id/trend': ({ auditId, cycleIds }) =>
    ['6w', '6m'].flatMap((interval) => ['', ...cycleIds.map((id) => `&cycleId=${id}`)].map((scope) => `/api/audits/${auditId}/trend?intervalKey=${interval}${scope}`)),
  'GET /api/audits/:id/survival': ({ auditId, cycleIds }) => ['', ...cycleIds.map((id) => `?cycleId=${id}`)].map((scope) => `/api/audits/${auditId}/survival${scope}`),
  'GET /api/audits/:id/calibration': ({ auditId, cycleIds }) => ['', ...cycleIds.map((id) => `?cycleId=${id}`)].map((scope) => `/api/audits/${auditId}/calibration${scope}`),
  'GET /api/audits/:id/compare': ({ auditId, cycleIds }) => [`/api/audits/${auditId}/compare?first=${cycleIds[0]}&second=${cycleIds[1]}`],
  'GET /api/exports/:jobId': ({ exportJobs }) => exportJobs.map((job) => `/api/exports/${job}`),
  'GET /api/exports/:jobId/file': ({ exportJobs }) => exportJobs.map((job) => `/api/exports/${job}/file`),
};

describe('governance sees de-identified results only (DESIGN.md §2, §7)', () => {
  let w: ClinicalWorld;
  let governance: ApiClient;
  let fixture: OutcomeFixture;
  let ids: Ids;
  let forbidden: Forbidden;
  let directory: string;

  beforeAll(async () => {
    w = await createClinicalWorld();
    const lead = w.as('audit_lead');
    governance = w.as('governance');
    fixture = await buildOutcomeFixture(w);
    directory = mkdtempSync(path.join(tmpdir(), 'tidemark-privacy-'));

    // Free text and full dates on the clinical record.
    const c1 = expectStatus(await lead.get(`/api/cases/${fixture.cases.C1}`), 200).body as CaseDetail;
    expectStatus(
      await lead.patch(`/api/cases/${c1.id}`, { notes: 'Anxious about the smile line; wants photos each recall', intraOperativeEvents: 'Brisk bleeding at 21 settled with pressure', version: c1.version, reason: 'Transcribed from the paper chart' }),
      200,
    );
    const c2 = expectStatus(await lead.get(`/api/cases/${fixture.cases.C2}`), 200).body as CaseDetail;
    expectStatus(await lead.patch(`/api/cases/${c2.id}`, { finalImpressionDate: '2024-04-03', finalRestorationDate: '2024-04-24', version: c2.version, reason: 'Restorative dates from the lab slip' }), 200);
    const visit = c1.visits.find((candidate) => candidate.intervalKey === '6w');
    if (!visit) throw new Error('No 6-week visit on C1');
    expectStatus(await lead.patch(`/api/visits/${visit.id}`, { notes: 'Margin looked inflamed near the papilla', version: visit.version, reason: 'Added the chairside remark' }), 200);
    expectStatus(await lead.post('/api/calibration-readings', { siteId: fixture.sites.S1, measuredOn: '2024-10-02', refGm: 9.5 }), 201);

    // Team-written audit text naming a patient and a day, as people do.
    const audit: AuditView = await createAudit(lead, auditBody(await defaultScheduleId(lead), { rationale: `Prompted by ${FIXTURE_CODES.P2} relapsing after 2024-08-14` }));
    for (const standard of FIXTURE_STANDARDS) await addStandard(lead, audit.id, standard);
    expectStatus(await lead.post(`/api/audits/${audit.id}/standards`, { criterion: `Mean papilla change at 6 months (checked for ${FIXTURE_CODES.P3} on 2024-09-04)`, metric: 'mean-papilla-change', intervalKey: '6m', comparator: '>=', target: 0, evidenceSource: `Chart of ${FIXTURE_CODES.P1}` }), 201);
    const first: CycleView = await reportCycle(lead, await addCycle(lead, audit.id, '2024-01-01', '2024-02-29'));
    const second: CycleView = await reportCycle(lead, await addCycle(lead, audit.id, '2024-03-01', '2024-12-31'));
    expectStatus(await lead.post(`/api/cycles/${first.id}/actions`, { action: `Re-measure ${FIXTURE_CODES.P1} (seen 2024-07-10) before the re-audit`, ownerId: w.ids.audit_lead, dueDate: '2030-09-30' }), 201);
    expectStatus(await lead.patch(`/api/cycles/${second.id}`, { notes: `Discussed ${FIXTURE_CODES.P4} at the meeting`, version: second.version }), 200);
    expectStatus(await w.as('partner').post(`/api/audits/${audit.id}/notes`, { topic: 'chart:funnel', text: 'Operator B relapse looks high; ask about the stent' }), 201);

    const exportJobs: string[] = [];
    for (const cycleId of [null, first.id]) {
      exportJobs.push(expectStatus(await governance.post(`/api/audits/${audit.id}/exports`, { cycleId }), 202).body.jobId as string);
    }
    await w.t.exports.idle();
    ids = { auditId: audit.id, cycleIds: [first.id, second.id], exportJobs };
    forbidden = await forbiddenValues(w);
  });
  afterAll(async () => {
    await w.t.exports.idle();
    await w.close();
    rmSync(directory, { recursive: true, force: true });
  });

  it('scans real values: the database holds codes, clinical full dates and free-text notes', () => {
    expect(forbidden.codes).toEqual(expect.arrayContaining(Object.values(FIXTURE_CODES)));
    expect(forbidden.clinicalDates).toEqual(expect.arrayContaining(['2024-01-10', '2024-02-21', '2024-03-11', '2024-04-24', '2024-10-02']));
    expect(forbidden.freeTexts).toEqual(
      expect.arrayContaining(['Anxious about the smile line; wants photos each recall', 'Margin looked inflamed near the papilla', 'Chlorhexidine rinse, review', 'Moved away after the first recall']),
    );
  });

  it('calls every GET route the access table opens to governance', () => {
    const open = Object.entries(ROUTE_ACCESS)
      .filter(([key, expected]) => key.startsWith('GET ') && expected.governance < 300)
      .map(([key]) => key)
      .sort();
    expect(Object.keys(GOVERNANCE_READS).sort()).toEqual(open);
  });

  it('gives governance the team text redacted as the workbook does, and the audit lead the text as written', async () => {
    const criterion = `Mean papilla change at 6 months (checked for ${FIXTURE_CODES.P3} on 2024-09-04)`;
    const asWritten = expectStatus(await w.as('audit_lead').get(`/api/audits/${ids.auditId}`), 200).body as AuditView;
    expect(asWritten.standards.map((standard) => standard.criterion)).toContain(criterion);
    const redacted = expectStatus(await governance.get(`/api/audits/${ids.auditId}`), 200).body as AuditView;
    // server/export/free-text-redactor.ts: the code is replaced, the day cut to its month.
    expect(redacted.standards.map((standard) => standard.criterion)).toContain('Mean papilla change at 6 months (checked for [patient code removed] on 2024-09)');
    expect(redacted.rationale).toBe('Prompted by [patient code removed] relapsing after 2024-08');
    expect(redacted.cycles[0].periodStart).toBe('2024-01-01');
  });

  for (const key of Object.keys(GOVERNANCE_READS)) {
    it(`${key}: no patient code, clinical full date or free-text note`, async () => {
      const findings: Finding[] = [];
      for (const url of GOVERNANCE_READS[key](ids)) {
        if (key.endsWith('/file')) {
          const response = await governance.getBytes(url);
          expect(response.status, url).toBe(200);
          for (const part of await workbookText(response.body as Buffer, directory)) {
            findings.push(...scanText(`${url} ${part.name}`, part.text, forbidden));
            for (const day of forbidden.clinicalDates) {
              if (part.text.includes(`<v>${excelSerial(day)}</v>`)) findings.push({ where: `${url} ${part.name}`, kind: 'clinical date as a spreadsheet serial', value: day });
            }
          }
          continue;
        }
        const response = await governance.get(url);
        expect(response.status, `${url}: ${JSON.stringify(response.body)}`).toBe(200);
        findings.push(...scanText(url, JSON.stringify(response.body), forbidden));
        scanJsonDates(url, response.body, '', findings);
      }
      expect(findings).toEqual([]);
    });
  }
});
