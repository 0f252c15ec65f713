import { randomBytes } from 'node:crypto';
import path from 'node:path';
import pg from 'pg';
import type { DataSource } from 'typeorm';
import { isPostgresUrl } from '../../../server/entities/column-types';
import { openDatabase } from '../../../server/data-source';

/**
 * The PostgreSQL server the API tests run against (an admin connection string, e.g.
 * postgres://postgres@127.0.0.1:5433/postgres), or undefined for the default SQLite files.
 * Set by `npm run test:pg` (scripts/test-pg.sh).
 */
export const TEST_PG_URL = process.env.TIDEMARK_TEST_PG_URL || undefined;

/** True when the tests run on PostgreSQL rather than SQLite. */
export const IS_TESTING_POSTGRES = Boolean(TEST_PG_URL);

/** A migrated throwaway database and how to throw it away. */
export interface TestDatabase {
  dataSource: DataSource;
  /** Closes the data source and deletes the database (the SQLite file goes with the test's dataDir). */
  close(): Promise<void>;
}

/** The same server address with another database name. */
function withDatabase(adminUrl: string, database: string): string {
  const url = new URL(adminUrl);
  url.pathname = `/${database}`;
  return url.toString();
}

/** Runs one statement on the admin database (CREATE/DROP DATABASE cannot run inside a transaction). */
async function onAdminDatabase(adminUrl: string, statement: string): Promise<void> {
  const client = new pg.Client({ connectionString: adminUrl });
  await client.connect();
  try {
    await client.query(statement);
  } finally {
    await client.end();
  }
}

/**
 * Opens a fresh migrated database for one test app: a SQLite file in `dataDir`, or — when
 * TIDEMARK_TEST_PG_URL is set — a new PostgreSQL database `tidemark_t_<random>` on that server,
 * dropped again by `close()`.
 *
 * @throws {Error} when TIDEMARK_TEST_PG_URL is set but DATABASE_URL (which picks the column types
 *   at start) does not name PostgreSQL: run through test/api/vitest.pg.config.ts
 */
export async function openTestDatabase(dataDir: string): Promise<TestDatabase> {
  if (!TEST_PG_URL) {
    const dataSource = await openDatabase({ database: path.join(dataDir, 'tidemark.sqlite') });
    return {
      dataSource,
      async close() {
        if (dataSource.isInitialized) await dataSource.destroy();
      },
    };
  }
  if (!isPostgresUrl(process.env.DATABASE_URL)) {
    throw new Error('TIDEMARK_TEST_PG_URL is set but DATABASE_URL is not a postgres:// address; run the tests with test/api/vitest.pg.config.ts (npm run test:pg).');
  }
  const name = `tidemark_t_${randomBytes(6).toString('hex')}`;
  await onAdminDatabase(TEST_PG_URL, `CREATE DATABASE ${name}`);
  let dataSource: DataSource;
  try {
    dataSource = await openDatabase({ database: '', url: withDatabase(TEST_PG_URL, name) });
  } catch (error) {
    await onAdminDatabase(TEST_PG_URL, `DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
    throw error;
  }
  return {
    dataSource,
    async close() {
      if (dataSource.isInitialized) await dataSource.destroy();
      await onAdminDatabase(TEST_PG_URL, `DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
    },
  };
}

/**
 * A raw query that runs on SQLite and PostgreSQL alike: parameters are named (`:id`, or
 * `:...ids` for a list) and TypeORM's driver turns them into `?` or `$1`, so tests never write
 * a placeholder dialect by hand.
 *
 * @example await queryRows<{ id: number }>(t.dataSource, 'SELECT id FROM visit WHERE case_id = :caseId', { caseId })
 */
export async function queryRows<T = Record<string, unknown>>(dataSource: DataSource, sql: string, parameters: Record<string, unknown> = {}): Promise<T[]> {
  const [text, values] = dataSource.driver.escapeQueryWithParameters(sql, parameters);
  const rows: T[] = await dataSource.query(text, values);
  return rows;
}
