import type { DataSource, QueryRunner } from 'typeorm';
import type { ImportCounts } from '@tidemark/shared';
import { groupStoredCases, importDatabaseIssues, plannedOperatorEmails, type ImportWriteResult, type StoredImportState, type StoredRow } from './import-database-checks';
import type { ImportPlan, PlannedSite } from './import-plan';

/** Rows per INSERT: arrays travel as one parameter per column, so this bounds memory, not parameters. */
const ROWS_PER_INSERT = 2000;

/** One table's new rows, column by column, with the SQL array type of each column. */
interface ColumnarInsert {
  table: string;
  columns: readonly { name: string; sqlType: string }[];
  rows: unknown[][];
}

/** Reads what the plan touches, after the lock, so the inserts see the same state. */
async function storedState(runner: QueryRunner, plan: ImportPlan): Promise<StoredImportState> {
  const operators = (await runner.query(`SELECT id, email FROM "user" WHERE active = TRUE AND role IN ('clinician', 'audit_lead') AND email = ANY($1::text[])`, [
    plannedOperatorEmails(plan),
  ])) as { id: number; email: string }[];
  const patients = (await runner.query('SELECT * FROM patient WHERE code = ANY($1::text[])', [plan.patients.map((patient) => patient.code)])) as StoredRow[];
  const caseRows = (await runner.query('SELECT c.patient_id, c.surgery_date, s.tooth FROM surgical_case c LEFT JOIN site s ON s.case_id = c.id WHERE c.patient_id = ANY($1::int[])', [
    patients.map((patient) => Number(patient.id)),
  ])) as { patient_id: number; surgery_date: string; tooth: number | null }[];
  return {
    operatorIds: new Map(operators.map((user) => [user.email, Number(user.id)])),
    existingPatients: new Map(patients.map((patient) => [String(patient.code), patient])),
    existingCases: groupStoredCases(caseRows),
  };
}

/** Takes `count` ids from the table's own sequence, so rows can reference each other before they are sent. */
async function reserveIds(runner: QueryRunner, table: string, count: number): Promise<number[]> {
  if (count === 0) return [];
  const rows = (await runner.query(`SELECT nextval(pg_get_serial_sequence($1, 'id'))::int AS id FROM generate_series(1, $2::int)`, [table, count])) as { id: number }[];
  return rows.map((row) => Number(row.id));
}

/** Sends one table's rows as `INSERT … SELECT * FROM unnest(…)`, a chunk at a time. */
async function insertColumnar(runner: QueryRunner, insert: ColumnarInsert, onRows: (written: number) => void): Promise<void> {
  const names = insert.columns.map((column) => column.name).join(', ');
  const arrays = insert.columns.map((column, index) => `$${index + 1}::${column.sqlType}[]`).join(', ');
  const sql = `INSERT INTO ${insert.table} (${names}) SELECT * FROM unnest(${arrays})`;
  for (let start = 0; start < insert.rows.length; start += ROWS_PER_INSERT) {
    const part = insert.rows.slice(start, start + ROWS_PER_INSERT);
    await runner.query(
      sql,
      insert.columns.map((_, index) => part.map((row) => row[index])),
    );
    onRows(part.length);
  }
}

/** Builds every row of the plan with ids reserved up front. */
async function planRows(runner: QueryRunner, plan: ImportPlan, stored: StoredImportState, importedById: number): Promise<{ inserts: ColumnarInsert[]; counts: ImportCounts }> {
  const newPatients = plan.patients.filter((patient) => !stored.existingPatients.has(patient.code));
  const cases = plan.patients.flatMap((patient) => patient.cases.map((surgicalCase) => ({ patient, surgicalCase })));
  const sites = cases.flatMap(({ surgicalCase }) => surgicalCase.sites);
  const visits = cases.flatMap(({ surgicalCase }) => surgicalCase.visits);
  const [patientIds, caseIds, siteIds, visitIds] = [
    await reserveIds(runner, 'patient', newPatients.length),
    await reserveIds(runner, 'surgical_case', cases.length),
    await reserveIds(runner, 'site', sites.length),
    await reserveIds(runner, 'visit', visits.length),
  ];
  const patientIdByCode = new Map<string, number>();
  for (const [code, row] of stored.existingPatients) patientIdByCode.set(code, Number(row.id));
  newPatients.forEach((patient, index) => patientIdByCode.set(patient.code, patientIds[index]));
  const siteIdOf = new Map<PlannedSite, number>(sites.map((site, index) => [site, siteIds[index]]));

  const caseRows: unknown[][] = [];
  const siteRows: unknown[][] = [];
  const visitRows: unknown[][] = [];
  const measurementRows: unknown[][] = [];
  let visitIndex = 0;
  cases.forEach(({ patient, surgicalCase }, index) => {
    const caseId = caseIds[index];
    const operatorId = stored.operatorIds.get(surgicalCase.operatorEmail) ?? 0;
    const status = surgicalCase.visits.length ? 'in-recall' : 'operated';
    caseRows.push([caseId, patientIdByCode.get(patient.code), operatorId, surgicalCase.surgeryDate, surgicalCase.procedure, surgicalCase.indication, surgicalCase.instrument, status, importedById]);
    for (const site of surgicalCase.sites) {
      siteRows.push([siteIdOf.get(site), caseId, site.tooth, site.location, site.referencePoint, site.baselineRefGm, site.ktWidth, site.marginToCrest, site.papillaScore, site.postOpRefGm]);
    }
    for (const visit of surgicalCase.visits) {
      const visitId = visitIds[visitIndex++];
      visitRows.push([visitId, caseId, visit.intervalKey, visit.visitDate, operatorId, visit.pain]);
      for (const measurement of visit.measurements) {
        measurementRows.push([visitId, siteIdOf.get(measurement.site), measurement.refGm, measurement.bleedingOnProbing, measurement.papillaScore]);
      }
    }
  });
  const inserts: ColumnarInsert[] = [
    {
      table: 'patient',
      columns: [
        { name: 'id', sqlType: 'int' },
        { name: 'code', sqlType: 'text' },
        { name: 'birth_year', sqlType: 'int' },
        { name: 'sex', sqlType: 'text' },
        { name: 'smoking', sqlType: 'text' },
        { name: 'cigarettes_per_day', sqlType: 'int' },
        { name: 'diabetes', sqlType: 'text' },
        { name: 'phenotype', sqlType: 'text' },
        { name: 'phenotype_method', sqlType: 'text' },
        { name: 'created_by_id', sqlType: 'int' },
      ],
      rows: newPatients.map((patient, index) => [
        patientIds[index],
        patient.code,
        patient.birthYear,
        patient.sex,
        patient.smoking,
        patient.cigarettesPerDay,
        patient.diabetes,
        patient.phenotype,
        patient.phenotypeMethod,
        importedById,
      ]),
    },
    {
      table: 'surgical_case',
      columns: [
        { name: 'id', sqlType: 'int' },
        { name: 'patient_id', sqlType: 'int' },
        { name: 'operator_id', sqlType: 'int' },
        { name: 'surgery_date', sqlType: 'text' },
        { name: 'procedure', sqlType: 'text' },
        { name: 'indication', sqlType: 'text' },
        { name: 'instrument', sqlType: 'text' },
        { name: 'status', sqlType: 'text' },
        { name: 'created_by_id', sqlType: 'int' },
      ],
      rows: caseRows,
    },
    {
      table: 'site',
      columns: [
        { name: 'id', sqlType: 'int' },
        { name: 'case_id', sqlType: 'int' },
        { name: 'tooth', sqlType: 'int' },
        { name: 'location', sqlType: 'text' },
        { name: 'reference_point', sqlType: 'text' },
        { name: 'baseline_ref_gm', sqlType: 'float8' },
        { name: 'kt_width', sqlType: 'float8' },
        { name: 'margin_to_crest', sqlType: 'float8' },
        { name: 'papilla_score', sqlType: 'int' },
        { name: 'post_op_ref_gm', sqlType: 'float8' },
      ],
      rows: siteRows,
    },
    {
      table: 'visit',
      columns: [
        { name: 'id', sqlType: 'int' },
        { name: 'case_id', sqlType: 'int' },
        { name: 'interval_key', sqlType: 'text' },
        { name: 'visit_date', sqlType: 'text' },
        { name: 'examiner_id', sqlType: 'int' },
        { name: 'pain', sqlType: 'int' },
      ],
      rows: visitRows,
    },
    {
      table: 'site_measurement',
      columns: [
        { name: 'visit_id', sqlType: 'int' },
        { name: 'site_id', sqlType: 'int' },
        { name: 'ref_gm', sqlType: 'float8' },
        { name: 'bleeding_on_probing', sqlType: 'boolean' },
        { name: 'papilla_score', sqlType: 'int' },
      ],
      rows: measurementRows,
    },
  ];
  return { inserts, counts: { patients: newPatients.length, cases: cases.length, sites: sites.length, visits: visits.length } };
}

/**
 * The PostgreSQL counterpart of `writeImportPlan` (SQLite): the same checks and rows in ONE
 * transaction on a TypeORM query runner, all or nothing. The transaction first locks `patient`
 * and `surgical_case` against other writers (SHARE ROW EXCLUSIVE, as SQLite's BEGIN IMMEDIATE
 * does for the whole file), so the database checks stay true until the commit; readers carry on.
 * Ids come from the tables' sequences up front and rows go in as column arrays (`unnest`), a
 * few statements per table instead of one per row. A process killed mid-way leaves no trace:
 * the server rolls back a transaction whose connection is gone.
 *
 * @param onProgress called after each batch of rows is sent, inside the transaction (0–1)
 */
export async function writeImportPlanOnPostgres(dataSource: DataSource, plan: ImportPlan, importedById: number, onProgress: (fraction: number) => void = () => undefined): Promise<ImportWriteResult> {
  const runner = dataSource.createQueryRunner();
  await runner.connect();
  await runner.startTransaction();
  try {
    await runner.query('LOCK TABLE patient, surgical_case IN SHARE ROW EXCLUSIVE MODE');
    const stored = await storedState(runner, plan);
    const issues = [...plan.issues, ...importDatabaseIssues(plan, stored)];
    if (issues.length) {
      await runner.rollbackTransaction();
      return { isWritten: false, issues };
    }
    const { inserts, counts } = await planRows(runner, plan, stored, importedById);
    const totalRows = Math.max(1, inserts.reduce((sum, insert) => sum + insert.rows.length, 0));
    let written = 0;
    for (const insert of inserts) {
      await insertColumnar(runner, insert, (rows) => {
        written += rows;
        onProgress(written / totalRows);
      });
    }
    await runner.commitTransaction();
    return { isWritten: true, counts };
  } catch (error) {
    if (runner.isTransactionActive) await runner.rollbackTransaction();
    throw error;
  } finally {
    await runner.release();
  }
}
