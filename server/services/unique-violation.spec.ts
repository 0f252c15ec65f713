import Database from 'better-sqlite3';
import { QueryFailedError } from 'typeorm';
import { isUniqueViolation } from './unique-violation';

/** Runs a statement the way TypeORM reports a failure: the driver's error inside QueryFailedError. */
function failureOf(db: Database.Database, sql: string): unknown {
  try {
    db.exec(sql);
  } catch (error) {
    return new QueryFailedError(sql, [], error instanceof Error ? error : new Error(String(error)));
  }
  throw new Error(`Expected "${sql}" to fail.`);
}

describe('isUniqueViolation', () => {
  let db: Database.Database;
  beforeEach(() => {
    db = new Database(':memory:');
    db.exec("CREATE TABLE t (id INTEGER PRIMARY KEY, code TEXT NOT NULL UNIQUE); INSERT INTO t (id, code) VALUES (1, 'A')");
  });
  afterEach(() => db.close());

  it('is true for SQLite unique index and primary key failures', () => {
    expect(isUniqueViolation(failureOf(db, "INSERT INTO t (id, code) VALUES (2, 'A')"))).toBe(true);
    expect(isUniqueViolation(failureOf(db, "INSERT INTO t (id, code) VALUES (1, 'B')"))).toBe(true);
  });

  it('is false for other constraint failures and for errors that are not query failures', () => {
    expect(isUniqueViolation(failureOf(db, 'INSERT INTO t (id, code) VALUES (3, NULL)'))).toBe(false);
    expect(isUniqueViolation(new Error('UNIQUE constraint failed: t.code'))).toBe(false);
  });

  it("is true for PostgreSQL's SQLSTATE 23505 unique_violation and false for 23503 foreign_key_violation (PostgreSQL manual, Appendix A)", () => {
    const pgError = (code: string) => Object.assign(new Error('pg'), { code });
    expect(isUniqueViolation(new QueryFailedError('INSERT …', [], pgError('23505')))).toBe(true);
    expect(isUniqueViolation(new QueryFailedError('INSERT …', [], pgError('23503')))).toBe(false);
  });
});
