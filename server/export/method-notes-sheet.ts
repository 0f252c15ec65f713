import type ExcelJS from 'exceljs';
import type { StabilityThresholds } from '@tidemark/shared';
import { STANDARD_METRIC_INFO, STANDARD_METRICS } from '@tidemark/shared';
import { AUDIT_CAUTION } from './front-page-sheet';
import { startTableSheet, type TableColumn } from './table-sheet';

/** One note: what it is about, what it says, where it comes from. */
interface MethodNote {
  topic: string;
  note: string;
  source: string;
}

const ARORA = 'Arora R et al., J Periodontol 2013;84(7):934–940';
const NEWCOMBE = 'Newcombe RG, Stat Med 1998;17:857–872 (Wilson score interval)';
const SPIEGELHALTER = 'Spiegelhalter DJ, Stat Med 2005;24:1185–1202';

/** The notes, with the audit's own thresholds (DESIGN.md §3–§4, REFERENCES.md). */
function methodNotes(thresholds: StabilityThresholds): MethodNote[] {
  const { stable, relapse } = thresholds;
  return [
    { topic: 'Caution', note: AUDIT_CAUTION, source: 'Tidemark (DESIGN.md §7)' },
    { topic: 'Units', note: 'Distances in millimetres, read in 0.5 mm steps; plausible range 0–20 mm. Periodontal probes read to 0.5–1 mm and ±1 mm is measurement noise, so differences under 1 mm are within probe reproducibility.', source: 'Common practice' },
    { topic: 'REF→GM', note: 'Distance from a fixed reference (incisal edge, cusp tip, restoration margin or stent notch, recorded per site) to the mid-facial gingival margin. It grows when tissue is removed.', source: 'Tidemark measurement convention' },
    { topic: 'Crown gain', note: 'REF→GM immediately after surgery − REF→GM before surgery.', source: 'Tidemark measurement convention' },
    { topic: 'Rebound', note: 'REF→GM after surgery − REF→GM at the recall. Positive: the margin crept back coronally. Published cohorts report 0.77 ± 0.58 mm at 6 months; the margin keeps moving coronally over 12 months, more with a thick phenotype.', source: `${ARORA}; Pontoriero R, Carnevale G, J Periodontol 2001;72(7):841–848` },
    { topic: 'Retained gain', note: 'REF→GM at the recall − REF→GM before surgery; % retained = retained gain / crown gain × 100 (undefined when the crown gain is 0, so such sites are left out of % retained).', source: 'Tidemark measurement convention' },
    { topic: 'Stability classes', note: `Set for this audit: stable when rebound ≤ ${stable} mm; minor when ${stable} < rebound ≤ ${relapse} mm; relapse when rebound > ${relapse} mm. A negative rebound (margin further apical than placed) counts as stable and is flagged for review as possible recession or over-exposure.`, source: 'Audit thresholds (defaults 0.5 / 1.0 mm)' },
    { topic: 'Papilla score', note: 'Jemt papilla index: 0 no papilla; 1 less than half the height to the contact point; 2 half or more but not the full embrasure; 3 fills the embrasure; 4 hyperplastic. Change = score at recall − score before surgery.', source: 'Jemt T, Int J Periodontics Restorative Dent 1997;17:326–333' },
    { topic: 'Complications', note: 'Clavien–Dindo grades adapted to dental surgery: I no treatment beyond analgesics; II other medicines; IIIa/IIIb intervention without/with general anaesthesia; IVa/IVb life-threatening; V death. A case counts once however many complications it had.', source: 'Dindo D, Demartines N, Clavien PA, Ann Surg 2004;240:205–213' },
    { topic: 'Sites and patients', note: 'Sites of one patient are correlated, so every summary gives n sites and n patients, and patient-level figures (the mean of each patient’s sites) beside site-level ones.', source: 'Common practice' },
    { topic: 'Descriptive statistics', note: 'Mean, SD (n − 1), standard error and a t-based 95% confidence interval of the mean; median and quartiles (R type 7). No interval for a single value.', source: 'Common practice; checked against NIST StRD univariate data sets' },
    { topic: 'Proportions', note: 'Shares carry the Wilson score 95% interval, which stays within 0–100% and behaves at 0 and n.', source: NEWCOMBE },
    { topic: 'Verdict of a standard', note: 'Met when the whole 95% CI lies on the right side of the target; not met when the whole CI lies on the wrong side; inconclusive when the CI straddles the target (the sample cannot tell); no data when there is nothing to measure.', source: 'Common practice for criteria measured with uncertainty; criteria and targets as in NICE/CHI, Principles for Best Practice in Clinical Audit, 2002, and HQIP, Documenting local clinical audit, 2020' },
    { topic: 'Funnel limits', note: 'Each operator’s rate against the practice rate θ₀ with limits θ₀ ± z√(θ₀(1 − θ₀)/n), z = 1.960 (95%) and 3.090 (99.8%), cut to 0–100%; exact binomial limits below 30 cases.', source: SPIEGELHALTER },
    { topic: 'Recall completion', note: 'Per interval, withdrawn cases left out: seen (at any time) out of seen + missed, where missed means the window closed without a visit; in-window share likewise. Loss to follow-up: cases with no visit at their last closed interval or later, out of cases with at least one closed window.', source: 'Tidemark definition' },
    ...STANDARD_METRICS.map((metric) => ({ topic: `Measure: ${STANDARD_METRIC_INFO[metric].label}`, note: STANDARD_METRIC_INFO[metric].explanation, source: 'Tidemark standard catalogue' })),
    { topic: 'Operators', note: 'Operators appear as letters (Operator A, B, …) in order of their account, as on the governance dashboards.', source: 'Tidemark (DESIGN.md §2)' },
    { topic: 'De-identification', note: 'Patient and case codes exist only in this file and differ from the practice’s codes; surgery and recall dates are reduced to their month; no names, notes, record numbers or database ids. Codes and full dates typed into criteria or actions are removed or shortened.', source: 'Tidemark (DESIGN.md §7)' },
    { topic: 'Audit method', note: 'Prepare; select criteria; measure performance; make improvements; sustain improvement (re-audit). A criterion is an explicit, measurable statement with a target and its evidence source, plus exceptions.', source: 'NICE/CHI, Principles for Best Practice in Clinical Audit, Radcliffe 2002; HQIP, Documenting local clinical audit, 2020' },
    { topic: 'Calibration targets', note: 'Examiners are calibrated when more than 90% of repeat readings fall within ±1 mm and κ > 0.6.', source: 'Andrade R et al., Braz Oral Res 2012;26(1):57–63' },
  ];
}

/** The Method notes sheet: formulas, thresholds, statistics and the sources behind them. */
export function writeMethodNotesSheet(workbook: ExcelJS.stream.xlsx.WorkbookWriter, thresholds: StabilityThresholds): void {
  const columns: TableColumn<MethodNote>[] = [
    { header: 'Topic', width: 30, isWrapped: true, value: (note) => note.topic },
    { header: 'Note', width: 100, isWrapped: true, value: (note) => note.note },
    { header: 'Source', width: 50, isWrapped: true, value: (note) => note.source },
  ];
  const table = startTableSheet(workbook, 'Method notes', columns);
  for (const note of methodNotes(thresholds)) table.addRow(note);
  table.commit();
}
