import { createHash } from 'node:crypto';
import type { DataSource } from 'typeorm';

/** Rows and a SHA-256 of one table's content. */
export interface TableDigest {
  rows: number;
  sha256: string;
}

/**
 * Tables left out: `session` rows change on every request (rolling expiry, CSRF issue time),
 * which is the point of a session, not a write of the request's payload.
 */
export const CHECKSUM_EXCLUDED_TABLES: ReadonlySet<string> = new Set(['session']);

function quoted(identifier: string): string {
  return `"${identifier.replace(/"/g, '""')}"`;
}

/** Every table the entities map (plus SQLite's AUTOINCREMENT counters, which expose an insert later undone), with its key columns. */
function tablesOf(dataSource: DataSource): { table: string; orderBy: string[] }[] {
  const tables = dataSource.entityMetadatas
    .filter((metadata) => metadata.tableType !== 'view' && !CHECKSUM_EXCLUDED_TABLES.has(metadata.tableName))
    .map((metadata) => ({ table: metadata.tableName, orderBy: metadata.primaryColumns.map((column) => column.databaseName) }));
  return tables.sort((a, b) => a.table.localeCompare(b.table));
}

async function sqliteSequence(dataSource: DataSource): Promise<{ table: string; orderBy: string[] }[]> {
  if (!dataSource.options.type.includes('sqlite')) return [];
  const found = (await dataSource.query("SELECT name FROM sqlite_master WHERE type = 'table' AND name = 'sqlite_sequence'")) as unknown[];
  return found.length ? [{ table: 'sqlite_sequence', orderBy: ['name'] }] : [];
}

/**
 * Row count and SHA-256 of every table (rows ordered by primary key, each row as JSON of its
 * columns), the session table excluded. Unlike `storeFingerprint` (test/api/support/audit-fixtures.ts:
 * counts and version sums of the clinical and audit tables), it also sees edits that keep the
 * count and the version, and every other mapped table (users, mail queue, calibration readings).
 */
export async function databaseDigest(dataSource: DataSource): Promise<Record<string, TableDigest>> {
  const digest: Record<string, TableDigest> = {};
  for (const { table, orderBy } of [...tablesOf(dataSource), ...(await sqliteSequence(dataSource))]) {
    const order = orderBy.length ? orderBy.map(quoted).join(', ') : '1';
    const rows = (await dataSource.query(`SELECT * FROM ${quoted(table)} ORDER BY ${order}`)) as Record<string, unknown>[];
    const hash = createHash('sha256');
    for (const row of rows) hash.update(JSON.stringify(row, (_key, value: unknown) => (typeof value === 'bigint' ? value.toString() : value))).update('\n');
    digest[table] = { rows: rows.length, sha256: hash.digest('hex') };
  }
  return digest;
}
