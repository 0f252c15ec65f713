import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import archiver from 'archiver';
import ExcelJS from 'exceljs';
import unzipper from 'unzipper';
import { IMPORT_COLUMNS, type ImportColumn, type ImportJobView } from '@tidemark/shared';
import { clinicalFingerprint, createClinicalWorld, expectStatus, type ClinicalWorld } from '../support/clinical-fixtures';
import { importRow } from '../support/import-fixtures';
import { queryRows } from '../support/test-database';

/*
 * XML external entities in an uploaded workbook (OWASP ASVS 5.0 1.5.1; OWASP XXE Prevention Cheat
 * Sheet). An .xlsx is a zip of XML parts (ECMA-376 Part 2); the import reads them with exceljs'
 * streaming reader (saxes). Here a real workbook is written by exceljs, then one part gets a
 * DOCTYPE declaring entities that point at a local file and at a local HTTP server, and a cell's
 * text becomes a reference to them. The file holds a valid patient code, so a resolved entity would
 * import a patient with it; the server counts every request, so a fetched DTD or entity shows.
 */

/** The secret "file on the server": a valid pseudonymous code, so resolving it would store a patient. */
const SECRET_CODE = 'XE-9999';
const PLACEHOLDER = 'XX-PLACEHOLDER';

/** A workbook as exceljs writes it: the header and one row whose patient code is `code`. */
async function workbookWith(code: string): Promise<Buffer> {
  const workbook = new ExcelJS.Workbook();
  const sheet = workbook.addWorksheet('Site visits');
  sheet.addRow([...IMPORT_COLUMNS]);
  // One valid row without a recall: a patient, a case by the demo clinician and one site.
  const row = importRow({ patient_code: code, interval_key: null, visit_date: null, recall_ref_gm: null, recall_papilla: null, bleeding_on_probing: null, pain: null });
  sheet.addRow(IMPORT_COLUMNS.map((column) => row[column]));
  return Buffer.from(await workbook.xlsx.writeBuffer());
}

/** Rewrites one part of a zip (entry order kept, so content sniffing still sees a workbook). */
async function withPart(zip: Buffer, name: string, rewrite: (xml: string) => string): Promise<Buffer> {
  const directory = await unzipper.Open.buffer(zip);
  const archive = archiver('zip', { zlib: { level: 6 } });
  const chunks: Buffer[] = [];
  archive.on('data', (chunk: Buffer) => chunks.push(chunk));
  const ended = new Promise<void>((resolve, reject) => {
    archive.on('end', () => resolve());
    archive.on('error', reject);
  });
  let isFound = false;
  for (const entry of directory.files) {
    if (entry.type !== 'File') continue;
    let bytes = await entry.buffer();
    if (entry.path === name) {
      isFound = true;
      bytes = Buffer.from(rewrite(bytes.toString('utf8')), 'utf8');
    }
    archive.append(bytes, { name: entry.path });
  }
  if (!isFound) throw new Error(`The workbook has no part ${name}`);
  await archive.finalize();
  await ended;
  return Buffer.concat(chunks);
}

/** A DOCTYPE for `root` with a file entity, a network entity and an external parameter entity (the classic out-of-band form). */
function doctype(root: string, secretFile: string, serverUrl: string): string {
  return `<!DOCTYPE ${root} [<!ENTITY xxe SYSTEM "${pathToFileURL(secretFile).href}"><!ENTITY net SYSTEM "${serverUrl}/entity"><!ENTITY % remote SYSTEM "${serverUrl}/dtd">%remote;]>`;
}

/** Puts the DOCTYPE after the XML declaration (or first, if there is none). */
function withDoctype(xml: string, declaration: string): string {
  const end = xml.startsWith('<?xml') ? xml.indexOf('?>') + 2 : 0;
  return `${xml.slice(0, end)}${declaration}${xml.slice(end)}`;
}

describe('xlsx import: XML external entities are never resolved (ASVS 5.0 1.5.1)', () => {
  let w: ClinicalWorld;
  let directory: string;
  let secretFile: string;
  let server: Server;
  let serverUrl: string;
  const fetched: string[] = [];

  beforeAll(async () => {
    w = await createClinicalWorld();
    directory = mkdtempSync(path.join(tmpdir(), 'tidemark-xxe-'));
    secretFile = path.join(directory, 'secret.txt');
    writeFileSync(secretFile, SECRET_CODE);
    server = createServer((req, res) => {
      fetched.push(req.url ?? '');
      res.end(req.url === '/dtd' ? `<!ENTITY leak "${SECRET_CODE}">` : SECRET_CODE);
    });
    await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
    serverUrl = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  });
  afterAll(async () => {
    await w.t.imports.idle();
    await w.close();
    await new Promise<void>((resolve) => server.close(() => resolve()));
    rmSync(directory, { recursive: true, force: true });
  });

  /** Uploads, waits for the job and returns its final view. */
  async function importBytes(bytes: Buffer): Promise<ImportJobView> {
    const lead = w.as('audit_lead');
    const started = expectStatus(await lead.upload('/api/imports', {}, { bytes, filename: 'history.xlsx', contentType: 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet' }), 202);
    await w.t.imports.idle();
    return expectStatus(await lead.get(`/api/imports/${started.body.jobId as string}`), 200).body as ImportJobView;
  }

  it('imports the untouched workbook (so a resolved entity would import the secret code)', async () => {
    const view = await importBytes(await workbookWith('XE-0001'));
    expect(view).toMatchObject({ state: 'done', counts: { patients: 1, cases: 1, sites: 1, visits: 0 }, errorCount: 0 });
  });

  // The patient code cell A2 as exceljs writes it: a shared string, or (rewritten) an inline string in the sheet.
  for (const part of [
    { name: 'xl/sharedStrings.xml', root: 'sst', cell: new RegExp(`<t>${PLACEHOLDER}</t>`), reference: '<t>&xxe;&net;&leak;</t>' },
    { name: 'xl/worksheets/sheet1.xml', root: 'worksheet', cell: /<c r="A2" t="s"><v>\d+<\/v><\/c>/, reference: '<c r="A2" t="inlineStr"><is><t>&xxe;&net;&leak;</t></is></c>' },
  ]) {
    it(`${part.name}: a DOCTYPE with file, network and parameter entities is refused or read without them; nothing fetched or stored`, async () => {
      const original = await workbookWith(PLACEHOLDER);
      let isRewritten = false;
      const bytes = await withPart(original, part.name, (xml) => {
        isRewritten = part.cell.test(xml);
        return withDoctype(xml.replace(part.cell, part.reference), doctype(part.root, secretFile, serverUrl));
      });
      expect(isRewritten, `${part.name} should hold the patient code cell`).toBe(true);
      const before = await clinicalFingerprint(w.t);
      const view = await importBytes(bytes);
      expect(fetched).toEqual([]);
      expect(JSON.stringify(view)).not.toContain(SECRET_CODE);
      expect(await clinicalFingerprint(w.t)).toEqual(before);
      expect(await queryRows(w.t.dataSource, 'SELECT id FROM patient WHERE code = :code', { code: SECRET_CODE })).toEqual([]);
      // Refused as a damaged workbook, or read with the reference left unresolved: either way an error, not an import.
      expect(view.counts.patients).toBe(0);
      expect(view.errorCount).toBeGreaterThan(0);
    });
  }
});
