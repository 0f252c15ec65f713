import type Database from 'better-sqlite3';
import type { ImportCounts, ImportIssue } from '@tidemark/shared';
import { IMPORT_PATIENT_COLUMNS } from '@tidemark/shared';
import type { ImportPlan, PlannedPatient, PlannedSite } from './import-plan';

/** The outcome of a write: the counts written, or every issue that stopped it (nothing written). */
export type ImportWriteResult = { isWritten: true; counts: ImportCounts } | { isWritten: false; issues: ImportIssue[] };

/** Carries the issues out of the transaction function, which rolls back on any throw. */
class ImportRejected extends Error {
  constructor(readonly issues: ImportIssue[]) {
    super('The import was rejected.');
  }
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

/** SQLite allows 999 bound parameters in older builds; stay well under. */
const CHUNK = 500;

function chunks<T>(values: readonly T[]): T[][] {
  const parts: T[][] = [];
  for (let index = 0; index < values.length; index += CHUNK) parts.push(values.slice(index, index + CHUNK));
  return parts;
}

function placeholders(count: number): string {
  return Array.from({ length: count }, () => '?').join(', ');
}

type StoredRow = Record<string, string | number | null>;

/** Checks that need the database, on the same snapshot the inserts will see. */
function databaseIssues(db: Database.Database, plan: ImportPlan, operatorIds: Map<string, number>, existingPatients: Map<string, StoredRow>): ImportIssue[] {
  const issues: ImportIssue[] = [];
  const emails = [...new Set(plan.patients.flatMap((patient) => patient.cases.map((found) => found.operatorEmail)))];
  for (const part of chunks(emails)) {
    const found = db.prepare<string[], { id: number; email: string }>(`SELECT id, email FROM "user" WHERE active = 1 AND role IN ('clinician', 'audit_lead') AND email IN (${placeholders(part.length)})`).all(...part);
    for (const user of found) operatorIds.set(user.email, user.id);
  }
  const codes = plan.patients.map((patient) => patient.code);
  for (const part of chunks(codes)) {
    const found = db.prepare<string[], StoredRow>(`SELECT * FROM patient WHERE code IN (${placeholders(part.length)})`).all(...part);
    for (const patient of found) existingPatients.set(String(patient.code), patient);
  }
  const existingCases = new Map<string, Set<number>>();
  const patientIds = [...existingPatients.values()].map((patient) => Number(patient.id));
  for (const part of chunks(patientIds)) {
    const found = db
      .prepare<number[], { patient_id: number; surgery_date: string; tooth: number | null }>(
        `SELECT c.patient_id, c.surgery_date, s.tooth FROM surgical_case c LEFT JOIN site s ON s.case_id = c.id WHERE c.patient_id IN (${placeholders(part.length)})`,
      )
      .all(...part);
    for (const row of found) {
      const key = `${row.patient_id}|${row.surgery_date}`;
      const teeth = existingCases.get(key) ?? new Set<number>();
      if (row.tooth !== null) teeth.add(row.tooth);
      existingCases.set(key, teeth);
    }
  }
  for (const patient of plan.patients) {
    const stored = existingPatients.get(patient.code);
    if (stored) {
      for (const [column, { column: dbColumn, of }] of Object.entries(PATIENT_DB_COLUMNS)) {
        if (stored[dbColumn] !== of(patient)) issues.push({ row: patient.row, column, message: 'Differs from the patient already recorded in Tidemark under this code.' });
      }
    }
    for (const surgicalCase of patient.cases) {
      if (!operatorIds.has(surgicalCase.operatorEmail)) {
        for (const row of surgicalCase.rows) issues.push({ row, column: 'operator_email', message: 'No active clinician or audit lead signs in with this e-mail.' });
      }
      const teeth = stored ? existingCases.get(`${stored.id}|${surgicalCase.surgeryDate}`) : undefined;
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

/**
 * Writes a checked plan in ONE immediate transaction on the better-sqlite3 connection: the
 * database checks (operators, patients already recorded, duplicate cases and teeth) run inside
 * it, and any issue — from the file or the database — rolls everything back. Cases are stored
 * operated, or in recall when they have a visit; visits are examined by the case's operator.
 * A process killed mid-way leaves no trace: SQLite discards the uncommitted transaction.
 *
 * @param onProgress called synchronously every 1,000 rows written (0–1)
 */
export function writeImportPlan(db: Database.Database, plan: ImportPlan, importedById: number, onProgress: (fraction: number) => void = () => undefined): ImportWriteResult {
  const insertPatient = db.prepare(
    'INSERT INTO patient (code, birth_year, sex, smoking, cigarettes_per_day, diabetes, phenotype, phenotype_method, created_by_id, version) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, 1)',
  );
  const insertCase = db.prepare(
    'INSERT INTO surgical_case (patient_id, operator_id, surgery_date, procedure, indication, instrument, hygiene_phase_complete, status, created_by_id, version) VALUES (?, ?, ?, ?, ?, ?, 0, ?, ?, 1)',
  );
  const insertSite = db.prepare(
    'INSERT INTO site (case_id, tooth, location, reference_point, baseline_ref_gm, kt_width, margin_to_crest, papilla_score, post_op_ref_gm, version) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, 1)',
  );
  const insertVisit = db.prepare('INSERT INTO visit (case_id, interval_key, visit_date, examiner_id, pain, version) VALUES (?, ?, ?, ?, ?, 1)');
  const insertMeasurement = db.prepare('INSERT INTO site_measurement (visit_id, site_id, ref_gm, bleeding_on_probing, papilla_score) VALUES (?, ?, ?, ?, ?)');
  const totalRows = Math.max(1, plan.patients.reduce((sum, patient) => sum + patient.rows.length, 0));

  const write = db.transaction((): ImportCounts => {
    const operatorIds = new Map<string, number>();
    const existingPatients = new Map<string, StoredRow>();
    const issues = [...plan.issues, ...databaseIssues(db, plan, operatorIds, existingPatients)];
    if (issues.length) throw new ImportRejected(issues);
    const counts: ImportCounts = { patients: 0, cases: 0, sites: 0, visits: 0 };
    let rowsWritten = 0;
    for (const patient of plan.patients) {
      let patientId = Number(existingPatients.get(patient.code)?.id ?? 0);
      if (!patientId) {
        const { code, birthYear, sex, smoking, cigarettesPerDay, diabetes, phenotype, phenotypeMethod } = patient;
        patientId = Number(insertPatient.run(code, birthYear, sex, smoking, cigarettesPerDay, diabetes, phenotype, phenotypeMethod, importedById).lastInsertRowid);
        counts.patients += 1;
      }
      for (const surgicalCase of patient.cases) {
        const operatorId = operatorIds.get(surgicalCase.operatorEmail) ?? 0;
        const status = surgicalCase.visits.length ? 'in-recall' : 'operated';
        const caseId = Number(
          insertCase.run(patientId, operatorId, surgicalCase.surgeryDate, surgicalCase.procedure, surgicalCase.indication, surgicalCase.instrument, status, importedById).lastInsertRowid,
        );
        counts.cases += 1;
        const siteIds = new Map<PlannedSite, number>();
        for (const site of surgicalCase.sites) {
          siteIds.set(site, Number(insertSite.run(caseId, site.tooth, site.location, site.referencePoint, site.baselineRefGm, site.ktWidth, site.marginToCrest, site.papillaScore, site.postOpRefGm).lastInsertRowid));
          counts.sites += 1;
        }
        for (const visit of surgicalCase.visits) {
          const visitId = Number(insertVisit.run(caseId, visit.intervalKey, visit.visitDate, operatorId, visit.pain).lastInsertRowid);
          counts.visits += 1;
          for (const measurement of visit.measurements) {
            const bleeding = measurement.bleedingOnProbing === null ? null : measurement.bleedingOnProbing ? 1 : 0;
            insertMeasurement.run(visitId, siteIds.get(measurement.site), measurement.refGm, bleeding, measurement.papillaScore);
          }
        }
        rowsWritten += surgicalCase.rows.length;
        if (rowsWritten % 1000 < surgicalCase.rows.length) onProgress(rowsWritten / totalRows);
      }
    }
    return counts;
  });

  try {
    return { isWritten: true, counts: write.immediate() };
  } catch (error) {
    if (error instanceof ImportRejected) return { isWritten: false, issues: error.issues };
    throw error;
  }
}
