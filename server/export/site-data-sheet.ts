import type ExcelJS from 'exceljs';
import type { StabilityClass } from '@tidemark/shared';
import type { SiteDataRow, SiteDataSource } from './governance-pack';
import { fractionOfPercent, startTableSheet, type TableColumn } from './table-sheet';

const STABILITY_WORDS: Readonly<Record<StabilityClass, string>> = { stable: 'Stable', minor: 'Minor', relapse: 'Relapse' };

/** The Site data columns, in order. */
export const SITE_DATA_COLUMNS: readonly TableColumn<SiteDataRow>[] = [
  { header: 'Patient (this file only)', width: 12, value: (row) => row.patient },
  { header: 'Case (this file only)', width: 11, value: (row) => row.caseCode },
  { header: 'Operator', width: 9, value: (row) => row.operator },
  { header: 'Tooth (FDI)', width: 8, format: 'count', value: (row) => row.tooth },
  { header: 'Site', width: 14, value: (row) => row.location },
  { header: 'Phenotype', width: 14, value: (row) => row.phenotype },
  { header: 'Procedure', width: 30, value: (row) => row.procedure },
  { header: 'Surgery month', width: 10, value: (row) => row.surgeryMonth },
  { header: 'Recall month', width: 10, value: (row) => row.visitMonth },
  { header: 'Interval', width: 11, value: (row) => row.interval },
  { header: 'REF→GM before, mm', width: 10, format: 'mm', value: (row) => row.baselineRefGm },
  { header: 'REF→GM post-op, mm', width: 10, format: 'mm', value: (row) => row.postOpRefGm },
  { header: 'REF→GM at recall, mm', width: 10, format: 'mm', value: (row) => row.recallRefGm },
  { header: 'Crown gain, mm', width: 9, format: 'mm', value: (row) => row.crownGain },
  { header: 'Rebound, mm', width: 9, format: 'mm', value: (row) => row.rebound },
  { header: 'Retained gain, mm', width: 9, format: 'mm', value: (row) => row.retainedGain },
  { header: 'Retained, %', width: 9, format: 'share', value: (row) => fractionOfPercent(row.percentRetained) },
  { header: 'Stability', width: 9, value: (row) => (row.stability ? STABILITY_WORDS[row.stability] : null) },
  { header: 'Review flag', width: 20, value: (row) => (row.isFlaggedForReview ? 'Negative rebound' : null) },
  { header: 'Papilla before (Jemt)', width: 9, format: 'count', value: (row) => row.baselinePapilla },
  { header: 'Papilla at recall (Jemt)', width: 9, format: 'count', value: (row) => row.recallPapilla },
  { header: 'Bleeding on probing', width: 9, value: (row) => (row.bleedingOnProbing === null ? null : row.bleedingOnProbing ? 'Yes' : 'No') },
];

/** How often the writer lets the zip stream drain and reports progress. */
const ROWS_PER_TICK = 250;

/**
 * The de-identified Site data sheet: one row per site per recall, streamed to the file. Every
 * {@link ROWS_PER_TICK} rows it yields one turn of the event loop: the zip pipeline then empties
 * into the (synchronous) stage file, so memory stays flat, and progress polls are answered.
 */
export async function writeSiteDataSheet(workbook: ExcelJS.stream.xlsx.WorkbookWriter, source: SiteDataSource, onRows: (rows: number) => void): Promise<void> {
  const table = startTableSheet(workbook, 'Site data', SITE_DATA_COLUMNS, 3);
  for (const row of source.rows()) {
    table.addRow(row);
    if (table.rowCount % ROWS_PER_TICK === 0) {
      onRows(table.rowCount);
      await new Promise<void>((resolve) => setImmediate(resolve));
    }
  }
  onRows(table.rowCount);
  table.commit();
}
