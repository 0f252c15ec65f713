import * as z from 'zod';
import {
  DIABETES_LABELS,
  INDICATION_LABELS,
  INSTRUMENT_LABELS,
  PHENOTYPE_LABELS,
  PHENOTYPE_METHOD_LABELS,
  PROCEDURE_LABELS,
  REFERENCE_POINT_LABELS,
  SEX_LABELS,
  SITE_LOCATION_LABELS,
  SMOKING_LABELS,
} from '../types/clinical-terms';
import { emailSchema } from './user';
import { fdiTooth, millimetres, papillaScore, pastOrTodayDate, zeroToTen } from './clinical-fields';
import { caseCreateSchema, siteFieldsSchema } from './case';
import { patientCreateSchema } from './patient';

/**
 * Historical import: one row per site per recall visit ("long" format). A row without an
 * interval key records a site with no visit. Column names are ours; the template files
 * (`GET /api/imports/template.xlsx|csv`) carry exactly these headers.
 */
export const IMPORT_COLUMNS = [
  // the patient
  ...['patient_code', 'birth_year', 'sex', 'smoking', 'cigarettes_per_day', 'diabetes', 'phenotype', 'phenotype_method'] as const,
  // the case
  ...['operator_email', 'surgery_date', 'procedure', 'indication', 'instrument'] as const,
  // the site and its baseline and surgical readings
  ...['tooth', 'site_location', 'reference_point', 'baseline_ref_gm', 'post_op_ref_gm', 'kt_width', 'margin_to_crest', 'baseline_papilla'] as const,
  // the visit and the site's readings at it
  ...['interval_key', 'visit_date', 'recall_ref_gm', 'recall_papilla', 'bleeding_on_probing', 'pain'] as const,
] as const;
export type ImportColumn = (typeof IMPORT_COLUMNS)[number];

/** Columns a file may leave out altogether (every value then counts as blank). */
export const OPTIONAL_IMPORT_COLUMNS: ReadonlySet<ImportColumn> = new Set<ImportColumn>(['cigarettes_per_day', 'post_op_ref_gm', 'kt_width', 'margin_to_crest', 'baseline_papilla', 'recall_papilla', 'bleeding_on_probing', 'pain']);

/** Columns that describe the patient: every row of one patient code must agree on them. */
export const IMPORT_PATIENT_COLUMNS = ['birth_year', 'sex', 'smoking', 'cigarettes_per_day', 'diabetes', 'phenotype', 'phenotype_method'] as const;
/** Columns that describe the case (patient code + surgery date): every row of one case must agree. */
export const IMPORT_CASE_COLUMNS = ['operator_email', 'procedure', 'indication', 'instrument'] as const;
/** Columns that describe a site (case + tooth + location). */
export const IMPORT_SITE_COLUMNS = ['reference_point', 'baseline_ref_gm', 'post_op_ref_gm', 'kt_width', 'margin_to_crest', 'baseline_papilla'] as const;
/** Columns that describe a visit (case + interval key). */
export const IMPORT_VISIT_COLUMNS = ['visit_date', 'pain'] as const;

/** A blank cell (absent, empty or only spaces) becomes null, so `.nullable()` schemas accept it. */
function blankToNull(value: unknown): unknown {
  if (value === undefined || value === null) return null;
  if (typeof value === 'string' && value.trim() === '') return null;
  return value;
}

/** Text cells: spreadsheets may hand over numbers (a code such as 1234) or booleans. */
function textCell(value: unknown): unknown {
  const blank = blankToNull(value);
  if (typeof blank === 'number' || typeof blank === 'boolean') return String(blank);
  return typeof blank === 'string' ? blank.trim() : blank;
}

/** CSV gives text: "7.5" becomes 7.5; anything that is not a plain decimal is left for the schema to reject. */
function numberCell(value: unknown): unknown {
  const blank = blankToNull(value);
  if (typeof blank === 'string' && /^[+-]?(\d+(\.\d*)?|\.\d+)$/.test(blank.trim())) return Number(blank.trim());
  return blank;
}

/** A date typed into a spreadsheet arrives as a Date at UTC midnight; text stays as written. */
function dateCell(value: unknown): unknown {
  const blank = blankToNull(value);
  if (blank instanceof Date) return Number.isNaN(blank.getTime()) ? 'invalid' : blank.toISOString().slice(0, 10);
  return textCell(blank);
}

/** Yes/no cells in the forms people write them. */
function yesNoCell(value: unknown): unknown {
  const blank = textCell(value);
  if (typeof blank !== 'string') return blank;
  const word = blank.toLowerCase();
  if (['yes', 'y', 'true', '1'].includes(word)) return true;
  if (['no', 'n', 'false', '0'].includes(word)) return false;
  return blank;
}

/** A controlled term: its key (`thick`) or its label (`Thick (> 1 mm)`), in any letter case. */
function termCell(labels: Readonly<Record<string, string>>): (value: unknown) => unknown {
  const byWord = new Map<string, string>();
  for (const [key, label] of Object.entries(labels)) {
    byWord.set(key.toLowerCase(), key);
    byWord.set(label.toLowerCase(), key);
  }
  return (value) => {
    const blank = textCell(value);
    return typeof blank === 'string' ? (byWord.get(blank.toLowerCase()) ?? blank) : blank;
  };
}

const patient = patientCreateSchema.shape;
const surgicalCase = caseCreateSchema.shape;
const site = siteFieldsSchema.shape;

/** Each column's schema: the shared field schemas, after turning spreadsheet or CSV cells into values. */
export const IMPORT_FIELD_SCHEMAS = {
  patient_code: z.preprocess(textCell, patient.code),
  birth_year: z.preprocess(numberCell, patient.birthYear),
  sex: z.preprocess(termCell(SEX_LABELS), patient.sex),
  smoking: z.preprocess(termCell(SMOKING_LABELS), patient.smoking),
  cigarettes_per_day: z.preprocess(numberCell, patient.cigarettesPerDay),
  diabetes: z.preprocess(termCell(DIABETES_LABELS), patient.diabetes),
  phenotype: z.preprocess(termCell(PHENOTYPE_LABELS), patient.phenotype),
  phenotype_method: z.preprocess(termCell(PHENOTYPE_METHOD_LABELS), patient.phenotypeMethod),
  operator_email: z.preprocess(textCell, emailSchema),
  // A historical import records operated cases, so the surgery cannot lie in the future.
  surgery_date: z.preprocess(dateCell, pastOrTodayDate),
  procedure: z.preprocess(termCell(PROCEDURE_LABELS), surgicalCase.procedure),
  indication: z.preprocess(termCell(INDICATION_LABELS), surgicalCase.indication),
  instrument: z.preprocess(termCell(INSTRUMENT_LABELS), surgicalCase.instrument),
  // CSV cells are text: "11" must become the number 11 before the FDI check.
  tooth: z.preprocess(numberCell, fdiTooth),
  site_location: z.preprocess(termCell(SITE_LOCATION_LABELS), site.location),
  reference_point: z.preprocess(termCell(REFERENCE_POINT_LABELS), site.referencePoint),
  baseline_ref_gm: z.preprocess(numberCell, site.baselineRefGm),
  post_op_ref_gm: z.preprocess(numberCell, site.postOpRefGm),
  kt_width: z.preprocess(numberCell, site.ktWidth),
  margin_to_crest: z.preprocess(numberCell, site.marginToCrest),
  baseline_papilla: z.preprocess(numberCell, site.papillaScore),
  interval_key: z.preprocess(textCell, z.string().max(20, 'Use at most 20 characters.').nullable()),
  visit_date: z.preprocess(dateCell, pastOrTodayDate.nullable()),
  recall_ref_gm: z.preprocess(numberCell, millimetres.nullable()),
  recall_papilla: z.preprocess(numberCell, papillaScore.nullable()),
  bleeding_on_probing: z.preprocess(yesNoCell, z.boolean({ message: 'Write yes or no.' }).nullable()),
  pain: z.preprocess(numberCell, zeroToTen.nullable()),
} satisfies Record<ImportColumn, z.ZodType>;

/** One checked row; keys are the column names. */
export type ImportRow = { [K in ImportColumn]: z.output<(typeof IMPORT_FIELD_SCHEMAS)[K]> };
/** A row as read from a file: the cell of a column (undefined when the file has no such column). */
export type ImportRowCells = (column: ImportColumn) => unknown;
/** A row whose fields were checked one by one: undefined where a field failed. */
type ImportRowDraft = { [K in ImportColumn]: ImportRow[K] | undefined };

const ISO_DATE = /^\d{4}-\d{2}-\d{2}$/;

/** Visit columns that must stay blank on a row without an interval key. */
const VISIT_ONLY_COLUMNS = ['visit_date', 'recall_ref_gm', 'recall_papilla', 'bleeding_on_probing', 'pain'] as const;

/**
 * The rules that tie a row's own fields together: cigarettes a day for a current smoker only; a
 * visit (interval key) needs its date and REF→GM, on or after the surgery; a row without an
 * interval key carries no visit values. A rule is skipped when a field it reads has failed its own
 * check (that field already has a message). Rules that need other rows or the database
 * (consistency, duplicates, operators, schedule keys) are the server's.
 */
export function importRowRules(row: ImportRowDraft, report: (column: ImportColumn, message: string) => void): void {
  if (row.smoking !== undefined && row.cigarettes_per_day !== undefined && (row.smoking === 'current') !== (row.cigarettes_per_day !== null)) {
    report('cigarettes_per_day', 'Give cigarettes a day for a current smoker, and only then.');
  }
  if (row.interval_key === undefined) return;
  if (row.interval_key === null) {
    for (const column of VISIT_ONLY_COLUMNS) {
      if (row[column] !== undefined && row[column] !== null) report(column, 'Leave blank when the row has no interval_key (no visit).');
    }
    return;
  }
  if (row.visit_date === null) report('visit_date', 'A visit needs its date.');
  else if (row.visit_date !== undefined && row.surgery_date !== undefined && ISO_DATE.test(row.visit_date) && row.visit_date < row.surgery_date) {
    report('visit_date', 'The visit cannot come before the surgery.');
  }
  if (row.recall_ref_gm === null) report('recall_ref_gm', 'A visit needs the REF→GM reading (mm).');
}

/** The outcome of checking one row: the row when every field and rule passed, and every issue. */
export interface ImportRowCheck {
  row: ImportRow | null;
  issues: { column: ImportColumn; message: string }[];
}

/** A field's answer for one cell value. */
type FieldAnswer<T> = { isValid: true; value: T } | { isValid: false; messages: string[] };

/** A field check that remembers its answers: a file repeats the same values (codes, dates, terms) row after row. */
class RememberingField<T> {
  // One map per kind of cell, so that the number 11 and the text "11" stay apart without building keys.
  private readonly byText = new Map<string, FieldAnswer<T>>();
  private readonly byNumber = new Map<number, FieldAnswer<T>>();
  /** Dates by their time: two Date objects for one day are one value. */
  private readonly byTime = new Map<number, FieldAnswer<T>>();
  private readonly byOther = new Map<unknown, FieldAnswer<T>>();

  constructor(private readonly schema: z.ZodType<T>) {}

  check(cell: unknown): FieldAnswer<T> {
    if (typeof cell === 'string') return this.remember(this.byText, cell, cell);
    if (typeof cell === 'number') return this.remember(this.byNumber, cell, cell);
    if (cell instanceof Date) return this.remember(this.byTime, cell.getTime(), cell);
    return this.remember(this.byOther, cell, cell);
  }

  private remember<K>(answers: Map<K, FieldAnswer<T>>, key: K, cell: unknown): FieldAnswer<T> {
    let answer = answers.get(key);
    if (answer === undefined) {
      const result = this.schema.safeParse(cell);
      answer = result.success ? { isValid: true, value: result.data } : { isValid: false, messages: result.error.issues.map((issue) => issue.message) };
      answers.set(key, answer);
    }
    return answer;
  }
}

function isComplete(draft: ImportRowDraft): draft is ImportRow {
  return IMPORT_COLUMNS.every((column) => draft[column] !== undefined);
}

/**
 * A checker for the rows of one file: each column through its field schema (answers remembered
 * for repeated values, which makes a 10,000-row file several times faster), then the row's rules.
 * Make one per file: "not in the future" is decided against today's date.
 */
export function importRowChecker(): (cells: ImportRowCells) => ImportRowCheck {
  const fields = {
    patient_code: new RememberingField(IMPORT_FIELD_SCHEMAS.patient_code),
    birth_year: new RememberingField(IMPORT_FIELD_SCHEMAS.birth_year),
    sex: new RememberingField(IMPORT_FIELD_SCHEMAS.sex),
    smoking: new RememberingField(IMPORT_FIELD_SCHEMAS.smoking),
    cigarettes_per_day: new RememberingField(IMPORT_FIELD_SCHEMAS.cigarettes_per_day),
    diabetes: new RememberingField(IMPORT_FIELD_SCHEMAS.diabetes),
    phenotype: new RememberingField(IMPORT_FIELD_SCHEMAS.phenotype),
    phenotype_method: new RememberingField(IMPORT_FIELD_SCHEMAS.phenotype_method),
    operator_email: new RememberingField(IMPORT_FIELD_SCHEMAS.operator_email),
    surgery_date: new RememberingField(IMPORT_FIELD_SCHEMAS.surgery_date),
    procedure: new RememberingField(IMPORT_FIELD_SCHEMAS.procedure),
    indication: new RememberingField(IMPORT_FIELD_SCHEMAS.indication),
    instrument: new RememberingField(IMPORT_FIELD_SCHEMAS.instrument),
    tooth: new RememberingField(IMPORT_FIELD_SCHEMAS.tooth),
    site_location: new RememberingField(IMPORT_FIELD_SCHEMAS.site_location),
    reference_point: new RememberingField(IMPORT_FIELD_SCHEMAS.reference_point),
    baseline_ref_gm: new RememberingField(IMPORT_FIELD_SCHEMAS.baseline_ref_gm),
    post_op_ref_gm: new RememberingField(IMPORT_FIELD_SCHEMAS.post_op_ref_gm),
    kt_width: new RememberingField(IMPORT_FIELD_SCHEMAS.kt_width),
    margin_to_crest: new RememberingField(IMPORT_FIELD_SCHEMAS.margin_to_crest),
    baseline_papilla: new RememberingField(IMPORT_FIELD_SCHEMAS.baseline_papilla),
    interval_key: new RememberingField(IMPORT_FIELD_SCHEMAS.interval_key),
    visit_date: new RememberingField(IMPORT_FIELD_SCHEMAS.visit_date),
    recall_ref_gm: new RememberingField(IMPORT_FIELD_SCHEMAS.recall_ref_gm),
    recall_papilla: new RememberingField(IMPORT_FIELD_SCHEMAS.recall_papilla),
    bleeding_on_probing: new RememberingField(IMPORT_FIELD_SCHEMAS.bleeding_on_probing),
    pain: new RememberingField(IMPORT_FIELD_SCHEMAS.pain),
  } satisfies { [K in ImportColumn]: RememberingField<ImportRow[K]> };
  let cells: ImportRowCells = () => undefined;
  let issues: ImportRowCheck['issues'] = [];
  // Defined once, not per row: the checker runs for every row of a large file.
  const field = <T>(column: ImportColumn, checker: RememberingField<T>): T | undefined => {
    const answer = checker.check(cells(column));
    if (answer.isValid) return answer.value;
    for (const message of answer.messages) issues.push({ column, message });
    return undefined;
  };
  const report = (column: ImportColumn, message: string): void => {
    issues.push({ column, message });
  };
  return (rowCells) => {
    cells = rowCells;
    issues = [];
    const draft: ImportRowDraft = {
      patient_code: field('patient_code', fields.patient_code),
      birth_year: field('birth_year', fields.birth_year),
      sex: field('sex', fields.sex),
      smoking: field('smoking', fields.smoking),
      cigarettes_per_day: field('cigarettes_per_day', fields.cigarettes_per_day),
      diabetes: field('diabetes', fields.diabetes),
      phenotype: field('phenotype', fields.phenotype),
      phenotype_method: field('phenotype_method', fields.phenotype_method),
      operator_email: field('operator_email', fields.operator_email),
      surgery_date: field('surgery_date', fields.surgery_date),
      procedure: field('procedure', fields.procedure),
      indication: field('indication', fields.indication),
      instrument: field('instrument', fields.instrument),
      tooth: field('tooth', fields.tooth),
      site_location: field('site_location', fields.site_location),
      reference_point: field('reference_point', fields.reference_point),
      baseline_ref_gm: field('baseline_ref_gm', fields.baseline_ref_gm),
      post_op_ref_gm: field('post_op_ref_gm', fields.post_op_ref_gm),
      kt_width: field('kt_width', fields.kt_width),
      margin_to_crest: field('margin_to_crest', fields.margin_to_crest),
      baseline_papilla: field('baseline_papilla', fields.baseline_papilla),
      interval_key: field('interval_key', fields.interval_key),
      visit_date: field('visit_date', fields.visit_date),
      recall_ref_gm: field('recall_ref_gm', fields.recall_ref_gm),
      recall_papilla: field('recall_papilla', fields.recall_papilla),
      bleeding_on_probing: field('bleeding_on_probing', fields.bleeding_on_probing),
      pain: field('pain', fields.pain),
    };
    importRowRules(draft, report);
    return { row: issues.length === 0 && isComplete(draft) ? draft : null, issues };
  };
}

/**
 * One import row as a zod schema (for forms and previews): the field schemas and the row rules of
 * {@link importRowChecker}, with issues on the column's path.
 */
export const importRowSchema = z.record(z.string(), z.unknown()).transform((cells, context): ImportRow => {
  const check = importRowChecker()((column) => cells[column]);
  for (const issue of check.issues) context.addIssue({ code: 'custom', message: issue.message, path: [issue.column] });
  return check.row ?? z.NEVER;
});

/** What each column holds, for the template's guide and the import page. */
export const IMPORT_COLUMN_GUIDE: Readonly<Record<ImportColumn, string>> = {
  patient_code: 'Pseudonymous patient code, 3–20 letters, digits or hyphens (never a name or record number).',
  birth_year: 'Year of birth, e.g. 1978.',
  sex: `One of: ${Object.keys(SEX_LABELS).join(', ')}.`,
  smoking: `One of: ${Object.keys(SMOKING_LABELS).join(', ')}.`,
  cigarettes_per_day: 'Cigarettes a day, 1–100; only for a current smoker.',
  diabetes: `One of: ${Object.keys(DIABETES_LABELS).join(', ')}.`,
  phenotype: `One of: ${Object.keys(PHENOTYPE_LABELS).join(', ')} (thin when gingival thickness ≤ 1 mm).`,
  phenotype_method: `One of: ${Object.keys(PHENOTYPE_METHOD_LABELS).join(', ')}.`,
  operator_email: 'Sign-in e-mail of the operating clinician or audit lead (an active account).',
  surgery_date: 'Date of surgery, YYYY-MM-DD (or a spreadsheet date); not in the future.',
  procedure: `One of: ${Object.keys(PROCEDURE_LABELS).join(', ')}.`,
  indication: `One of: ${Object.keys(INDICATION_LABELS).join(', ')}.`,
  instrument: `One of: ${Object.keys(INSTRUMENT_LABELS).join(', ')}.`,
  tooth: 'FDI two-digit tooth number (ISO 3950), e.g. 11, 21, 36.',
  site_location: `One of: ${Object.keys(SITE_LOCATION_LABELS).join(', ')}.`,
  reference_point: `One of: ${Object.keys(REFERENCE_POINT_LABELS).join(', ')}.`,
  baseline_ref_gm: 'REF→GM before surgery, mm (0–20 in 0.5 mm steps).',
  post_op_ref_gm: 'REF→GM immediately after surgery, mm; blank when not recorded.',
  kt_width: 'Keratinized tissue width before surgery, mm; may be blank.',
  margin_to_crest: 'Margin to bone crest (sounding), mm; may be blank.',
  baseline_papilla: 'Jemt papilla index 0–4 before surgery; may be blank.',
  interval_key: 'Recall interval key of the practice schedule (e.g. 2w, 6w, 3m, 6m, 12m); blank for a site with no visit.',
  visit_date: 'Date of the recall, YYYY-MM-DD; on or after the surgery, not in the future.',
  recall_ref_gm: 'REF→GM at the recall, mm.',
  recall_papilla: 'Jemt papilla index 0–4 at the recall; may be blank.',
  bleeding_on_probing: 'yes or no; may be blank.',
  pain: 'Patient-reported pain at the recall, 0–10; may be blank.',
};

/** One problem found in an import file: the row as the file numbers it (header = 1) and the column. */
export interface ImportIssue {
  row: number;
  /** A column name of {@link IMPORT_COLUMNS}, another header found in the file, or '' for the whole row or file. */
  column: string;
  message: string;
}

/** What an import adds (or, while validating, what the file holds). */
export interface ImportCounts {
  patients: number;
  cases: number;
  sites: number;
  visits: number;
}

/** Stages of an import job: checking the file, writing it, and how it ended. */
export const IMPORT_JOB_STATES = ['validating', 'importing', 'done', 'failed', 'rejected'] as const;
export type ImportJobState = (typeof IMPORT_JOB_STATES)[number];

/** `GET /api/imports/:jobId`. Every issue is in `errors.csv`; the JSON lists the first {@link IMPORT_ERRORS_SHOWN}. */
export interface ImportJobView {
  state: ImportJobState;
  /** 0–1. */
  progress: number;
  counts: ImportCounts;
  errors: ImportIssue[];
  /** All issues found (may exceed `errors.length`). */
  errorCount: number;
}

/** How many issues the status JSON carries. */
export const IMPORT_ERRORS_SHOWN = 1000;

/** Largest import file, in bytes (10 MB). */
export const IMPORT_MAX_BYTES = 10 * 1024 * 1024;
