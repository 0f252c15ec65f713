import type ExcelJS from 'exceljs';
import type { PackSubgroup } from './governance-pack';
import { meanColumns, SUBGROUP_COLUMNS, subgroupIntervals, type SubgroupInterval } from './summary-columns';
import { startTableSheet, type TableColumn } from './table-sheet';

/** Share of sites with one Jemt score at the interval. */
function scoreShare(score: number): TableColumn<SubgroupInterval> {
  return {
    header: `Score ${score}: %`,
    width: 9,
    format: 'share',
    value: (row) => row.interval.papilla.distribution.find((entry) => entry.score === score)?.estimate.p ?? null,
  };
}

/**
 * Papilla fill per interval for the cohort and each subgroup: the Jemt index (1997) at site and
 * patient level, the share of each score 0–4, the change from baseline and how many sites
 * improved, stayed or worsened.
 */
export function writePapillaSheet(workbook: ExcelJS.stream.xlsx.WorkbookWriter, subgroups: readonly PackSubgroup[]): void {
  const columns: TableColumn<SubgroupInterval>[] = [
    ...SUBGROUP_COLUMNS,
    { header: 'Sites scored (n)', width: 10, format: 'count', value: (row) => row.interval.papilla.nSites },
    { header: 'Patients (n)', width: 9, format: 'count', value: (row) => row.interval.papilla.nPatients },
    ...meanColumns('Score per site', (row) => row.interval.papilla.score.site, 'score'),
    ...meanColumns('Score per patient', (row) => row.interval.papilla.score.patient, 'score'),
    ...[0, 1, 2, 3, 4].map(scoreShare),
    ...meanColumns('Change from baseline per site', (row) => row.interval.papilla.change.site, 'score'),
    { header: 'Improved (sites)', width: 10, format: 'count', value: (row) => row.interval.papilla.improved },
    { header: 'Unchanged (sites)', width: 10, format: 'count', value: (row) => row.interval.papilla.unchanged },
    { header: 'Worsened (sites)', width: 10, format: 'count', value: (row) => row.interval.papilla.worsened },
  ];
  const table = startTableSheet(workbook, 'Papilla', columns, 3);
  for (const row of subgroupIntervals(subgroups)) table.addRow(row);
  table.commit();
}
