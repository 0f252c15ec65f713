import type ExcelJS from 'exceljs';
import type { Style } from 'exceljs';
import type { RecallInterval, StandardResult } from '@tidemark/shared';
import { STANDARD_METRIC_INFO } from '@tidemark/shared';
import { CHART_PALETTE } from './chart-palette';
import { BASE_FONT, CELL_STYLES, solidFill, startTableSheet, WRAP_STYLE, type TableColumn } from './table-sheet';

/** Verdicts in words with a mark, so the state never rests on the fill colour alone. */
export const VERDICT_WORDS: Readonly<Record<StandardResult['verdict'], string>> = {
  met: '✔ Met',
  'not-met': '✘ Not met',
  inconclusive: '? Inconclusive — the 95% CI straddles the target',
  'no-data': '– No data',
};

const VERDICT_STYLES: Readonly<Record<StandardResult['verdict'], Partial<Style>>> = {
  met: { font: { ...BASE_FONT, bold: true }, fill: solidFill(CHART_PALETTE.tealLight), alignment: { vertical: 'top', wrapText: true } },
  'not-met': { font: { ...BASE_FONT, bold: true }, fill: solidFill(CHART_PALETTE.coralLight), alignment: { vertical: 'top', wrapText: true } },
  inconclusive: { font: { ...BASE_FONT, bold: true }, fill: solidFill(CHART_PALETTE.sand), alignment: { vertical: 'top', wrapText: true } },
  'no-data': { font: { ...BASE_FONT, italic: true }, alignment: { vertical: 'top', wrapText: true } },
};

/** Shares (unit %) are stored as fractions with a % format; mm and scores stay as they are. */
const VALUE_STYLES: Readonly<Record<StandardResult['unit'], Partial<Style>>> = {
  '%': CELL_STYLES.share,
  mm: { numFmt: '0.00 "mm"', alignment: { vertical: 'top' } },
  score: CELL_STYLES.score,
};

/** A standard's value in the cell's unit: % → fraction (the cell shows it as a percentage). */
export function standardCellValue(unit: StandardResult['unit'], value: number | null | undefined): number | null {
  if (value === null || value === undefined) return null;
  return unit === '%' ? value / 100 : value;
}

/** The metric's parameter in words (limit, grade), or empty. */
function parameterInWords(result: StandardResult): string {
  const { standard } = result;
  if (standard.thresholdMm !== null && STANDARD_METRIC_INFO[standard.metric].needsThresholdMm) return `rebound ≤ ${standard.thresholdMm} mm`;
  if (standard.thresholdPct !== null && STANDARD_METRIC_INFO[standard.metric].needsThresholdPct) return `bleeding score under ${standard.thresholdPct}%`;
  if (standard.minGrade !== null && STANDARD_METRIC_INFO[standard.metric].needsGrade) return `Clavien–Dindo grade ${standard.minGrade} or worse`;
  return '';
}

/** The Criteria sheet: one row per standard, values exactly as the results API reports them. */
export function writeCriteriaSheet(workbook: ExcelJS.stream.xlsx.WorkbookWriter, standards: readonly StandardResult[], schedule: readonly RecallInterval[]): void {
  const intervalLabel = (key: string | null): string => (key === null ? '' : (schedule.find((interval) => interval.key === key)?.label ?? `${key} (not in the schedule)`));
  const valueStyle = (result: StandardResult) => VALUE_STYLES[result.unit];
  const columns: TableColumn<StandardResult>[] = [
    { header: 'No.', width: 6, format: 'count', value: (result) => standards.indexOf(result) + 1 },
    { header: 'Criterion', width: 42, isWrapped: true, value: (result) => result.standard.criterion },
    { header: 'Measure', width: 34, isWrapped: true, value: (result) => STANDARD_METRIC_INFO[result.standard.metric].label },
    { header: 'Interval', width: 12, value: (result) => intervalLabel(result.standard.intervalKey) },
    { header: 'Parameter', width: 24, isWrapped: true, value: parameterInWords },
    { header: 'Comparator', width: 11, value: (result) => (result.standard.comparator === '>=' ? '≥ (at least)' : '≤ (at most)') },
    { header: 'Target', width: 11, value: (result) => standardCellValue(result.unit, result.standard.target), styleOf: valueStyle },
    { header: 'Unit', width: 7, value: (result) => result.unit },
    { header: 'Observed', width: 11, value: (result) => standardCellValue(result.unit, result.observed?.value), styleOf: valueStyle },
    { header: '95% CI low', width: 11, value: (result) => standardCellValue(result.unit, result.observed?.ci95[0]), styleOf: valueStyle },
    { header: '95% CI high', width: 11, value: (result) => standardCellValue(result.unit, result.observed?.ci95[1]), styleOf: valueStyle },
    { header: 'n (denominator)', width: 14, format: 'count', value: (result) => result.observed?.n ?? null },
    { header: 'Count (numerator)', width: 14, format: 'count', value: (result) => result.observed?.count ?? null },
    { header: 'Verdict', width: 24, isWrapped: true, value: (result) => VERDICT_WORDS[result.verdict], styleOf: (result) => VERDICT_STYLES[result.verdict] },
    { header: 'How it is measured', width: 48, isWrapped: true, value: (result) => STANDARD_METRIC_INFO[result.standard.metric].explanation },
    { header: 'Evidence source', width: 36, isWrapped: true, value: (result) => result.standard.evidenceSource },
    { header: 'Exceptions', width: 30, isWrapped: true, value: (result) => result.standard.exceptions },
  ];
  const table = startTableSheet(workbook, 'Criteria', columns, 2);
  for (const result of standards) table.addRow(result);
  if (standards.length === 0) table.worksheet.addRow(['', 'No standards are defined for this audit.']).getCell(2).style = WRAP_STYLE;
  table.commit();
}
