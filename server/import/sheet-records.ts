import { Readable } from 'node:stream';
import ExcelJS from 'exceljs';
import type { CellValue } from 'exceljs';

/** A cell as the import reads it: what the person typed, whatever the spreadsheet made of it. */
export type PlainCell = string | number | boolean | Date | null;

/** One spreadsheet row with its number as the spreadsheet shows it. */
export interface SheetRecord {
  row: number;
  cells: PlainCell[];
}

/** Rich text, formulas, hyperlinks and errors reduced to the value a person sees. */
export function plainCell(value: CellValue): PlainCell {
  if (value === null || value === undefined) return null;
  if (typeof value === 'string' || typeof value === 'number' || typeof value === 'boolean' || value instanceof Date) return value;
  if ('richText' in value) return value.richText.map((part) => part.text).join('');
  if ('hyperlink' in value) return value.text;
  if ('error' in value) return value.error;
  if ('result' in value && value.result !== undefined) return plainCell(value.result);
  return null;
}

/**
 * Reads the rows of the first worksheet whose first row names `marker` (the template's first
 * column), with exceljs' streaming reader so that a large workbook is never held whole. Dates
 * typed as dates arrive as Date objects (styles are read to tell them from numbers).
 */
export async function readSheetRecords(bytes: Buffer, marker: string): Promise<SheetRecord[] | null> {
  const reader = new ExcelJS.stream.xlsx.WorkbookReader(Readable.from([bytes]), { worksheets: 'emit', sharedStrings: 'cache', hyperlinks: 'ignore', styles: 'cache', entries: 'ignore' });
  let found: SheetRecord[] | null = null;
  for await (const worksheet of reader) {
    const records: SheetRecord[] = [];
    let isWanted: boolean | null = null;
    // Every worksheet must be read to its end before the reader moves on.
    for await (const row of worksheet) {
      if (found !== null || isWanted === false) continue;
      const values = Array.isArray(row.values) ? row.values : [];
      // row.values is 1-based (index 0 is empty).
      // Array.from visits the holes of a sparse row too (empty cells become null).
      const cells = Array.from(values.slice(1), (value) => plainCell(value));
      if (isWanted === null) isWanted = row.number === 1 && cells.some((cell) => typeof cell === 'string' && cell.trim().toLowerCase() === marker);
      if (isWanted) records.push({ row: row.number, cells });
    }
    if (found === null && isWanted) found = records;
  }
  return found;
}
