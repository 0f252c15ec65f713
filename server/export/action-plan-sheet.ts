import type ExcelJS from 'exceljs';
import { ACTION_STATE_LABELS } from '@tidemark/shared';
import type { PackAction } from './governance-pack';
import { dateCell, startTableSheet, type TableColumn } from './table-sheet';

/** The action plan (HQIP 2020: action, owner, deadline), with the cycle each action belongs to. */
export function writeActionPlanSheet(workbook: ExcelJS.stream.xlsx.WorkbookWriter, actions: readonly PackAction[]): void {
  const columns: TableColumn<PackAction>[] = [
    { header: 'Audit cycle', width: 10, format: 'count', value: (action) => action.cycleNumber },
    { header: 'Action', width: 70, isWrapped: true, value: (action) => action.action },
    { header: 'Owner', width: 28, value: (action) => action.owner },
    { header: 'Due', width: 14, format: 'date', value: (action) => dateCell(action.dueDate) },
    { header: 'State', width: 12, value: (action) => ACTION_STATE_LABELS[action.state] },
  ];
  const table = startTableSheet(workbook, 'Action plan', columns);
  for (const action of actions) table.addRow(action);
  if (actions.length === 0) table.worksheet.addRow([null, 'No actions recorded yet.']);
  table.commit();
}
