import { existsSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { Readable } from 'node:stream';
import ExcelJS from 'exceljs';
import type { CellValue, Worksheet } from 'exceljs';
import unzipper from 'unzipper';
import type { AuditResults, AuditView, CycleView, Role, StandardResult } from '@tidemark/shared';
import { ExpiringJobs, JOB_LIFETIME_MS } from '../../server/export/expiring-jobs';
import { FIXTURE_CODES, FIXTURE_STANDARDS, addCycle, addStandard, auditBody, buildOutcomeFixture, createAudit, defaultScheduleId, reportCycle } from './support/audit-fixtures';
import { createClinicalWorld, expectStatus, type ClinicalWorld } from './support/clinical-fixtures';
import type { ApiClient } from './support/test-app';

/*
 * The governance workbook through the API, on the hand-built outcome fixture of the audit specs
 * (support/audit-fixtures.ts): 5 cases in the cohort, 4 patients, 7 sites, 12 site-visit rows.
 */

const SHEETS = ['Front page', 'Criteria', 'Margin outcomes', 'Papilla', 'Complications', 'Recall', 'Action plan', 'Site data', 'Method notes', 'Charts'];
const DATA_SHEETS = ['Criteria', 'Margin outcomes', 'Papilla', 'Complications', 'Recall', 'Action plan', 'Site data', 'Method notes'];
const ISO_DAY = /\d{4}-\d{2}-\d{2}/;

/** Starts an export and waits for it; returns the job id. */
async function exportAs(w: ClinicalWorld, client: ApiClient, auditId: number, cycleId: number | null = null): Promise<string> {
  const started = expectStatus(await client.post(`/api/audits/${auditId}/exports`, { cycleId }), 202);
  await w.t.exports.idle();
  return started.body.jobId as string;
}

/** Downloads a finished workbook as bytes. */
async function download(client: ApiClient, jobId: string) {
  return client.getBytes(`/api/exports/${jobId}/file`);
}

async function openWorkbook(bytes: Buffer): Promise<ExcelJS.Workbook> {
  const workbook = new ExcelJS.Workbook();
  // read(stream): exceljs' own Buffer declaration does not match Node's for load(buffer).
  await workbook.xlsx.read(Readable.from([bytes]));
  return workbook;
}

/** Every text a cell shows, whatever its kind. */
function textsOf(value: CellValue): string[] {
  if (value === null || value === undefined) return [];
  if (typeof value === 'string') return [value];
  if (typeof value === 'number' || typeof value === 'boolean' || value instanceof Date) return [];
  if ('richText' in value) return value.richText.map((part) => part.text);
  if ('hyperlink' in value) return [value.text, value.hyperlink];
  if ('formula' in value) return [String(value.formula)];
  return [JSON.stringify(value)];
}

function eachCell(sheet: Worksheet, visit: (value: CellValue, row: number, column: number) => void): void {
  sheet.eachRow({ includeEmpty: false }, (row, rowNumber) => row.eachCell({ includeEmpty: false }, (cell, column) => visit(cell.value, rowNumber, column)));
}

/** A sheet that must exist. */
function sheetOf(workbook: ExcelJS.Workbook, name: string): Worksheet {
  const sheet = workbook.getWorksheet(name);
  if (!sheet) throw new Error(`No sheet named ${name}`);
  return sheet;
}

/** Header name → column number of a table sheet. */
function columnsOf(sheet: Worksheet): Map<string, number> {
  const columns = new Map<string, number>();
  sheet.getRow(1).eachCell((cell, column) => columns.set(String(cell.value), column));
  return columns;
}

function cellAt(sheet: Worksheet, row: number, header: string) {
  const column = columnsOf(sheet).get(header);
  if (!column) throw new Error(`No column "${header}" on ${sheet.name}`);
  return sheet.getRow(row).getCell(column);
}

/** The workbook's value of a standard in the API's unit (% cells hold fractions). */
function asApiUnit(result: StandardResult, value: CellValue): number | null {
  if (typeof value !== 'number') return null;
  return result.unit === '%' ? value * 100 : value;
}

describe('governance workbook export', () => {
  let w: ClinicalWorld;
  let lead: ApiClient;
  let audit: AuditView;
  let reported: CycleView;
  let directory: string;

  beforeAll(async () => {
    w = await createClinicalWorld();
    lead = w.as('audit_lead');
    await buildOutcomeFixture(w);
    audit = await createAudit(lead, auditBody(await defaultScheduleId(lead)));
    for (const standard of FIXTURE_STANDARDS) await addStandard(lead, audit.id, standard);
    // Free text that must not reach the workbook as written: a patient code and a full date.
    expectStatus(await lead.post(`/api/audits/${audit.id}/standards`, { criterion: `Mean papilla change at 6 months (checked for ${FIXTURE_CODES.P2} on 2024-08-13)`, metric: 'mean-papilla-change', intervalKey: '6m', comparator: '>=', target: 0 }), 201);
    reported = await reportCycle(lead, await addCycle(lead, audit.id, '2024-01-01', '2024-02-29'));
    expectStatus(await lead.post(`/api/cycles/${reported.id}/actions`, { action: `Re-measure ${FIXTURE_CODES.P1} before the re-audit`, ownerId: w.ids.audit_lead, dueDate: '2024-09-30' }), 201);
    directory = mkdtempSync(path.join(tmpdir(), 'tidemark-export-spec-'));
  });
  afterAll(async () => {
    await w.t.exports.idle();
    await w.close();
    rmSync(directory, { recursive: true, force: true });
  });

  describe('access', () => {
    const readers: Role[] = ['audit_lead', 'partner', 'governance'];
    for (const actor of ['anonymous', 'admin', 'clinician', ...readers] as const) {
      const status = actor === 'anonymous' ? 401 : readers.some((role) => role === actor) ? 202 : 403;
      it(`POST /api/audits/:id/exports: ${actor} → ${status}`, async () => {
        const response = await w.as(actor).post(`/api/audits/${audit.id}/exports`, { cycleId: null });
        expect(response.status, JSON.stringify(response.body)).toBe(status);
        if (status === 202) expect(response.body.jobId).toMatch(/^[0-9a-f-]{36}$/);
        else expect(response.body.error.code).toBe(status === 401 ? 'unauthenticated' : 'forbidden');
        await w.t.exports.idle();
      });
    }

    it('GET /api/exports/:jobId and /file: anonymous 401; admin and clinician 403; another reader 404; the owner 200', async () => {
      const jobId = await exportAs(w, w.as('partner'), audit.id);
      for (const suffix of ['', '/file']) {
        const url = `/api/exports/${jobId}${suffix}`;
        expect((await w.as('anonymous').get(url)).status).toBe(401);
        expect((await w.as('admin').get(url)).status).toBe(403);
        expect((await w.as('clinician').get(url)).status).toBe(403);
        expect((await w.as('governance').get(url)).status).toBe(404);
        expect((await w.as('audit_lead').get(url)).status).toBe(404);
      }
      expect(expectStatus(await w.as('partner').get(`/api/exports/${jobId}`), 200).body).toEqual({ state: 'done', progress: 1, rows: 12 });
      expect((await download(w.as('partner'), jobId)).status).toBe(200);
    });

    it('an unknown audit or a cycle of another audit is 404; a malformed body is 400; an unknown job 404', async () => {
      expect((await lead.post('/api/audits/999999/exports', { cycleId: null })).status).toBe(404);
      const other = await createAudit(lead, auditBody(await defaultScheduleId(lead), { title: 'Another audit' }));
      expect((await lead.post(`/api/audits/${other.id}/exports`, { cycleId: reported.id })).status).toBe(404);
      const bad = await lead.post(`/api/audits/${audit.id}/exports`, { cycleId: 'first' });
      expect(bad.status).toBe(400);
      expect(Object.keys(bad.body.error.fields)).toEqual(['cycleId']);
      expect((await lead.get('/api/exports/00000000-0000-4000-8000-000000000000')).status).toBe(404);
      expect((await lead.get('/api/exports/not-a-job/file')).status).toBe(400);
    });
  });

  describe('the workbook (live results, as the governance committee)', () => {
    let bytes: Buffer;
    let workbook: ExcelJS.Workbook;
    let results: AuditResults;
    let disposition: string;

    beforeAll(async () => {
      const governance = w.as('governance');
      const jobId = await exportAs(w, governance, audit.id);
      const response = await download(governance, jobId);
      expect(response.status).toBe(200);
      disposition = String(response.headers['content-disposition']);
      bytes = response.body as Buffer;
      workbook = await openWorkbook(bytes);
      results = expectStatus(await governance.get(`/api/audits/${audit.id}/results`), 200).body as AuditResults;
    });

    it('is an attachment named after the audit, with no patient data in the name', () => {
      expect(disposition).toMatch(new RegExp(`^attachment; filename="?tidemark-governance-audit-${audit.id}-live-\\d{4}-\\d{2}-\\d{2}\\.xlsx"?$`));
    });

    it('has our sheets in order', () => {
      expect(workbook.worksheets.map((sheet) => sheet.name)).toEqual(SHEETS);
    });

    it('states every standard with the values of GET /api/audits/:id/results', () => {
      const sheet = sheetOf(workbook, 'Criteria');
      expect(results.standards).toHaveLength(6);
      results.standards.forEach((result, index) => {
        const row = index + 2;
        expect(asApiUnit(result, cellAt(sheet, row, 'Target').value)).toBeCloseTo(result.standard.target, 10);
        const observed = [asApiUnit(result, cellAt(sheet, row, 'Observed').value), asApiUnit(result, cellAt(sheet, row, '95% CI low').value), asApiUnit(result, cellAt(sheet, row, '95% CI high').value)];
        if (result.observed === null) expect(observed).toEqual([null, null, null]);
        else {
          expect(observed[0]).toBeCloseTo(result.observed.value, 10);
          expect(observed[1]).toBeCloseTo(result.observed.ci95[0], 10);
          expect(observed[2]).toBeCloseTo(result.observed.ci95[1], 10);
        }
        expect(cellAt(sheet, row, 'n (denominator)').value ?? null).toBe(result.observed?.n ?? null);
        expect(String(cellAt(sheet, row, 'Verdict').value)).toMatch({ met: /Met/, 'not-met': /Not met/, inconclusive: /Inconclusive/, 'no-data': /No data/ }[result.verdict]);
        expect(cellAt(sheet, row, 'Unit').value).toBe(result.unit);
      });
      // The fixture's standards cover every verdict (worked out in audit-results.api.spec.ts).
      expect(new Set(results.standards.map((result) => result.verdict))).toEqual(new Set(['met', 'not-met', 'inconclusive', 'no-data']));
    });

    it('gives the cohort size and the whole-cohort rebound of the API', () => {
      const front = sheetOf(workbook, 'Front page');
      const byLabel = new Map<string, CellValue>();
      front.eachRow((row) => byLabel.set(String(row.getCell(1).value), row.getCell(2).value));
      expect([byLabel.get('Cases'), byLabel.get('Patients'), byLabel.get('Sites with a recall'), byLabel.get('Site-visit rows')]).toEqual([5, 4, 7, 12]);
      expect(String(byLabel.get('Caution'))).toMatch(/^For clinical audit and quality improvement\. Not a diagnostic tool/);
      const margin = sheetOf(workbook, 'Margin outcomes');
      const sixMonths = results.summary.intervals.find((interval) => interval.intervalKey === '6m');
      let found = 0;
      margin.eachRow((row, number) => {
        if (number === 1 || row.getCell(1).value !== 'All cases' || row.getCell(3).value !== '6 months') return;
        found += 1;
        expect(cellAt(margin, number, 'Sites (n)').value).toBe(sixMonths?.nSites);
        expect(cellAt(margin, number, 'Rebound per site, mm: mean').value).toBeCloseTo(sixMonths?.rebound.site?.mean ?? NaN, 10);
        expect(cellAt(margin, number, 'Relapse: %').value).toBeCloseTo(sixMonths?.stability.relapse.p ?? NaN, 10);
      });
      expect(found).toBe(1);
    });

    it('holds no patient code of the database and no full date in any cell; real dates only where no patient is concerned', async () => {
      const codes = ((await w.t.dataSource.query('SELECT code FROM patient')) as { code: string }[]).map((row) => row.code);
      expect(codes).toEqual(expect.arrayContaining(Object.values(FIXTURE_CODES)));
      for (const sheet of workbook.worksheets) {
        eachCell(sheet, (value, row, column) => {
          for (const text of textsOf(value)) {
            expect(text, `${sheet.name}!R${row}C${column}`).not.toMatch(ISO_DAY);
            for (const code of codes) expect(text.toUpperCase(), `${sheet.name}!R${row}C${column}`).not.toContain(code);
          }
          if (value instanceof Date) expect(['Front page', 'Action plan'], `${sheet.name}!R${row}C${column}`).toContain(sheet.name);
        });
      }
    });

    it('de-identifies the site rows: local codes, operator letters, months, no ids', () => {
      const sheet = sheetOf(workbook, 'Site data');
      expect(sheet.rowCount).toBe(13);
      const headers = [...columnsOf(sheet).keys()];
      expect(headers.filter((header) => /\bid\b|note|date/i.test(header))).toEqual([]);
      const patients = new Set<string>();
      for (let row = 2; row <= 13; row += 1) {
        patients.add(String(cellAt(sheet, row, 'Patient (this file only)').value));
        expect(String(cellAt(sheet, row, 'Case (this file only)').value)).toMatch(/^C\d{4}$/);
        expect(['A', 'B']).toContain(cellAt(sheet, row, 'Operator').value);
        expect(String(cellAt(sheet, row, 'Surgery month').value)).toMatch(/^\d{4}-\d{2}$/);
        expect(String(cellAt(sheet, row, 'Recall month').value)).toMatch(/^\d{4}-\d{2}$/);
      }
      expect([...patients].sort()).toEqual(['P0001', 'P0002', 'P0003', 'P0004']);
      // The first row: P1's tooth 11, surgery January 2024, 6 weeks: baseline 8, post-op 10, recall 9.5 → rebound 0.5 mm.
      expect([cellAt(sheet, 2, 'Tooth (FDI)').value, cellAt(sheet, 2, 'Interval').value, cellAt(sheet, 2, 'Rebound, mm').value, cellAt(sheet, 2, 'Stability').value]).toEqual([11, '6 weeks', 0.5, 'Stable']);
    });

    it('uses real number formats on numeric columns', () => {
      const site = sheetOf(workbook, 'Site data');
      expect(cellAt(site, 2, 'REF→GM before, mm').numFmt).toBe('0.0');
      expect(cellAt(site, 2, 'Rebound, mm').numFmt).toBe('0.0');
      expect(cellAt(site, 2, 'Retained, %').numFmt).toBe('0.0%');
      expect(typeof cellAt(site, 2, 'Retained, %').value).toBe('number');
      expect(cellAt(site, 2, 'Tooth (FDI)').numFmt).toBe('0');
      const criteria = sheetOf(workbook, 'Criteria');
      const shareRow = results.standards.findIndex((result) => result.unit === '%') + 2;
      expect(cellAt(criteria, shareRow, 'Observed').numFmt).toBe('0.0%');
      const margin = sheetOf(workbook, 'Margin outcomes');
      expect(cellAt(margin, 2, 'Rebound per site, mm: mean').numFmt).toBe('0.00');
      expect(cellAt(margin, 2, 'Stable: %').numFmt).toBe('0.0%');
      const front = sheetOf(workbook, 'Front page');
      const producedOn: CellValue[] = [];
      front.eachRow((row) => {
        if (row.getCell(1).value === 'Produced on') producedOn.push(row.getCell(2).value);
      });
      expect(producedOn).toHaveLength(1);
      expect(producedOn[0]).toBeInstanceOf(Date);
    });

    it('freezes the header row and filters every data sheet', () => {
      for (const name of DATA_SHEETS) {
        const sheet = sheetOf(workbook, name);
        expect(sheet.views[0], name).toEqual(expect.objectContaining({ state: 'frozen', ySplit: 1 }));
        expect(sheet.autoFilter, name).toBeTruthy();
        expect(sheet.getColumn(1).width, name).toBeGreaterThan(5);
      }
    });

    it('puts three chart pictures on the Charts sheet (PNG media and a drawing in the zip)', async () => {
      const file = path.join(directory, 'live.xlsx');
      writeFileSync(file, bytes);
      const zip = await unzipper.Open.file(file);
      const names = zip.files.map((entry) => entry.path);
      expect(names.filter((name) => /^xl\/media\/image\d+\.png$/.test(name))).toHaveLength(3);
      expect(names).toEqual(expect.arrayContaining(['xl/drawings/drawing1.xml', 'xl/drawings/_rels/drawing1.xml.rels']));
      const pngs = await Promise.all(zip.files.filter((entry) => entry.path.startsWith('xl/media/')).map((entry) => entry.buffer()));
      for (const png of pngs) expect(png.subarray(0, 8)).toEqual(Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]));
      const types = (await zip.files.find((entry) => entry.path === '[Content_Types].xml')?.buffer())?.toString() ?? '';
      expect(types).toMatch(/<Default Extension="png" ContentType="image\/png"\/>/);
      expect(types).toMatch(/PartName="\/xl\/drawings\/drawing1\.xml"/);
      const charts = sheetOf(workbook, 'Charts');
      expect(charts.getImages()).toHaveLength(3);
    });
  });

  it('a reported cycle exports its frozen standards, equal to the results of that cycle', async () => {
    const partner = w.as('partner');
    const jobId = await exportAs(w, partner, audit.id, reported.id);
    const response = await download(partner, jobId);
    expect(String(response.headers['content-disposition'])).toMatch(/-cycle-1-/);
    const workbook = await openWorkbook(response.body as Buffer);
    const results = expectStatus(await partner.get(`/api/audits/${audit.id}/results?cycleId=${reported.id}`), 200).body as AuditResults;
    const sheet = sheetOf(workbook, 'Criteria');
    results.standards.forEach((result, index) => {
      const observed = asApiUnit(result, cellAt(sheet, index + 2, 'Observed').value);
      if (result.observed === null) expect(observed).toBeNull();
      else expect(observed).toBeCloseTo(result.observed.value, 10);
    });
    const front = sheetOf(workbook, 'Front page');
    const texts: string[] = [];
    eachCell(front, (value) => texts.push(...textsOf(value)));
    expect(texts.join(' ')).toMatch(/Audit cycle 1 — Reported; results frozen on/);
    const actions = sheetOf(workbook, 'Action plan');
    expect(String(cellAt(actions, 2, 'Action').value)).toBe('Re-measure [patient code removed] before the re-audit');
    expect(cellAt(actions, 2, 'Due').value).toEqual(new Date('2024-09-30T00:00:00Z'));
  });

  it('jobs and their files are gone an hour after they start', async () => {
    let now = 1_000_000;
    const file = path.join(directory, 'expiring.xlsx');
    writeFileSync(file, 'x');
    const jobs = new ExpiringJobs<{ file: string }>((job) => [job.file], JOB_LIFETIME_MS, () => now);
    jobs.add('a', { file });
    now += JOB_LIFETIME_MS - 1;
    expect(jobs.get('a')).toEqual({ file });
    now += 1;
    await jobs.sweep();
    expect(jobs.get('a')).toBeUndefined();
    expect(existsSync(file)).toBe(false);
    expect(JOB_LIFETIME_MS).toBe(60 * 60 * 1000);
  });
});
