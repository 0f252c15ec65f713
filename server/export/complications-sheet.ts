import type ExcelJS from 'exceljs';
import type { FunnelPoint, FunnelResult, ProportionEstimate } from '@tidemark/shared';
import { CLAVIEN_DINDO_LABELS, COMPLICATION_TYPE_LABELS } from '@tidemark/shared';
import { proportionEstimate } from '@tidemark/analytics';
import type { PackSubgroup } from './governance-pack';
import { shareColumns } from './summary-columns';
import { startTableSheet, type TableColumn } from './table-sheet';

/** One row of the Complications sheet. */
interface ComplicationRow {
  view: string;
  category: string;
  /** Complications counted (a case may have several). */
  complications: number | null;
  /** Cases with at least one, out of `cases.n`. */
  cases: ProportionEstimate;
  funnel: FunnelPoint | null;
}

/** Stored types are keys of the vocabulary; anything else shows as stored. */
const TYPE_LABELS: Readonly<Record<string, string>> = COMPLICATION_TYPE_LABELS;

/** Where an operator's point falls on the funnel, in words. */
const FUNNEL_WORDS: Readonly<Record<FunnelPoint['position'], string>> = {
  inside: 'Inside the 95% limits',
  'warning-high': '▲ Above the 95% limit (not the 99.8%)',
  'alarm-high': '▲▲ Above the 99.8% limit',
  'warning-low': '▼ Below the 95% limit (not the 99.8%)',
  'alarm-low': '▼▼ Below the 99.8% limit',
};

function complicationRows(subgroups: readonly PackSubgroup[], funnel: FunnelResult): ComplicationRow[] {
  const overall = subgroups[0].summary.complications;
  const rows: ComplicationRow[] = [{ view: 'All cases', category: 'Any complication', complications: overall.byType.reduce((sum, entry) => sum + entry.complications, 0), cases: overall.casesWithComplication, funnel: null }];
  for (const entry of overall.byType) {
    rows.push({ view: 'By type', category: TYPE_LABELS[entry.type] ?? entry.type, complications: entry.complications, cases: proportionEstimate(entry.cases, overall.nCases), funnel: null });
  }
  for (const entry of overall.byGrade) {
    rows.push({ view: 'By Clavien–Dindo grade', category: CLAVIEN_DINDO_LABELS[entry.grade], complications: entry.complications, cases: entry.cases, funnel: null });
  }
  for (const subgroup of subgroups.filter((candidate) => candidate.dimension === 'Operator')) {
    const complications = subgroup.summary.complications;
    rows.push({
      view: 'By operator',
      category: subgroup.label,
      complications: complications.byType.reduce((sum, entry) => sum + entry.complications, 0),
      cases: complications.casesWithComplication,
      funnel: funnel.points.find((point) => point.label === subgroup.label) ?? null,
    });
  }
  return rows;
}

/**
 * Complications (a case counts once however many it had): overall, by type, by Clavien–Dindo
 * grade and by operator letter, each with a Wilson 95% CI; operators also with their funnel
 * limits around the practice rate (Spiegelhalter 2005).
 */
export function writeComplicationsSheet(workbook: ExcelJS.stream.xlsx.WorkbookWriter, subgroups: readonly PackSubgroup[], funnel: FunnelResult): void {
  const columns: TableColumn<ComplicationRow>[] = [
    { header: 'View', width: 22, value: (row) => row.view },
    { header: 'Category', width: 44, isWrapped: true, value: (row) => row.category },
    { header: 'Complications (n)', width: 13, format: 'count', value: (row) => row.complications },
    { header: 'Cases with one (n)', width: 12, format: 'count', value: (row) => row.cases.count },
    { header: 'Cases (n)', width: 9, format: 'count', value: (row) => row.cases.n },
    ...shareColumns<ComplicationRow>('Cases with one', (row) => row.cases),
    { header: 'Practice rate', width: 10, format: 'share', value: (row) => (row.funnel ? funnel.target : null) },
    { header: 'Funnel 95% low', width: 10, format: 'share', value: (row) => row.funnel?.limits95.lower ?? null },
    { header: 'Funnel 95% high', width: 10, format: 'share', value: (row) => row.funnel?.limits95.upper ?? null },
    { header: 'Funnel 99.8% low', width: 10, format: 'share', value: (row) => row.funnel?.limits998.lower ?? null },
    { header: 'Funnel 99.8% high', width: 10, format: 'share', value: (row) => row.funnel?.limits998.upper ?? null },
    { header: 'Funnel position', width: 30, value: (row) => (row.funnel ? FUNNEL_WORDS[row.funnel.position] : '') },
  ];
  const table = startTableSheet(workbook, 'Complications', columns, 2);
  for (const row of complicationRows(subgroups, funnel)) table.addRow(row);
  table.commit();
}
