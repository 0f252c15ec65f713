import type Database from 'better-sqlite3';
import type { ImportCounts, ImportIssue } from '@tidemark/shared';
import { groupStoredCases, importDatabaseIssues, plannedOperatorEmails, type ImportWriteResult, type StoredImportState, type StoredRow } from './import-database-checks';
import type { ImportPlan, PlannedSite } from './import-plan';

export type { ImportWriteResult } from './import-database-checks';

/** Carries the issues out of the transaction function, which rolls back on any throw. */
class ImportRejected extends Error {
  constructor(readonly issues: ImportIssue[]) {
    super('The import was rejected.');
  }
}

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

/** Reads what the plan touches, on the same snapshot the inserts will see. */
function storedState(db: Database.Database, plan: ImportPlan): StoredImportState {
  const operatorIds = new Map<string, number>();
  for (const part of chunks(plannedOperatorEmails(plan))) {
    const found = db.prepare<string[], { id: number; email: string }>(`SELECT id, email FROM "user" WHERE active = 1 AND role IN ('clinician', 'audit_lead') AND email IN (${placeholders(part.length)})`).all(...part);
    for (const user of found) operatorIds.set(user.email, user.id);
  }
  const existingPatients = new Map<string, StoredRow>();
  for (const part of chunks(plan.patients.map((patient) => patient.code))) {
    const found = db.prepare<string[], StoredRow>(`SELECT * FROM patient WHERE code IN (${placeholders(part.length)})`).all(...part);
    for (const patient of found) existingPatients.set(String(patient.code), patient);
  }
  const caseRows: { patient_id: number; surgery_date: string; tooth: number | null }[] = [];
  for (const part of chunks([...existingPatients.values()].map((patient) => Number(patient.id)))) {
    caseRows.push(
      ...db
        .prepare<number[], { patient_id: number; surgery_date: string; tooth: number | null }>(
          `SELECT c.patient_id, c.surgery_date, s.tooth FROM surgical_case c LEFT JOIN site s ON s.case_id = c.id WHERE c.patient_id IN (${placeholders(part.length)})`,
        )
        .all(...part),
    );
  }
  return { operatorIds, existingPatients, existingCases: groupStoredCases(caseRows) };
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
    const stored = storedState(db, plan);
    const { operatorIds, existingPatients } = stored;
    const issues = [...plan.issues, ...importDatabaseIssues(plan, stored)];
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
