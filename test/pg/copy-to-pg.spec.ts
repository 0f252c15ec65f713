import { execFile } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { promisify } from 'node:util';
import Database from 'better-sqlite3';
import type { DataSource } from 'typeorm';
import { CopyRefusedError, copySqliteToPostgres } from '../../server/database-copy/copy-sqlite-to-postgres';
import { openTestDatabase, queryRows, type TestDatabase } from '../api/support/test-database';

/*
 * `npm run copy-to-pg` on real data: the demo practice seeded into a SQLite file by the normal
 * seeding command (a child process without DATABASE_URL), copied into fresh PostgreSQL
 * databases and compared row by row. PostgreSQL only: included by test/api/vitest.pg.config.ts.
 */

const root = fileURLToPath(new URL('../../', import.meta.url));
const run = promisify(execFile);

/** Tables the copy leaves out by design (see copySqliteToPostgres). */
const NOT_COPIED = new Set(['migrations', 'session', 'typeorm_metadata']);

/** A value in a form both databases agree on: booleans as booleans, instants as epoch ms, numbers as numbers. */
function comparable(value: unknown, dataType: string): unknown {
  if (value === null || value === undefined) return null;
  if (dataType === 'boolean') return value === true || value === 1;
  if (dataType === 'timestamp with time zone') {
    // TypeORM writes SQLite datetimes as UTC text without a zone.
    return value instanceof Date ? value.getTime() : Date.parse(`${String(value).replace(' ', 'T')}Z`);
  }
  if (dataType === 'bigint' || dataType === 'integer' || dataType === 'double precision') return Number(value);
  return value;
}

/** Every copied table with its columns and types, as the PostgreSQL schema has them. */
async function copiedTables(target: DataSource): Promise<Map<string, { name: string; dataType: string }[]>> {
  const rows = await queryRows<{ table: string; name: string; dataType: string }>(
    target,
    'SELECT table_name AS "table", column_name AS name, data_type AS "dataType" FROM information_schema.columns WHERE table_schema = current_schema() ORDER BY table_name, ordinal_position',
  );
  const tables = new Map<string, { name: string; dataType: string }[]>();
  for (const row of rows.filter((candidate) => !NOT_COPIED.has(candidate.table))) tables.set(row.table, [...(tables.get(row.table) ?? []), { name: row.name, dataType: row.dataType }]);
  return tables;
}

describe('copy-to-pg: a SQLite database into a new PostgreSQL database', () => {
  let directory: string;
  let sqliteFile: string;
  const targets: TestDatabase[] = [];

  /** A fresh migrated PostgreSQL database for one copy. */
  async function freshTarget(): Promise<DataSource> {
    const target = await openTestDatabase(directory);
    targets.push(target);
    return target.dataSource;
  }

  beforeAll(async () => {
    directory = mkdtempSync(path.join(tmpdir(), 'tidemark-copy-'));
    const env: NodeJS.ProcessEnv = { ...process.env, TIDEMARK_DATA_DIR: directory };
    delete env.DATABASE_URL;
    delete env.TIDEMARK_TEST_PG_URL;
    await run(process.execPath, ['--import', 'tsx', 'server/cli/seed-demo.ts'], { cwd: root, env });
    sqliteFile = path.join(directory, 'tidemark.sqlite');
    // Values the demo does not make: a history entry with milliseconds and a second factor.
    const db = new Database(sqliteFile);
    db.prepare(
      "INSERT INTO change_record (entity, entity_id, case_id, field, old_value, new_value, changed_by_id, changed_at, reason) VALUES ('site', 1, 1, 'postOpRefGm', '10', '10.5', 1, '2026-01-05 10:00:00.123', 'Copy check')",
    ).run();
    db.prepare("INSERT INTO user_second_factor (user_id, secret_sealed, enabled_at, last_used_step) VALUES (1, 'sealed-secret', '2026-01-06 08:30:00.000', 59000000)").run();
    db.close();
  }, 120_000);

  afterAll(async () => {
    for (const target of targets) await target.close();
    rmSync(directory, { recursive: true, force: true });
  });

  it('copies every row of every table unchanged, booleans and instants converted, and nothing of the sessions', async () => {
    const target = await freshTarget();
    const copied = await copySqliteToPostgres(sqliteFile, target);
    const source = new Database(sqliteFile, { readonly: true });
    try {
      const tables = await copiedTables(target);
      expect(copied.map((table) => table.table).sort()).toEqual([...tables.keys()].sort());
      for (const [table, columns] of tables) {
        const order = columns.some((column) => column.name === 'id') ? 'id' : columns[0].name;
        const fromSqlite = source.prepare<[], Record<string, unknown>>(`SELECT * FROM "${table}" ORDER BY ${order}`).all();
        const fromPostgres = await queryRows(target, `SELECT * FROM "${table}" ORDER BY ${order}`);
        const normalise = (row: Record<string, unknown>) => Object.fromEntries(columns.map((column) => [column.name, comparable(row[column.name], column.dataType)]));
        expect(fromPostgres.map(normalise), table).toEqual(fromSqlite.map(normalise));
      }
      // The demo is not empty: the comparison above compared real rows.
      expect(Object.fromEntries(copied.filter((table) => ['user', 'patient', 'site_measurement', 'change_record'].includes(table.table)).map((table) => [table.table, table.rows]))).toEqual({
        user: Number(source.prepare<[], { n: number }>('SELECT COUNT(*) AS n FROM "user"').get()?.n),
        patient: Number(source.prepare<[], { n: number }>('SELECT COUNT(*) AS n FROM patient').get()?.n),
        site_measurement: Number(source.prepare<[], { n: number }>('SELECT COUNT(*) AS n FROM site_measurement').get()?.n),
        change_record: 1,
      });
      expect(copied.find((table) => table.table === 'patient')?.rows).toBeGreaterThan(100);
    } finally {
      source.close();
    }
    const [record] = await queryRows<{ changed_at: Date }>(target, "SELECT changed_at FROM change_record WHERE reason = 'Copy check'");
    expect(record.changed_at.toISOString()).toBe('2026-01-05T10:00:00.123Z');
    expect(await queryRows(target, 'SELECT sid FROM session')).toEqual([]);
  });

  it('moves every id sequence past the highest copied id, so new rows do not collide', async () => {
    const target = await freshTarget();
    await copySqliteToPostgres(sqliteFile, target);
    const sequences = await queryRows<{ table: string; seq: string }>(
      target,
      `SELECT table_name AS "table", pg_get_serial_sequence(format('%I', table_name), 'id') AS seq FROM information_schema.columns WHERE table_schema = current_schema() AND column_name = 'id' AND table_name <> 'migrations'`,
    );
    expect(sequences.length).toBeGreaterThan(10);
    for (const { table, seq } of sequences) {
      const [{ highest }] = await queryRows<{ highest: number | null }>(target, `SELECT MAX(id) AS highest FROM "${table}"`);
      const [{ next }] = await queryRows<{ next: string }>(target, 'SELECT nextval(CAST(:seq AS regclass)) AS next', { seq });
      expect(Number(next), table).toBe((highest ?? 0) + 1);
    }
  });

  it('refuses a database that already has accounts, and changes nothing there', async () => {
    const target = await freshTarget();
    await copySqliteToPostgres(sqliteFile, target);
    const [before] = await queryRows<{ n: string }>(target, 'SELECT COUNT(*) AS n FROM patient');
    await expect(copySqliteToPostgres(sqliteFile, target)).rejects.toThrow(CopyRefusedError);
    expect(await queryRows<{ n: string }>(target, 'SELECT COUNT(*) AS n FROM patient')).toEqual([before]);
  });

  it('keeps nothing when one row cannot be copied (all or nothing)', async () => {
    const broken = path.join(directory, 'broken.sqlite');
    const db = new Database(sqliteFile);
    await db.backup(broken);
    db.close();
    // A visit of a case that does not exist: SQLite lets it in with foreign keys off; PostgreSQL refuses it.
    const orphaned = new Database(broken);
    orphaned.pragma('foreign_keys = OFF');
    orphaned.prepare("INSERT INTO visit (case_id, interval_key, visit_date, examiner_id, version) VALUES (999999, '6w', '2025-01-01', 1, 1)").run();
    orphaned.close();

    const target = await freshTarget();
    await expect(copySqliteToPostgres(broken, target)).rejects.toThrow(/foreign key/i);
    for (const table of ['user', 'patient', 'surgical_case', 'visit']) {
      expect(await queryRows<{ n: string }>(target, `SELECT COUNT(*) AS n FROM "${table}"`), table).toEqual([{ n: '0' }]);
    }
  });
});
