import { spawn } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import Database from 'better-sqlite3';
import ExcelJS from 'exceljs';
import type { Response } from 'supertest';
import type { CaseDetail, CaseListPage, ImportColumn, ImportIssue, ImportJobView } from '@tidemark/shared';
import { IMPORT_COLUMNS, IMPORT_MAX_BYTES } from '@tidemark/shared';
import { sqliteConnection } from '../../server/import/sqlite-connection';
import { CLINICAL_TABLES, clinicalFingerprint, createClinicalWorld, daysAgo, expectStatus, type ClinicalWorld } from './support/clinical-fixtures';
import { importRow, type ImportCells } from './support/import-fixtures';
import { demoEmail, type ApiClient } from './support/test-app';

/*
 * Historical import through the API. Files are built here, row by row, in the template's long
 * format (one row per site per visit). Expected counts are worked out from the rows by hand.
 */

function csvCell(value: string | number | Date | null): string {
  if (value === null) return '';
  const text = value instanceof Date ? value.toISOString().slice(0, 10) : String(value);
  return /[",\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

/** A CSV file: header row then the rows (file row numbers = index + 2). */
function csvOf(rows: readonly ImportCells[]): Buffer {
  return Buffer.from([IMPORT_COLUMNS.join(','), ...rows.map((row) => IMPORT_COLUMNS.map((column) => csvCell(row[column])).join(','))].join('\r\n') + '\r\n', 'utf8');
}

/** An .xlsx file as a spreadsheet program writes it: numbers as numbers, dates as real dates. */
async function xlsxOf(rows: readonly ImportCells[]): Promise<Buffer> {
  const workbook = new ExcelJS.Workbook();
  const sheet = workbook.addWorksheet('Site visits');
  sheet.addRow([...IMPORT_COLUMNS]);
  for (const row of rows) {
    sheet.addRow(IMPORT_COLUMNS.map((column) => {
      const value = row[column];
      return typeof value === 'string' && /^\d{4}-\d{2}-\d{2}$/.test(value) ? new Date(`${value}T00:00:00Z`) : value;
    }));
  }
  return Buffer.from(await workbook.xlsx.writeBuffer());
}

/** Where the killed import writes, how to count its rows and how to check the database afterwards. */
interface CrashTarget {
  openOptions: { database: string; url?: string };
  counts(): Promise<Record<string, number>>;
  expectIntact(): Promise<void>;
}

/** Foreign keys among the tables the import writes: child table, column, parent table. */
const IMPORT_FOREIGN_KEYS: readonly [string, string, string][] = [
  ['surgical_case', 'patient_id', 'patient'],
  ['site', 'case_id', 'surgical_case'],
  ['visit', 'case_id', 'surgical_case'],
  ['site_measurement', 'visit_id', 'visit'],
  ['site_measurement', 'site_id', 'site'],
];

/**
 * SQLite: a copy of the test database taken with the online backup (never a file copy), checked
 * with integrity_check and foreign_key_check. PostgreSQL: the test's own database (the server
 * rolls back a dead connection's transaction), checked for orphan rows and for the import's
 * table lock being released, which proves the rollback happened.
 */
async function crashTarget(w: ClinicalWorld, directory: string): Promise<CrashTarget> {
  const options = w.t.dataSource.options;
  if (options.type === 'postgres' && options.url) {
    const countOf = async (sql: string): Promise<number> => Number(((await w.t.dataSource.query(sql)) as { n: number | string }[])[0].n);
    return {
      openOptions: { database: '', url: options.url },
      counts: async () => Object.fromEntries(await Promise.all(CLINICAL_TABLES.map(async (table) => [table, await countOf(`SELECT COUNT(*) AS n FROM ${table}`)] as const))),
      async expectIntact() {
        for (const [child, column, parent] of IMPORT_FOREIGN_KEYS) {
          expect(await countOf(`SELECT COUNT(*) AS n FROM ${child} x LEFT JOIN ${parent} p ON p.id = x.${column} WHERE p.id IS NULL`), `${child}.${column}`).toBe(0);
        }
        const importLocks = "SELECT COUNT(*) AS n FROM pg_locks l JOIN pg_class c ON c.oid = l.relation WHERE l.database = (SELECT oid FROM pg_database WHERE datname = current_database()) AND c.relname = 'patient' AND l.mode = 'ShareRowExclusiveLock'";
        await expect.poll(() => countOf(importLocks), { timeout: 10_000 }).toBe(0);
      },
    };
  }
  const copy = path.join(directory, 'copy.sqlite');
  await sqliteConnection(w.t.dataSource).backup(copy);
  return {
    openOptions: { database: copy },
    async counts() {
      const db = new Database(copy, { readonly: true });
      try {
        return Object.fromEntries(CLINICAL_TABLES.map((table) => [table, Number(db.prepare<[], { n: number }>(`SELECT COUNT(*) AS n FROM ${table}`).get()?.n)]));
      } finally {
        db.close();
      }
    },
    async expectIntact() {
      const reopened = new Database(copy);
      try {
        expect(reopened.pragma('integrity_check', { simple: true })).toBe('ok');
        expect(reopened.pragma('foreign_key_check')).toEqual([]);
      } finally {
        reopened.close();
      }
    },
  };
}

/** Uploads a file and waits for its job to finish; returns the final job view. */
async function importFile(w: ClinicalWorld, bytes: Buffer, filename: string, contentType = 'text/csv'): Promise<{ jobId: string; view: ImportJobView }> {
  const lead = w.as('audit_lead');
  const started = expectStatus(await lead.upload('/api/imports', {}, { bytes, filename, contentType }), 202);
  const jobId: string = started.body.jobId;
  await w.t.imports.idle();
  const view = expectStatus(await lead.get(`/api/imports/${jobId}`), 200).body as ImportJobView;
  return { jobId, view };
}

/** The issues of one row. */
const issuesAt = (errors: readonly ImportIssue[], row: number) => errors.filter((issue) => issue.row === row);

/** Two patients, three cases: IM-0001 with two cases (one with 2 sites × 2 visits, one site without a visit), IM-0002 a current smoker with one case. */
function validRows(): ImportCells[] {
  return [
    importRow({ tooth: 11, interval_key: '6w', visit_date: '2024-02-21', recall_ref_gm: 9.5 }),
    importRow({ tooth: 21, interval_key: '6w', visit_date: '2024-02-21', recall_ref_gm: 10.5, post_op_ref_gm: 11, baseline_ref_gm: 8.5 }),
    importRow({ tooth: 11, interval_key: '6m', visit_date: '2024-07-10', recall_ref_gm: 9, pain: 0 }),
    importRow({ tooth: 21, interval_key: '6m', visit_date: '2024-07-10', recall_ref_gm: 10, post_op_ref_gm: 11, baseline_ref_gm: 8.5, pain: 0 }),
    importRow({ surgery_date: '2024-05-02', operator_email: demoEmail('audit_lead'), procedure: 'apically-positioned-flap', tooth: 36, interval_key: null, visit_date: null, recall_ref_gm: null, bleeding_on_probing: null, pain: null }),
    importRow({ patient_code: 'IM-0002', birth_year: 1969, sex: 'male', smoking: 'current', cigarettes_per_day: 10, phenotype: 'thick', surgery_date: '2024-03-05', tooth: 14, site_location: 'distal-papilla', baseline_papilla: 2, interval_key: '3m', visit_date: '2024-06-04', recall_ref_gm: 7.5, baseline_ref_gm: 6, post_op_ref_gm: 8, recall_papilla: 3, bleeding_on_probing: 'yes' }),
  ];
}

describe('historical import', () => {
  let w: ClinicalWorld;

  beforeAll(async () => {
    w = await createClinicalWorld();
  });
  afterAll(async () => {
    await w.close();
  });

  describe('access (audit lead only)', () => {
    const routes: { name: string; call: (client: ApiClient) => Promise<Response> }[] = [
      { name: 'GET /api/imports/template.xlsx', call: (client) => client.get('/api/imports/template.xlsx') },
      { name: 'GET /api/imports/template.csv', call: (client) => client.get('/api/imports/template.csv') },
      { name: 'POST /api/imports', call: (client) => client.upload('/api/imports', {}, { bytes: csvOf([importRow({ patient_code: 'AC-0001' })]), filename: 'rows.csv', contentType: 'text/csv' }) },
      { name: 'GET /api/imports/:jobId', call: (client) => client.get('/api/imports/00000000-0000-4000-8000-000000000000') },
      { name: 'GET /api/imports/:jobId/errors.csv', call: (client) => client.get('/api/imports/00000000-0000-4000-8000-000000000000/errors.csv') },
    ];
    for (const route of routes) {
      for (const actor of ['anonymous', 'admin', 'clinician', 'partner', 'governance'] as const) {
        const status = actor === 'anonymous' ? 401 : 403;
        it(`${route.name}: ${actor} → ${status}, nothing written`, async () => {
          const before = await clinicalFingerprint(w.t);
          const response = await route.call(w.as(actor));
          expect(response.status, JSON.stringify(response.body)).toBe(status);
          expect(response.body.error.code).toBe(status === 401 ? 'unauthenticated' : 'forbidden');
          expect(await clinicalFingerprint(w.t)).toEqual(before);
        });
      }
    }

    it('an unknown job is 404 for the audit lead; a malformed job id is 400', async () => {
      expect((await w.as('audit_lead').get('/api/imports/00000000-0000-4000-8000-000000000000')).status).toBe(404);
      expect((await w.as('audit_lead').get('/api/imports/not-a-job')).status).toBe(400);
    });
  });

  describe('templates', () => {
    it('template.csv is the header row of our column names', async () => {
      const response = expectStatus(await w.as('audit_lead').get('/api/imports/template.csv'), 200);
      expect(response.headers['content-disposition']).toMatch(/^attachment; filename="?tidemark-import-template\.csv"?$/);
      expect(response.text.trim()).toBe(IMPORT_COLUMNS.join(','));
    });

    it('template.xlsx has the data sheet with the same header and a column guide', async () => {
      const response = await w.as('audit_lead').getBytes('/api/imports/template.xlsx');
      expect(response.status).toBe(200);
      const workbook = new ExcelJS.Workbook();
      await workbook.xlsx.load(response.body);
      expect(workbook.worksheets.map((sheet) => sheet.name)).toEqual(['Site visits', 'Column guide']);
      const header = workbook.getWorksheet('Site visits')?.getRow(1).values;
      expect(Array.isArray(header) ? header.slice(1) : []).toEqual([...IMPORT_COLUMNS]);
    });
  });

  describe('a valid file', () => {
    it('CSV: imports 2 patients, 3 cases, 4 sites, 3 visits; the cases are listed with their status', async () => {
      const before = await clinicalFingerprint(w.t);
      const { view } = await importFile(w, csvOf(validRows()), 'history.csv');
      expect(view).toEqual({ state: 'done', progress: 1, counts: { patients: 2, cases: 3, sites: 4, visits: 3 }, errors: [], errorCount: 0 });
      const after = await clinicalFingerprint(w.t);
      // Measurements: IM-0001 case 1: 2 sites × 2 visits; IM-0002: 1.
      expect([after.patient - before.patient, after.surgical_case - before.surgical_case, after.site - before.site, after.visit - before.visit, after.site_measurement - before.site_measurement]).toEqual([2, 3, 4, 3, 5]);

      const list = expectStatus(await w.as('audit_lead').get('/api/cases?patientCode=IM-000&pageSize=50&sort=surgeryDate&direction=asc'), 200).body as CaseListPage;
      expect(list.items.map((item) => [item.patientCode, item.surgeryDate, item.status, item.teeth, item.visitCount])).toEqual([
        ['IM-0001', '2024-01-10', 'in-recall', [11, 21], 2],
        ['IM-0002', '2024-03-05', 'in-recall', [14], 1],
        ['IM-0001', '2024-05-02', 'operated', [36], 0],
      ]);
      const first = expectStatus(await w.as('audit_lead').get(`/api/cases/${list.items[0].id}`), 200).body as CaseDetail;
      expect(first.operator.displayName).toBe('Dr Cal Clinician (demo)');
      expect(first.sites.map((site) => [site.tooth, site.baselineRefGm, site.postOpRefGm])).toEqual([[11, 8, 10], [21, 8.5, 11]]);
      const sixMonths = first.visits.find((visit) => visit.intervalKey === '6m');
      expect(sixMonths?.visitDate).toBe('2024-07-10');
      expect(sixMonths?.measurements.map((measurement) => measurement.refGm).sort()).toEqual([10, 9]);
    });

    it('XLSX with real dates and numbers: imports the same shape for other patients', async () => {
      const rows = validRows().map((row) => ({ ...row, patient_code: row.patient_code === 'IM-0001' ? 'XL-0001' : 'XL-0002' }));
      const { view } = await importFile(w, await xlsxOf(rows), 'history.xlsx', 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet');
      expect(view.state).toBe('done');
      expect(view.counts).toEqual({ patients: 2, cases: 3, sites: 4, visits: 3 });
      const list = expectStatus(await w.as('audit_lead').get('/api/cases?patientCode=XL-000&pageSize=50'), 200).body as CaseListPage;
      expect(list.total).toBe(3);
    });
  });

  describe('a file with errors', () => {
    it('writes nothing and reports every bad row with its column: tooth 19, 20.5 mm, a future date, duplicates, inconsistencies', async () => {
      const before = await clinicalFingerprint(w.t);
      const rows = [
        importRow({ patient_code: 'ER-0001' }), // row 2: valid
        importRow({ patient_code: 'ER-0001', tooth: 19 }), // row 3: not an FDI tooth
        importRow({ patient_code: 'ER-0001', tooth: 12, baseline_ref_gm: 20.5 }), // row 4: over 20 mm
        importRow({ patient_code: 'ER-0002', surgery_date: daysAgo(-10), visit_date: null, interval_key: null, recall_ref_gm: null, bleeding_on_probing: null, pain: null }), // row 5: future surgery
        importRow({ patient_code: 'ER-0001' }), // row 6: twice in the file for the same interval (row 2)
        importRow({ patient_code: 'IM-0001', tooth: 11, interval_key: '12m', visit_date: '2025-01-10', recall_ref_gm: 9 }), // row 7: tooth 11 of IM-0001 on 2024-01-10 is in the database
        importRow({ patient_code: 'ER-0001', tooth: 22, birth_year: 1976 }), // row 8: patient fields differ from row 2
        importRow({ patient_code: 'ER-0003', operator_email: 'nobody@example.org' }), // row 9: not an operator
        importRow({ patient_code: 'ER-0003', tooth: 13, interval_key: '9m' }), // row 10: not a schedule interval
        importRow({ patient_code: 'ER-0004', smoking: 'current' }), // row 11: cigarettes a day missing
      ];
      const { jobId, view } = await importFile(w, csvOf(rows), 'broken.csv');
      expect(view.state).toBe('rejected');
      expect(await clinicalFingerprint(w.t)).toEqual(before);
      const errors = view.errors;
      expect(view.errorCount).toBe(errors.length);
      expect(issuesAt(errors, 2)).toEqual([]);
      expect(issuesAt(errors, 3)).toEqual([{ row: 3, column: 'tooth', message: expect.stringMatching(/FDI/) }]);
      expect(issuesAt(errors, 4)).toEqual([{ row: 4, column: 'baseline_ref_gm', message: 'Must be 20 mm or less.' }]);
      expect(issuesAt(errors, 5)).toEqual([{ row: 5, column: 'surgery_date', message: 'Cannot be in the future.' }]);
      expect(issuesAt(errors, 6)).toEqual([{ row: 6, column: 'interval_key', message: expect.stringMatching(/Row 2 already has this site at this interval/) }]);
      expect(issuesAt(errors, 7)).toEqual([{ row: 7, column: 'tooth', message: expect.stringMatching(/Already recorded/) }]);
      expect(issuesAt(errors, 8)).toEqual([{ row: 8, column: 'birth_year', message: expect.stringMatching(/Differs from row 2/) }]);
      expect(issuesAt(errors, 9)).toEqual([{ row: 9, column: 'operator_email', message: expect.stringMatching(/No active clinician or audit lead/) }]);
      expect(issuesAt(errors, 10)).toEqual([{ row: 10, column: 'interval_key', message: expect.stringMatching(/Unknown interval/) }]);
      expect(issuesAt(errors, 11)).toEqual([{ row: 11, column: 'cigarettes_per_day', message: 'Give cigarettes a day for a current smoker, and only then.' }]);
      expect(new Set(errors.map((issue) => issue.row))).toEqual(new Set([3, 4, 5, 6, 7, 8, 9, 10, 11]));

      const csv = expectStatus(await w.as('audit_lead').get(`/api/imports/${jobId}/errors.csv`), 200);
      expect(csv.headers['content-type']).toMatch(/text\/csv/);
      const lines = csv.text.trim().split('\r\n');
      expect(lines[0]).toBe('row,column,message');
      expect(lines.slice(1).map((line) => line.split(',').slice(0, 2).join(','))).toEqual(errors.map((issue) => `${issue.row},${issue.column}`));
    });

    it('a case already in the database on that date with other teeth is refused too (whole cases only)', async () => {
      const before = await clinicalFingerprint(w.t);
      const { view } = await importFile(w, csvOf([importRow({ patient_code: 'IM-0001', tooth: 13 })]), 'more.csv');
      expect(view.state).toBe('rejected');
      expect(view.errors).toEqual([{ row: 2, column: 'surgery_date', message: expect.stringMatching(/already has a case on this surgery date/) }]);
      expect(await clinicalFingerprint(w.t)).toEqual(before);
    });

    it('a header without a required column is refused at row 1', async () => {
      const text = csvOf([importRow({ patient_code: 'HD-0001' })]).toString('utf8').replace('tooth,', 'tooth_number,');
      const { view } = await importFile(w, Buffer.from(text, 'utf8'), 'header.csv');
      expect(view.state).toBe('rejected');
      expect(view.errors).toEqual(
        expect.arrayContaining([
          { row: 1, column: 'tooth_number', message: expect.stringMatching(/Unknown column/) },
          { row: 1, column: 'tooth', message: 'This column is missing.' },
        ]),
      );
    });
  });

  describe('refused uploads', () => {
    it('a file over 10 MB: 413, nothing written', async () => {
      const before = await clinicalFingerprint(w.t);
      const big = Buffer.alloc(IMPORT_MAX_BYTES + 1, 'a');
      const response = await w.as('audit_lead').upload('/api/imports', {}, { bytes: big, filename: 'big.csv', contentType: 'text/csv' });
      expect(response.status).toBe(413);
      expect(response.body.error.code).toBe('payload_too_large');
      expect(await clinicalFingerprint(w.t)).toEqual(before);
    });

    it('a PDF named .csv: 415 (checked by content)', async () => {
      const pdf = Buffer.from('%PDF-1.4\n1 0 obj\n<< /Type /Catalog >>\nendobj\ntrailer\n<< /Root 1 0 R >>\n%%EOF\n', 'latin1');
      const response = await w.as('audit_lead').upload('/api/imports', {}, { bytes: pdf, filename: 'rows.csv', contentType: 'text/csv' });
      expect(response.status).toBe(415);
      expect(response.body.error.code).toBe('unsupported_media_type');
    });

    it('no file: 400 naming the file field', async () => {
      const response = await w.as('audit_lead').upload('/api/imports', {});
      expect(response.status).toBe(400);
      expect(Object.keys(response.body.error.fields ?? {})).toEqual(['file']);
    });
  });

  describe('a crash mid-import', () => {
    let directory: string;
    beforeAll(() => {
      directory = mkdtempSync(path.join(tmpdir(), 'tidemark-import-kill-'));
    });
    afterAll(() => {
      rmSync(directory, { recursive: true, force: true });
    });

    it('SIGKILL while the transaction writes leaves the database as before and intact', { timeout: 180_000 }, async () => {
      const target = await crashTarget(w, directory);
      const before = await target.counts();

      // 2,500 cases × 3 sites × 5 intervals = 37,500 rows: long enough to be killed while writing.
      const rows: string[] = [IMPORT_COLUMNS.join(',')];
      const intervals: [string, number][] = [['2w', 14], ['6w', 42], ['3m', 91], ['6m', 182], ['12m', 365]];
      for (let index = 0; index < 2500; index += 1) {
        const surgery = new Date(Date.UTC(2021, 0, 1) + (index % 700) * 86_400_000);
        for (const tooth of [11, 12, 21]) {
          for (const [key, days] of intervals) {
            const row = importRow({
              patient_code: `KL-${String(index).padStart(5, '0')}`,
              surgery_date: surgery.toISOString().slice(0, 10),
              tooth,
              interval_key: key,
              visit_date: new Date(surgery.getTime() + days * 86_400_000).toISOString().slice(0, 10),
            });
            rows.push(IMPORT_COLUMNS.map((column) => csvCell(row[column])).join(','));
          }
        }
      }
      const file = path.join(directory, 'large.csv');
      writeFileSync(file, rows.join('\n'));

      const root = fileURLToPath(new URL('../../', import.meta.url));
      const module = (relative: string) => pathToFileURL(path.join(root, relative)).href;
      const lead = (await w.as('audit_lead').get('/api/auth/me')).body.user;
      // The child opens the copy and runs the import service; it reports each 1,000 rows written
      // inside the transaction (stdout to a pipe is synchronous on Linux, so the line leaves at once).
      const child = spawn(
        process.execPath,
        [
          '--import',
          'tsx',
          '--input-type=module',
          '--eval',
          `
          import { readFileSync } from 'node:fs';
          const { openDatabase } = await import(${JSON.stringify(module('server/data-source.ts'))});
          const { ImportService } = await import(${JSON.stringify(module('server/import/import.service.ts'))});
          const { ScheduleService } = await import(${JSON.stringify(module('server/services/schedule.service.ts'))});
          const dataSource = await openDatabase(${JSON.stringify(target.openOptions)});
          const service = new ImportService(dataSource, new ScheduleService(dataSource));
          const outcome = await service.importFile(${JSON.stringify(lead)}, readFileSync(${JSON.stringify(file)}), (state, progress) => {
            if (state === 'importing' && progress > 0.7) process.stdout.write('writing ' + progress + '\\n');
          });
          process.stdout.write('finished ' + outcome.state + '\\n');
          `,
        ],
        { cwd: root, stdio: ['ignore', 'pipe', 'pipe'] },
      );
      let stdout = '';
      let stderr = '';
      child.stderr.on('data', (chunk: Buffer) => (stderr += chunk.toString()));
      const exited = new Promise<{ code: number | null; signal: NodeJS.Signals | null }>((resolve) => child.on('exit', (code, signal) => resolve({ code, signal })));
      child.stdout.on('data', (chunk: Buffer) => {
        stdout += chunk.toString();
        if (stdout.includes('writing ') && !child.killed) child.kill('SIGKILL');
      });
      const exit = await exited;
      expect(stdout, stderr).toMatch(/writing 0\.\d+/);
      expect(stdout).not.toMatch(/finished/);
      expect(exit.signal).toBe('SIGKILL');

      expect(await target.counts()).toEqual(before);
      await target.expectIntact();
    });
  });
});
