import { fileTypeFromBuffer } from 'file-type';
import type { ImportColumn, ImportIssue } from '@tidemark/shared';
import { IMPORT_COLUMNS, OPTIONAL_IMPORT_COLUMNS } from '@tidemark/shared';
import { HttpError } from '../http-error';
import { CsvFormatError, parseCsv } from './csv-records';
import { checkUnpackedSize } from './workbook-size-guard';
import { readSheetRecords, type PlainCell, type SheetRecord } from './sheet-records';

/** The two formats the import reads. */
export type ImportFileKind = 'xlsx' | 'csv';

/** A data row of the file: its number and its cells in the file's column order. */
export interface TableRow {
  row: number;
  cells: readonly (PlainCell | string)[];
}

/** The file's rows, or the problems that stop them being read (header, format). */
export interface ImportTable {
  rows: TableRow[];
  /** Where each of our columns is in the file (a column left out is absent). */
  positions: ReadonlyMap<ImportColumn, number>;
  issues: ImportIssue[];
}

const XLSX_MIME = 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet';
const KNOWN_COLUMNS: ReadonlySet<string> = new Set(IMPORT_COLUMNS);

/**
 * Decides the format by content, never by name or declared type (magic bytes via file-type):
 * an Office Open XML workbook is xlsx; text that is valid UTF-8 without NUL bytes is CSV;
 * anything else (PDF, images, other archives) is refused.
 *
 * @throws {HttpError} 415 for any other content
 */
export async function importFileKind(bytes: Buffer): Promise<ImportFileKind> {
  const detected = await fileTypeFromBuffer(bytes);
  if (detected?.mime === XLSX_MIME) return 'xlsx';
  if (detected === undefined && isUtf8Text(bytes)) return 'csv';
  throw new HttpError(415, 'unsupported_media_type', 'Upload an Excel workbook (.xlsx) or a CSV file saved as UTF-8 (checked by content, not by name).');
}

function isUtf8Text(bytes: Buffer): boolean {
  if (bytes.includes(0)) return false;
  try {
    new TextDecoder('utf-8', { fatal: true }).decode(bytes);
    return true;
  } catch {
    // A decoding error is the answer: the bytes are not UTF-8 text.
    return false;
  }
}

function isBlank(cells: readonly (PlainCell | string)[]): boolean {
  return cells.every((cell) => cell === null || (typeof cell === 'string' && cell.trim() === ''));
}

/** The template's rows of a workbook, or 'unreadable' when its zip or XML is damaged (the reader then throws). */
async function readWorkbook(bytes: Buffer): Promise<SheetRecord[] | null | 'unreadable'> {
  try {
    return await readSheetRecords(bytes, IMPORT_COLUMNS[0]);
  } catch {
    // A cut-off or corrupt .xlsx (unzipper: FILE_ENDED, invalid signature …) is the file's fault, not ours.
    return 'unreadable';
  }
}

/**
 * Reads the file's rows and finds our columns in its header. The header (row 1) must name every
 * required column once and nothing else; blank rows are skipped (their numbers still count).
 */
export async function readImportTable(kind: ImportFileKind, bytes: Buffer): Promise<ImportTable> {
  let records: { row: number; cells: (PlainCell | string)[] }[];
  if (kind === 'csv') {
    try {
      records = parseCsv(bytes.toString('utf8'));
    } catch (error) {
      if (error instanceof CsvFormatError) return { rows: [], positions: new Map(), issues: [{ row: error.row, column: '', message: error.message }] };
      throw error;
    }
  } else {
    const unpacked = await checkUnpackedSize(bytes);
    if (!unpacked.ok && unpacked.reason !== 'damaged') {
      return { rows: [], positions: new Map(), issues: [{ row: 0, column: '', message: 'The workbook unpacks to far more than a Tidemark import can hold (over 100 MB or 200 parts). Save only the template sheet, or split the rows into several files.' }] };
    }
    const sheet = await readWorkbook(bytes);
    if (sheet === 'unreadable') return { rows: [], positions: new Map(), issues: [{ row: 0, column: '', message: 'The workbook could not be read: it is damaged or incomplete. Save it again from Excel and upload it anew.' }] };
    if (sheet === null) return { rows: [], positions: new Map(), issues: [{ row: 1, column: '', message: `No worksheet has a header row starting with ${IMPORT_COLUMNS[0]} (use the template).` }] };
    records = sheet;
  }
  const [header, ...data] = records;
  if (!header || header.row !== 1) return { rows: [], positions: new Map(), issues: [{ row: 1, column: '', message: 'Row 1 must hold the column names of the template.' }] };
  const issues: ImportIssue[] = [];
  const positions = new Map<ImportColumn, number>();
  header.cells.forEach((cell, index) => {
    const name = typeof cell === 'string' ? cell.trim().toLowerCase() : cell === null ? '' : String(cell);
    if (name === '') return;
    if (!KNOWN_COLUMNS.has(name)) {
      issues.push({ row: 1, column: name, message: 'Unknown column: use the column names of the template.' });
      return;
    }
    const column = IMPORT_COLUMNS.find((candidate) => candidate === name);
    if (column === undefined) return;
    if (positions.has(column)) issues.push({ row: 1, column, message: 'This column appears twice.' });
    else positions.set(column, index);
  });
  for (const column of IMPORT_COLUMNS) {
    if (!positions.has(column) && !OPTIONAL_IMPORT_COLUMNS.has(column)) issues.push({ row: 1, column, message: 'This column is missing.' });
  }
  if (issues.length) return { rows: [], positions, issues };
  const rows: TableRow[] = data.filter((record) => !isBlank(record.cells));
  if (rows.length === 0) return { rows, positions, issues: [{ row: 2, column: '', message: 'The file has no rows under the header.' }] };
  return { rows, positions, issues };
}
