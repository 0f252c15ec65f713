import type { ImportColumn, ImportCounts, ImportIssue, ImportRow } from '@tidemark/shared';
import { IMPORT_CASE_COLUMNS, IMPORT_PATIENT_COLUMNS, IMPORT_SITE_COLUMNS, IMPORT_VISIT_COLUMNS, importRowChecker } from '@tidemark/shared';
import type { ImportTable } from './import-table';

/** One site's reading at one visit. */
export interface PlannedMeasurement {
  row: number;
  site: PlannedSite;
  refGm: number;
  papillaScore: number | null;
  bleedingOnProbing: boolean | null;
}

/** A recall visit of a planned case. */
export interface PlannedVisit {
  row: number;
  intervalKey: string;
  visitDate: string;
  pain: number | null;
  measurements: PlannedMeasurement[];
}

/** A site of a planned case, with every row that mentions it (for duplicate reports). */
export interface PlannedSite {
  row: number;
  rows: number[];
  tooth: number;
  location: ImportRow['site_location'];
  referencePoint: ImportRow['reference_point'];
  baselineRefGm: number;
  postOpRefGm: number | null;
  ktWidth: number | null;
  marginToCrest: number | null;
  papillaScore: number | null;
}

/** A case: patient code + surgery date. */
export interface PlannedCase {
  row: number;
  rows: number[];
  surgeryDate: string;
  operatorEmail: string;
  procedure: ImportRow['procedure'];
  indication: ImportRow['indication'];
  instrument: ImportRow['instrument'];
  sites: PlannedSite[];
  visits: PlannedVisit[];
}

/** A patient code with its fields and cases. */
export interface PlannedPatient {
  row: number;
  rows: number[];
  code: string;
  birthYear: number;
  sex: ImportRow['sex'];
  smoking: ImportRow['smoking'];
  cigarettesPerDay: number | null;
  diabetes: ImportRow['diabetes'];
  phenotype: ImportRow['phenotype'];
  phenotypeMethod: ImportRow['phenotype_method'];
  cases: PlannedCase[];
}

/** The file as records to write, and every problem found without the database. */
export interface ImportPlan {
  patients: PlannedPatient[];
  counts: ImportCounts;
  issues: ImportIssue[];
}

/** As caseCreateSchema: at most 64 sites in one case. */
const MAX_SITES_PER_CASE = 64;

/** Rows between pauses, so that progress polls are answered while a large file is checked. */
const ROWS_PER_PAUSE = 1000;

/** The first row that set a group's fields, for consistency checks. */
interface FirstRow {
  row: number;
  parsed: ImportRow;
}

/** Reports each column of `columns` whose value differs from the group's first row. */
function checkSame(first: FirstRow, parsed: ImportRow, row: number, columns: readonly ImportColumn[], what: string, issues: ImportIssue[]): void {
  for (const column of columns) {
    if (first.parsed[column] !== parsed[column]) issues.push({ row, column, message: `Differs from row ${first.row}: every row of ${what} must carry the same ${column}.` });
  }
}

/**
 * Checks every row (the shared import-row checker: field schemas and row rules; interval keys of the practice's
 * schedules) and the file as a whole: one patient code carries the same patient fields, a case
 * (patient code + surgery date) the same case fields, a site (case + tooth + location) the same
 * site fields, a visit (case + interval) the same date and pain; no site appears twice at one
 * interval. Returns what would be written and every issue, with the file's row numbers.
 */
export async function buildImportPlan(table: Pick<ImportTable, 'rows' | 'positions'>, knownIntervals: ReadonlySet<string>, onProgress: (fraction: number) => void = () => undefined): Promise<ImportPlan> {
  const issues: ImportIssue[] = [];
  const patients = new Map<string, { first: FirstRow; planned: PlannedPatient }>();
  const cases = new Map<string, { first: FirstRow; planned: PlannedCase }>();
  const sites = new Map<string, { first: FirstRow; planned: PlannedSite }>();
  const visits = new Map<string, { first: FirstRow; planned: PlannedVisit }>();
  const siteAtInterval = new Map<string, number>();
  const checkRow = importRowChecker();
  const { rows, positions } = table;

  for (let index = 0; index < rows.length; index += 1) {
    if (index > 0 && index % ROWS_PER_PAUSE === 0) {
      onProgress(index / rows.length);
      await new Promise<void>((resolve) => setImmediate(resolve));
    }
    const { row, cells } = rows[index];
    const checked = checkRow((column) => {
      const position = positions.get(column);
      return position === undefined ? undefined : cells[position];
    });
    for (const issue of checked.issues) issues.push({ row, ...issue });
    if (checked.row === null) continue;
    const parsed = checked.row;
    if (parsed.interval_key !== null && !knownIntervals.has(parsed.interval_key)) {
      issues.push({ row, column: 'interval_key', message: `Unknown interval: use a key of the practice's recall schedules (${[...knownIntervals].join(', ')}).` });
      continue;
    }
    const issuesBefore = issues.length;

    const patientEntry = patients.get(parsed.patient_code);
    if (patientEntry) checkSame(patientEntry.first, parsed, row, IMPORT_PATIENT_COLUMNS, 'one patient code', issues);
    const caseKey = `${parsed.patient_code}|${parsed.surgery_date}`;
    const caseEntry = cases.get(caseKey);
    if (caseEntry) checkSame(caseEntry.first, parsed, row, IMPORT_CASE_COLUMNS, 'one case (patient code and surgery date)', issues);
    const siteKey = `${caseKey}|${parsed.tooth}|${parsed.site_location}`;
    const siteEntry = sites.get(siteKey);
    if (siteEntry) checkSame(siteEntry.first, parsed, row, IMPORT_SITE_COLUMNS, 'one site (case, tooth and location)', issues);
    const intervalKey = `${siteKey}|${parsed.interval_key ?? ''}`;
    const earlier = siteAtInterval.get(intervalKey);
    if (earlier !== undefined) {
      issues.push({
        row,
        column: 'interval_key',
        message: parsed.interval_key === null ? `Row ${earlier} already lists this site without a visit.` : `Row ${earlier} already has this site at this interval: each site is measured once per visit.`,
      });
    }
    const visitKey = `${caseKey}|${parsed.interval_key ?? ''}`;
    const visitEntry = parsed.interval_key === null ? undefined : visits.get(visitKey);
    if (visitEntry) checkSame(visitEntry.first, parsed, row, IMPORT_VISIT_COLUMNS, 'one visit (case and interval)', issues);
    if (issues.length > issuesBefore) continue;

    // The row is consistent with what came before: add what it brings.
    siteAtInterval.set(intervalKey, row);
    patientEntry?.planned.rows.push(row);
    caseEntry?.planned.rows.push(row);
    siteEntry?.planned.rows.push(row);
    const first: FirstRow = { row, parsed };
    const patient =
      patientEntry?.planned ??
      (() => {
        const planned: PlannedPatient = {
          row,
          rows: [row],
          code: parsed.patient_code,
          birthYear: parsed.birth_year,
          sex: parsed.sex,
          smoking: parsed.smoking,
          cigarettesPerDay: parsed.cigarettes_per_day,
          diabetes: parsed.diabetes,
          phenotype: parsed.phenotype,
          phenotypeMethod: parsed.phenotype_method,
          cases: [],
        };
        patients.set(parsed.patient_code, { first, planned });
        return planned;
      })();
    const surgicalCase =
      caseEntry?.planned ??
      (() => {
        const planned: PlannedCase = {
          row,
          rows: [row],
          surgeryDate: parsed.surgery_date,
          operatorEmail: parsed.operator_email,
          procedure: parsed.procedure,
          indication: parsed.indication,
          instrument: parsed.instrument,
          sites: [],
          visits: [],
        };
        cases.set(caseKey, { first, planned });
        patient.cases.push(planned);
        return planned;
      })();
    const site =
      siteEntry?.planned ??
      (() => {
        const planned: PlannedSite = {
          row,
          rows: [row],
          tooth: parsed.tooth,
          location: parsed.site_location,
          referencePoint: parsed.reference_point,
          baselineRefGm: parsed.baseline_ref_gm,
          postOpRefGm: parsed.post_op_ref_gm,
          ktWidth: parsed.kt_width,
          marginToCrest: parsed.margin_to_crest,
          papillaScore: parsed.baseline_papilla,
        };
        sites.set(siteKey, { first, planned });
        surgicalCase.sites.push(planned);
        return planned;
      })();
    if (parsed.interval_key === null || parsed.visit_date === null || parsed.recall_ref_gm === null) continue;
    let visit = visitEntry?.planned;
    if (!visit) {
      visit = { row, intervalKey: parsed.interval_key, visitDate: parsed.visit_date, pain: parsed.pain, measurements: [] };
      visits.set(visitKey, { first, planned: visit });
      surgicalCase.visits.push(visit);
    }
    visit.measurements.push({ row, site, refGm: parsed.recall_ref_gm, papillaScore: parsed.recall_papilla, bleedingOnProbing: parsed.bleeding_on_probing });
  }
  onProgress(1);
  for (const { planned } of cases.values()) {
    // The same limit as a case registered in the app.
    if (planned.sites.length > MAX_SITES_PER_CASE) issues.push({ row: planned.row, column: 'tooth', message: `A case may have at most ${MAX_SITES_PER_CASE} sites; this one has ${planned.sites.length}.` });
  }
  const planned = [...patients.values()].map((entry) => entry.planned);
  return {
    patients: planned,
    counts: { patients: planned.length, cases: cases.size, sites: sites.size, visits: visits.size },
    issues,
  };
}
