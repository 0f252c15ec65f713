import type { ImportCounts, ImportIssue } from '@tidemark/shared';
import { IMPORT_PATIENT_COLUMNS } from '@tidemark/shared';
import type { ImportPlan, PlannedPatient } from './import-plan';

/** The outcome of a write: the counts written, or every issue that stopped it (nothing written). */
export type ImportWriteResult = { isWritten: true; counts: ImportCounts } | { isWritten: false; issues: ImportIssue[] };

/** A stored row as the driver returns it. */
export type StoredRow = Record<string, unknown>;

/**
 * What the database already holds that the plan touches, read inside the write transaction:
 * active operators by e-mail, patients by code, and the teeth of each stored case keyed by
 * `patientId|surgeryDate`.
 */
export interface StoredImportState {
  operatorIds: Map<string, number>;
  existingPatients: Map<string, StoredRow>;
  existingCases: Map<string, Set<number>>;
}

/** Patient columns as stored, keyed by the import's column names. */
const PATIENT_DB_COLUMNS: Readonly<Record<(typeof IMPORT_PATIENT_COLUMNS)[number], { column: string; of: (patient: PlannedPatient) => string | number | null }>> = {
  birth_year: { column: 'birth_year', of: (patient) => patient.birthYear },
  sex: { column: 'sex', of: (patient) => patient.sex },
  smoking: { column: 'smoking', of: (patient) => patient.smoking },
  cigarettes_per_day: { column: 'cigarettes_per_day', of: (patient) => patient.cigarettesPerDay },
  diabetes: { column: 'diabetes', of: (patient) => patient.diabetes },
  phenotype: { column: 'phenotype', of: (patient) => patient.phenotype },
  phenotype_method: { column: 'phenotype_method', of: (patient) => patient.phenotypeMethod },
};

/** Operator e-mails the plan names, once each. */
export function plannedOperatorEmails(plan: ImportPlan): string[] {
  return [...new Set(plan.patients.flatMap((patient) => patient.cases.map((found) => found.operatorEmail)))];
}

/** The key of {@link StoredImportState.existingCases}. */
export function storedCaseKey(patientId: unknown, surgeryDate: unknown): string {
  return `${Number(patientId)}|${String(surgeryDate)}`;
}

/** Folds `(patient_id, surgery_date, tooth)` rows of stored cases (tooth null: a case without sites) into teeth per case. */
export function groupStoredCases(rows: readonly { patient_id: unknown; surgery_date: unknown; tooth: unknown }[]): Map<string, Set<number>> {
  const cases = new Map<string, Set<number>>();
  for (const row of rows) {
    const key = storedCaseKey(row.patient_id, row.surgery_date);
    const teeth = cases.get(key) ?? new Set<number>();
    if (row.tooth !== null) teeth.add(Number(row.tooth));
    cases.set(key, teeth);
  }
  return cases;
}

/**
 * The issues only the database can find: a patient code already recorded with other fields, an
 * operator who does not sign in as an active clinician or audit lead, and a case that exists
 * already (same patient and surgery date; the import adds whole new cases only).
 */
export function importDatabaseIssues(plan: ImportPlan, stored: StoredImportState): ImportIssue[] {
  const issues: ImportIssue[] = [];
  for (const patient of plan.patients) {
    const existing = stored.existingPatients.get(patient.code);
    if (existing) {
      for (const [column, { column: dbColumn, of }] of Object.entries(PATIENT_DB_COLUMNS)) {
        if (existing[dbColumn] !== of(patient)) issues.push({ row: patient.row, column, message: 'Differs from the patient already recorded in Tidemark under this code.' });
      }
    }
    for (const surgicalCase of patient.cases) {
      if (!stored.operatorIds.has(surgicalCase.operatorEmail)) {
        for (const row of surgicalCase.rows) issues.push({ row, column: 'operator_email', message: 'No active clinician or audit lead signs in with this e-mail.' });
      }
      const teeth = existing ? stored.existingCases.get(storedCaseKey(existing.id, surgicalCase.surgeryDate)) : undefined;
      if (!teeth) continue;
      const duplicates = surgicalCase.sites.filter((site) => teeth.has(site.tooth));
      for (const site of duplicates) {
        for (const row of site.rows) issues.push({ row, column: 'tooth', message: `Already recorded: this patient's tooth ${site.tooth} in a case operated on this date.` });
      }
      if (duplicates.length === 0) issues.push({ row: surgicalCase.row, column: 'surgery_date', message: 'This patient already has a case on this surgery date; the import adds whole new cases only.' });
    }
  }
  return issues;
}
