import Database from 'better-sqlite3';

/**
 * Read-side checks of the crash-safety and backup tests, run on a fresh connection to the file
 * (which is what recovers a WAL left by a killed writer, as the next server start would).
 */

/** Opens the file, runs `check` and closes it again. */
export function withDatabase<T>(file: string, check: (db: Database.Database) => T): T {
  const db = new Database(file, { fileMustExist: true, timeout: 5000 });
  try {
    return check(db);
  } finally {
    db.close();
  }
}

/** `PRAGMA integrity_check` (expected 'ok') and `PRAGMA foreign_key_check` (expected no rows). */
export function soundness(db: Database.Database): { integrity: string; foreignKeyViolations: unknown[] } {
  return { integrity: String(db.pragma('integrity_check', { simple: true })), foreignKeyViolations: db.pragma('foreign_key_check') as unknown[] };
}

/** Rows of one import batch, found by its patient-code prefix. */
export interface BatchCounts {
  patients: number;
  cases: number;
  sites: number;
  visits: number;
  measurements: number;
}

/** Counts the rows whose patient code starts with `prefix-`, table by table. */
export function batchCounts(db: Database.Database, prefix: string): BatchCounts {
  const count = (sql: string): number => Number(db.prepare<[string], { n: number }>(sql).get(`${prefix}-%`)?.n);
  return {
    patients: count('SELECT COUNT(*) AS n FROM patient WHERE code LIKE ?'),
    cases: count('SELECT COUNT(*) AS n FROM surgical_case c JOIN patient p ON p.id = c.patient_id WHERE p.code LIKE ?'),
    sites: count('SELECT COUNT(*) AS n FROM site s JOIN surgical_case c ON c.id = s.case_id JOIN patient p ON p.id = c.patient_id WHERE p.code LIKE ?'),
    visits: count('SELECT COUNT(*) AS n FROM visit v JOIN surgical_case c ON c.id = v.case_id JOIN patient p ON p.id = c.patient_id WHERE p.code LIKE ?'),
    measurements: count(
      'SELECT COUNT(*) AS n FROM site_measurement m JOIN visit v ON v.id = m.visit_id JOIN surgical_case c ON c.id = v.case_id JOIN patient p ON p.id = c.patient_id WHERE p.code LIKE ?',
    ),
  };
}

/**
 * Everything that would show a recall save cut in half, for the cases of patients whose code
 * starts with `prefix`: a patient without a case, a case without its sites, a visit missing
 * some of its case's sites, a measurement of another case's site, and a case whose status and
 * change log disagree with its visits (the first recall moves it `operated → in-recall` and
 * writes exactly one change record, in the same transaction). Returns one sentence per problem.
 */
export function recallProblems(db: Database.Database, prefix: string, sitesPerCase: number): string[] {
  const like = `${prefix}%`;
  const problems: string[] = [];
  for (const row of db.prepare<[string], { code: string }>('SELECT code FROM patient p WHERE code LIKE ? AND NOT EXISTS (SELECT 1 FROM surgical_case c WHERE c.patient_id = p.id)').all(like)) {
    problems.push(`patient ${row.code} has no case`);
  }
  const cases = db
    .prepare<[string], { id: number; status: string; sites: number; visits: number; logged: number }>(
      `SELECT c.id, c.status,
         (SELECT COUNT(*) FROM site s WHERE s.case_id = c.id) AS sites,
         (SELECT COUNT(*) FROM visit v WHERE v.case_id = c.id) AS visits,
         (SELECT COUNT(*) FROM change_record r WHERE r.entity = 'case' AND r.entity_id = c.id AND r.case_id = c.id AND r.field = 'status' AND r.old_value = 'operated' AND r.new_value = 'in-recall') AS logged
       FROM surgical_case c JOIN patient p ON p.id = c.patient_id WHERE p.code LIKE ?`,
    )
    .all(like);
  for (const found of cases) {
    if (found.sites !== sitesPerCase) problems.push(`case ${found.id} has ${found.sites} of ${sitesPerCase} sites`);
    const expected = found.visits > 0 ? { status: 'in-recall', logged: 1 } : { status: 'operated', logged: 0 };
    if (found.status !== expected.status || found.logged !== expected.logged) {
      problems.push(`case ${found.id}: ${found.visits} visits but status ${found.status} and ${found.logged} "in-recall" change records`);
    }
  }
  const visits = db
    .prepare<[string], { id: number; measured: number; sites: number; foreign: number }>(
      `SELECT v.id,
         (SELECT COUNT(*) FROM site_measurement m WHERE m.visit_id = v.id) AS measured,
         (SELECT COUNT(*) FROM site s WHERE s.case_id = v.case_id) AS sites,
         (SELECT COUNT(*) FROM site_measurement m JOIN site s ON s.id = m.site_id WHERE m.visit_id = v.id AND s.case_id <> v.case_id) AS "foreign"
       FROM visit v JOIN surgical_case c ON c.id = v.case_id JOIN patient p ON p.id = c.patient_id WHERE p.code LIKE ?`,
    )
    .all(like);
  for (const visit of visits) {
    if (visit.measured !== visit.sites || visit.foreign > 0) problems.push(`visit ${visit.id} has ${visit.measured} measurements for ${visit.sites} sites (${visit.foreign} of another case)`);
  }
  return problems;
}
