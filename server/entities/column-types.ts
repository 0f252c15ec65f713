/**
 * Column types that differ between SQLite and PostgreSQL. The data source picks the
 * driver from DATABASE_URL, so entities and migrations read the same switch.
 */
import type { ColumnType } from 'typeorm';

/** True for a `postgres://` or `postgresql://` connection string. */
export function isPostgresUrl(url: string | null | undefined): boolean {
  return /^postgres(ql)?:\/\//i.test(url ?? '');
}

/** Whether this process maps its entities for PostgreSQL (read once, at start). */
export const IS_POSTGRES_SCHEMA = isPostgresUrl(process.env.DATABASE_URL);

/** A point in time: SQLite `datetime`, PostgreSQL `timestamptz`. */
export const TIMESTAMP_TYPE: Extract<ColumnType, string> = IS_POSTGRES_SCHEMA ? 'timestamptz' : 'datetime';

/**
 * A measurement or percentage: SQLite's REAL is an 8-byte float, PostgreSQL's `real` only
 * 4 bytes (about 6 significant digits), so PostgreSQL gets `double precision` to keep the
 * same values.
 */
export const FLOAT_TYPE: 'real' | 'double precision' = IS_POSTGRES_SCHEMA ? 'double precision' : 'real';
