import ExcelJS from 'exceljs';
import type { ImportColumn } from '@tidemark/shared';
import {
  DIABETES_STATUSES,
  IMPORT_COLUMN_GUIDE,
  IMPORT_COLUMNS,
  INDICATIONS,
  INSTRUMENTS,
  OPTIONAL_IMPORT_COLUMNS,
  PHENOTYPE_METHODS,
  PHENOTYPES,
  PROCEDURES,
  REFERENCE_POINTS,
  SEXES,
  SITE_LOCATIONS,
  SMOKING_STATUSES,
} from '@tidemark/shared';
import { csvLine } from './csv-line';

/** The data sheet of the template (the import reads the first sheet whose row 1 starts with patient_code). */
export const TEMPLATE_SHEET_NAME = 'Site visits';

/** Pick lists offered in the spreadsheet for the controlled columns. */
const PICK_LISTS: Partial<Record<ImportColumn, readonly string[]>> = {
  sex: SEXES,
  smoking: SMOKING_STATUSES,
  diabetes: DIABETES_STATUSES,
  phenotype: PHENOTYPES,
  phenotype_method: PHENOTYPE_METHODS,
  procedure: PROCEDURES,
  indication: INDICATIONS,
  instrument: INSTRUMENTS,
  site_location: SITE_LOCATIONS,
  reference_point: REFERENCE_POINTS,
  bleeding_on_probing: ['yes', 'no'],
};

const DATE_COLUMNS: ReadonlySet<ImportColumn> = new Set<ImportColumn>(['surgery_date', 'visit_date']);
/** Rows of the data sheet that offer pick lists (more rows may follow; the server checks every value). */
const PREPARED_ROWS = 1000;

/** The CSV template: the header line only, so nothing sample-like can be imported by mistake. */
export function csvTemplate(): Buffer {
  return Buffer.from(csvLine(IMPORT_COLUMNS), 'utf8');
}

/**
 * The Excel template: a data sheet with the header frozen, pick lists for controlled terms and
 * ISO date formats, and a guide sheet saying what each column holds and whether it may be left out.
 */
export async function xlsxTemplate(): Promise<Buffer> {
  const workbook = new ExcelJS.Workbook();
  workbook.creator = 'Tidemark';
  const sheet = workbook.addWorksheet(TEMPLATE_SHEET_NAME, { views: [{ state: 'frozen', ySplit: 1 }] });
  sheet.columns = IMPORT_COLUMNS.map((column) => ({ header: column, key: column, width: Math.max(12, column.length + 2), style: DATE_COLUMNS.has(column) ? { numFmt: 'yyyy-mm-dd' } : {} }));
  sheet.getRow(1).font = { name: 'Calibri', size: 11, bold: true, color: { argb: 'FFFFFFFF' } };
  sheet.getRow(1).fill = { type: 'pattern', pattern: 'solid', fgColor: { argb: 'FF2F7F7A' } };
  IMPORT_COLUMNS.forEach((column, index) => {
    const list = PICK_LISTS[column];
    if (!list) return;
    const letter = sheet.getColumn(index + 1).letter;
    for (let row = 2; row <= PREPARED_ROWS; row += 1) {
      sheet.getCell(`${letter}${row}`).dataValidation = { type: 'list', allowBlank: true, formulae: [`"${list.join(',')}"`], showErrorMessage: true, errorTitle: column, error: `Choose one of: ${list.join(', ')}.` };
    }
  });
  const guide = workbook.addWorksheet('Column guide');
  guide.columns = [
    { header: 'Column', key: 'column', width: 22 },
    { header: 'May be left out', key: 'optional', width: 16 },
    { header: 'What it holds', key: 'holds', width: 110 },
  ];
  guide.getRow(1).font = { name: 'Calibri', size: 11, bold: true };
  for (const column of IMPORT_COLUMNS) guide.addRow({ column, optional: OPTIONAL_IMPORT_COLUMNS.has(column) ? 'yes' : 'no', holds: IMPORT_COLUMN_GUIDE[column] });
  guide.addRow({});
  guide.addRow({ column: 'Rows', holds: 'One row per site per recall visit. A row without interval_key records a site that has no visit yet. Rows of one patient repeat the patient columns; rows of one case (patient_code + surgery_date) repeat the case columns.' });
  guide.addRow({ column: 'All or nothing', holds: 'Every row is checked first. If any row has a problem nothing is written, and the list of problems gives the row and column of each.' });
  return Buffer.from(await workbook.xlsx.writeBuffer());
}
