import { QueryFailedError } from 'typeorm';

/** SQLite (better-sqlite3) and PostgreSQL codes for a row that breaks a unique index or primary key. */
const UNIQUE_VIOLATION_CODES: ReadonlySet<string> = new Set(['SQLITE_CONSTRAINT_UNIQUE', 'SQLITE_CONSTRAINT_PRIMARYKEY', '23505']);

/**
 * True when a statement failed on a unique index or primary key. Services check for duplicates
 * before they insert, so reaching the index means two requests raced: on SQLite the single
 * connection serialises transactions, but on PostgreSQL two of them run at once and the
 * second insert fails here (SQLSTATE 23505, PostgreSQL manual, Appendix A).
 */
export function isUniqueViolation(error: unknown): boolean {
  if (!(error instanceof QueryFailedError)) return false;
  const code: unknown = Reflect.get(error.driverError, 'code');
  return typeof code === 'string' && UNIQUE_VIOLATION_CODES.has(code);
}
