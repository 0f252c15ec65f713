import type ExcelJS from 'exceljs';
import type { CellValue, Style } from 'exceljs';
import type { ProportionEstimate } from '@tidemark/shared';
import { CYCLE_STATE_LABELS } from '@tidemark/shared';
import { CHART_PALETTE } from './chart-palette';
import { dayInWords } from './cohort-in-words';
import type { GovernancePack } from './governance-pack';
import { argb, BASE_FONT, CELL_STYLES, dateCell, solidFill, wrappedRowHeight } from './table-sheet';

/** DESIGN.md §7: shown on results and in every export. */
export const AUDIT_CAUTION =
  'For clinical audit and quality improvement. Not a diagnostic tool; treatment decisions rest with the treating clinician. Follow local regulations, professional guidance and data-protection law.';

/** The sheets in workbook order, with what each holds (listed on the front page). */
export const SHEET_GUIDE: readonly (readonly [string, string])[] = [
  ['Front page', 'This page: the audit, its cohort and the headline figures.'],
  ['Criteria', 'Each standard: target, observed value with 95% CI, verdict, evidence and exceptions.'],
  ['Margin outcomes', 'Rebound, stability classes and retained gain per interval, for the cohort and each subgroup.'],
  ['Papilla', 'Jemt papilla scores and their change from baseline per interval and subgroup.'],
  ['Complications', 'Cases with complications by type, Clavien–Dindo grade and operator (letters), with funnel limits.'],
  ['Recall', 'Recall completion per interval and loss to follow-up.'],
  ['Action plan', 'Actions agreed for the audit cycle(s): owner, deadline, state.'],
  ['Site data', 'One de-identified row per site per recall: codes local to this file, months instead of dates.'],
  ['Method notes', 'Formulas, thresholds, statistics and sources.'],
  ['Charts', 'Pictures of margin drift, the complications funnel and recall completion.'],
];

const TITLE_STYLE: Partial<Style> = { font: { ...BASE_FONT, bold: true, size: 18, color: { argb: argb(CHART_PALETTE.teal) } } };
const LABEL_STYLE: Partial<Style> = { font: { ...BASE_FONT, bold: true }, alignment: { vertical: 'top', wrapText: true } };
const VALUE_STYLE: Partial<Style> = { alignment: { vertical: 'top', wrapText: true, horizontal: 'left' } };
const CAUTION_STYLE: Partial<Style> = { font: { ...BASE_FONT, bold: true }, fill: solidFill(CHART_PALETTE.coralLight), alignment: { vertical: 'top', wrapText: true } };
const SECTION_STYLE: Partial<Style> = { font: { ...BASE_FONT, bold: true, color: { argb: argb(CHART_PALETTE.ink) } }, fill: solidFill(CHART_PALETTE.sand) };
const SHARE_VALUE_STYLE: Partial<Style> = { ...CELL_STYLES.share, alignment: { horizontal: 'left' } };
const COUNT_VALUE_STYLE: Partial<Style> = { ...CELL_STYLES.count, alignment: { horizontal: 'left' } };

const LABEL_WIDTH = 28;
const VALUE_WIDTH = 100;

function percentText(share: number): string {
  return `${(share * 100).toFixed(1)}%`;
}

function scopeInWords(pack: GovernancePack): string {
  const scope = pack.scope;
  if (scope.kind === 'live') return `Live results as of ${dayInWords(pack.results.asOf)} (they change as records are added).`;
  const frozen = scope.frozenAt ? `results frozen on ${dayInWords(scope.frozenAt.slice(0, 10))}` : 'results still live (the cycle is not reported yet)';
  const presented = scope.presentedDate ? `; presented ${dayInWords(scope.presentedDate)}` : '';
  return `Audit cycle ${scope.number} — ${CYCLE_STATE_LABELS[scope.state]}; ${frozen}${presented}.`;
}

function standardsInWords(pack: GovernancePack): string {
  const verdicts = pack.results.standards.map((result) => result.verdict);
  if (verdicts.length === 0) return 'No standards defined.';
  const count = (verdict: string) => verdicts.filter((candidate) => candidate === verdict).length;
  return `${count('met')} of ${verdicts.length} met; ${count('not-met')} not met; ${count('inconclusive')} inconclusive (95% CI straddles the target); ${count('no-data')} without data.`;
}

/**
 * The front page: what the audit is, which data it covers (live or a frozen cycle), the cohort in
 * words, its size, the headline figures, when it was produced, the caution and a guide to the sheets.
 */
export function writeFrontPage(workbook: ExcelJS.stream.xlsx.WorkbookWriter, pack: GovernancePack): void {
  const sheet = workbook.addWorksheet('Front page', { properties: { tabColor: { argb: argb(CHART_PALETTE.coral) } }, pageSetup: { fitToPage: true, fitToWidth: 1, fitToHeight: 0, orientation: 'portrait' } });
  sheet.columns = [{ width: LABEL_WIDTH }, { width: VALUE_WIDTH }];
  const line = (label: string, value: CellValue, valueStyle: Partial<Style> = VALUE_STYLE, labelStyle: Partial<Style> = LABEL_STYLE): void => {
    const row = sheet.addRow([label, value]);
    if (typeof value === 'string') row.height = wrappedRowHeight([{ text: label, width: LABEL_WIDTH }, { text: value, width: VALUE_WIDTH }]);
    row.getCell(1).style = labelStyle;
    row.getCell(2).style = valueStyle;
    row.commit();
  };
  const section = (title: string): void => {
    sheet.addRow([]).commit();
    const row = sheet.addRow([title, '']);
    row.getCell(1).style = SECTION_STYLE;
    row.getCell(2).style = SECTION_STYLE;
    row.commit();
  };
  const title = sheet.addRow(['Tidemark governance pack']);
  title.height = 28;
  title.getCell(1).style = TITLE_STYLE;
  title.commit();
  line('Caution', AUDIT_CAUTION, CAUTION_STYLE, CAUTION_STYLE);

  section('The audit');
  line('Audit', pack.auditTitle);
  if (pack.rationale) line('Why we audit this', pack.rationale);
  line('Results shown', scopeInWords(pack));
  if (pack.scope.kind === 'cycle') {
    line('Surgery period from', dateCell(pack.scope.periodStart), CELL_STYLES.date);
    line('Surgery period to', dateCell(pack.scope.periodEnd), CELL_STYLES.date);
  }
  line('Audit lead', pack.leadName);
  line('Cohort definition', pack.cohortInWords);
  line('Recall schedule', pack.results.schedule.map((interval) => `${interval.label} (day ${interval.targetDays}, −${interval.windowBeforeDays} / +${interval.windowAfterDays} days)`).join('; '));
  const { stable, relapse } = pack.results.thresholds;
  line('Stability classes', `stable: rebound ≤ ${stable.toFixed(2)} mm; minor: ${stable.toFixed(2)}–${relapse.toFixed(2)} mm; relapse: > ${relapse.toFixed(2)} mm`);
  if (pack.reauditDate) line('Re-audit due', dateCell(pack.reauditDate), CELL_STYLES.date);

  section('Size of the cohort');
  line('Cases', pack.results.cohort.cases, COUNT_VALUE_STYLE);
  line('Patients', pack.results.cohort.patients, COUNT_VALUE_STYLE);
  line('Sites with a recall', pack.results.cohort.sites, COUNT_VALUE_STYLE);
  line('Site-visit rows', pack.siteData.count, COUNT_VALUE_STYLE);

  section('Headline figures');
  line('Standards', standardsInWords(pack));
  const share = (label: string, estimate: ProportionEstimate, of: string): void => {
    line(label, estimate.p, SHARE_VALUE_STYLE);
    const limits = estimate.lower !== null && estimate.upper !== null ? `; 95% CI ${percentText(estimate.lower)} to ${percentText(estimate.upper)} (Wilson)` : '';
    line('', `${estimate.count} of ${estimate.n} ${of}${limits}`);
  };
  share('Cases with a complication', pack.results.summary.complications.casesWithComplication, 'cases');
  share('Lost to follow-up', pack.results.summary.recall.lossToFollowUp, 'cases with a closed recall window');

  section('About this file');
  line('Produced on', dateCell(pack.producedOn), CELL_STYLES.date);
  line('Produced by', `Tidemark, at the request of the ${pack.producedBy.toLowerCase()}`);
  line(
    'De-identification',
    'Patient codes are replaced by codes that exist only in this file (P0001…), operators by letters, dates of surgery and recall by their month. No names, notes, record numbers or database ids are included.',
  );
  section('Sheets');
  for (const [name, purpose] of SHEET_GUIDE) line(name, purpose);
  sheet.commit();
}
