import type ExcelJS from 'exceljs';
import type { PackSubgroup } from './governance-pack';
import { meanColumns, shareColumns, SUBGROUP_COLUMNS, subgroupIntervals, type SubgroupInterval } from './summary-columns';
import { fractionOfPercent, startTableSheet, type TableColumn } from './table-sheet';

/**
 * Margin outcomes per interval for the cohort and each subgroup: n sites and patients, mean
 * rebound at site and patient level with t-based 95% CIs, stability shares with Wilson CIs,
 * sites flagged for review, retained gain and % retained (DESIGN.md §3).
 */
export function writeMarginOutcomesSheet(workbook: ExcelJS.stream.xlsx.WorkbookWriter, subgroups: readonly PackSubgroup[]): void {
  const columns: TableColumn<SubgroupInterval>[] = [
    ...SUBGROUP_COLUMNS,
    { header: 'Rows recorded', width: 10, format: 'count', value: (row) => row.interval.nRecords },
    { header: 'Sites (n)', width: 9, format: 'count', value: (row) => row.interval.nSites },
    { header: 'Patients (n)', width: 9, format: 'count', value: (row) => row.interval.nPatients },
    ...meanColumns('Rebound per site, mm', (row) => row.interval.rebound.site, 'meanMm'),
    { header: 'Rebound per site: SD, mm', width: 11, format: 'meanMm', value: (row) => row.interval.rebound.site?.sd ?? null },
    ...meanColumns('Rebound per patient, mm', (row) => row.interval.rebound.patient, 'meanMm'),
    ...shareColumns<SubgroupInterval>('Stable', (row) => row.interval.stability.stable),
    ...shareColumns<SubgroupInterval>('Minor', (row) => row.interval.stability.minor),
    ...shareColumns<SubgroupInterval>('Relapse', (row) => row.interval.stability.relapse),
    { header: 'Flagged for review (negative rebound), sites', width: 14, format: 'count', value: (row) => row.interval.stability.flaggedForReview.count },
    { header: 'Retained gain per site: mean, mm', width: 13, format: 'meanMm', value: (row) => row.interval.retainedGain.site?.mean ?? null },
    { header: 'Retained per site: mean %', width: 12, format: 'share', value: (row) => fractionOfPercent(row.interval.percentRetained.site?.mean) },
  ];
  const table = startTableSheet(workbook, 'Margin outcomes', columns, 3);
  for (const row of subgroupIntervals(subgroups)) table.addRow(row);
  table.commit();
}
