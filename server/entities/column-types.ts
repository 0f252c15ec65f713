/**
 * Column types that differ between SQLite and PostgreSQL. The data source picks the
 * driver from DATABASE_URL, so entities and migrations read the same switch.
 */
import type { ColumnType } from 'typeorm';

const isPostgres = (process.env.DATABASE_URL ?? '').startsWith('postgres');

/** A point in time: SQLite `datetime`, PostgreSQL `timestamptz`. */
export const TIMESTAMP_TYPE: Extract<ColumnType, string> = isPostgres ? 'timestamptz' : 'datetime';
