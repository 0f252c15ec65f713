import Database from 'better-sqlite3';
import type { DataSource, QueryRunner } from 'typeorm';

/** Rows per INSERT statement (PostgreSQL takes at most 65,535 parameters in one statement). */
const ROWS_PER_INSERT = 500;

/** Tables that are not copied: TypeORM's migration log (the target has its own) and sessions (people sign in again). */
const NOT_COPIED: ReadonlySet<string> = new Set(['migrations', 'session', 'typeorm_metadata']);

/** One copied table and its row count. */
export interface CopiedTable {
  table: string;
  rows: number;
}

/** A column of the target table with PostgreSQL's name for its type. */
interface TargetColumn {
  name: string;
  dataType: string;
}

/** Refused before anything was written: the message says what to do. */
export class CopyRefusedError extends Error {}

/** Quotes an identifier for PostgreSQL (tables like `user` are reserved words). */
function quoted(identifier: string): string {
  return `"${identifier.replace(/"/g, '""')}"`;
}

/**
 * A SQLite value as PostgreSQL's column wants it: SQLite keeps booleans as 0/1 and TypeORM
 * writes `datetime` columns as UTC text without a zone ('2026-01-05 10:00:00.123').
 */
function converted(value: unknown, dataType: string): unknown {
  if (value === null || value === undefined) return null;
  if (dataType === 'boolean') return value === 1 || value === '1' || value === true;
  if (dataType === 'timestamp with time zone' && typeof value === 'string') {
    const iso = value.includes('T') ? value : value.replace(' ', 'T');
    return /(Z|[+-]\d{2}:?\d{2})$/.test(iso) ? iso : `${iso}Z`;
  }
  return value;
}

/** Parents before children, from the target's foreign keys. */
async function tablesInCopyOrder(runner: QueryRunner): Promise<string[]> {
  const tables = ((await runner.query(`SELECT table_name AS name FROM information_schema.tables WHERE table_schema = current_schema() AND table_type = 'BASE TABLE' ORDER BY table_name`)) as { name: string }[])
    .map((row) => row.name)
    .filter((name) => !NOT_COPIED.has(name));
  const edges = (await runner.query(
    `SELECT child.relname AS child, parent.relname AS parent FROM pg_constraint c
       JOIN pg_class child ON child.oid = c.conrelid JOIN pg_class parent ON parent.oid = c.confrelid
      WHERE c.contype = 'f' AND c.connamespace = current_schema()::regnamespace`,
  )) as { child: string; parent: string }[];
  const ordered: string[] = [];
  const placed = new Set<string>();
  while (ordered.length < tables.length) {
    const ready = tables.filter((table) => !placed.has(table) && edges.every((edge) => edge.child !== table || edge.parent === table || placed.has(edge.parent) || NOT_COPIED.has(edge.parent)));
    if (ready.length === 0) throw new Error(`Foreign keys form a cycle among: ${tables.filter((table) => !placed.has(table)).join(', ')}.`);
    for (const table of ready) {
      ordered.push(table);
      placed.add(table);
    }
  }
  return ordered;
}

async function targetColumns(runner: QueryRunner, table: string): Promise<TargetColumn[]> {
  const rows = (await runner.query('SELECT column_name AS name, data_type AS "dataType" FROM information_schema.columns WHERE table_schema = current_schema() AND table_name = $1 ORDER BY ordinal_position', [
    table,
  ])) as TargetColumn[];
  return rows;
}

async function rowCount(runner: QueryRunner, table: string): Promise<number> {
  const [row] = (await runner.query(`SELECT COUNT(*) AS n FROM ${quoted(table)}`)) as { n: string }[];
  return Number(row.n);
}

/** Refuses unless both databases are at the same migration and the target has never been used. */
async function assertCopyable(source: Database.Database, runner: QueryRunner): Promise<void> {
  const sourceMigrations = source.prepare<[], { name: string }>('SELECT name FROM migrations ORDER BY timestamp').all().map((row) => row.name);
  const targetMigrations = ((await runner.query('SELECT name FROM migrations ORDER BY timestamp')) as { name: string }[]).map((row) => row.name);
  if (sourceMigrations.join() !== targetMigrations.join()) {
    throw new CopyRefusedError(
      `The SQLite file and PostgreSQL are at different schema versions (${sourceMigrations.length} and ${targetMigrations.length} migrations). Start this version of Tidemark once on the SQLite file (or run \`npm run migrate\` without DATABASE_URL), then copy again.`,
    );
  }
  if ((await rowCount(runner, 'user')) > 0) {
    throw new CopyRefusedError('The PostgreSQL database already has accounts. Copy only into a new, empty database (CREATE DATABASE …), so nothing there is overwritten.');
  }
}

/**
 * Copies every table of a Tidemark SQLite file into a migrated, never-used PostgreSQL database,
 * in ONE transaction: all rows or none. Ids are kept (so every reference stays right) and each
 * id sequence is moved past the highest copied id. Booleans and timestamps are converted;
 * sessions are not copied (everyone signs in again). The SQLite file is read in one read
 * transaction, a consistent snapshot — but saves made after it are not copied, so stop the
 * server first. Row counts are compared before the commit.
 *
 * @throws {CopyRefusedError} when the schema versions differ or the target already has accounts
 */
export async function copySqliteToPostgres(sqliteFile: string, target: DataSource, onTable: (copied: CopiedTable) => void = () => undefined): Promise<CopiedTable[]> {
  if (target.options.type !== 'postgres') throw new Error('The copy target must be a PostgreSQL data source.');
  const source = new Database(sqliteFile, { readonly: true, fileMustExist: true });
  const runner = target.createQueryRunner();
  try {
    source.exec('BEGIN');
    await runner.connect();
    await runner.startTransaction();
    await assertCopyable(source, runner);
    const tables = await tablesInCopyOrder(runner);
    // Rows the migrations seeded (the default recall schedule) make way for the source's own.
    for (const table of [...tables].reverse()) {
      if ((await rowCount(runner, table)) > 0) await runner.query(`DELETE FROM ${quoted(table)}`);
    }
    const copied: CopiedTable[] = [];
    for (const table of tables) {
      const columns = await targetColumns(runner, table);
      const sourceColumns = new Set(source.prepare<[], { name: string }>(`PRAGMA table_info(${quoted(table)})`).all().map((column) => column.name));
      const missing = columns.filter((column) => !sourceColumns.has(column.name)).map((column) => column.name);
      if (missing.length) throw new CopyRefusedError(`The SQLite table ${table} has no column ${missing.join(', ')}: the two schemas differ.`);
      const names = columns.map((column) => quoted(column.name)).join(', ');
      const select = source.prepare<[], Record<string, unknown>>(`SELECT ${names} FROM ${quoted(table)}`);
      let batch: unknown[][] = [];
      let rows = 0;
      const flush = async (): Promise<void> => {
        if (batch.length === 0) return;
        const values = batch.map((_, row) => `(${columns.map((__, column) => `$${row * columns.length + column + 1}`).join(', ')})`).join(', ');
        await runner.query(`INSERT INTO ${quoted(table)} (${names}) VALUES ${values}`, batch.flat());
        rows += batch.length;
        batch = [];
      };
      for (const row of select.iterate()) {
        batch.push(columns.map((column) => converted(row[column.name], column.dataType)));
        if (batch.length === ROWS_PER_INSERT) await flush();
      }
      await flush();
      const expected = Number(source.prepare<[], { n: number }>(`SELECT COUNT(*) AS n FROM ${quoted(table)}`).get()?.n ?? 0);
      const landed = await rowCount(runner, table);
      if (landed !== expected || rows !== expected) throw new Error(`Copied ${landed} rows of ${table}, expected ${expected}; nothing was kept.`);
      if (columns.some((column) => column.name === 'id')) {
        // Next id after the highest copied one; is_called=false makes nextval return exactly that value.
        await runner.query(
          `SELECT setval(seq::regclass, COALESCE((SELECT MAX(id) FROM ${quoted(table)}), 0) + 1, false) FROM pg_get_serial_sequence($1, 'id') AS seq WHERE seq IS NOT NULL`,
          [quoted(table)],
        );
      }
      copied.push({ table, rows });
      onTable({ table, rows });
    }
    await runner.commitTransaction();
    return copied;
  } catch (error) {
    if (runner.isTransactionActive) await runner.rollbackTransaction();
    throw error;
  } finally {
    await runner.release();
    if (source.inTransaction) source.exec('ROLLBACK');
    source.close();
  }
}
