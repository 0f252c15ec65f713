import { portableSql } from './portable-sql';

/** Only `options.type` is read, so a stand-in with just that will do. */
const dataSourceOf = (type: 'better-sqlite3' | 'postgres') => ({ options: { type } });

describe('portableSql', () => {
  const sql = 'SELECT data FROM "session" WHERE sid = ? AND expires_at > ?';

  it('keeps `?` for SQLite (better-sqlite3 binds positional `?` parameters)', () => {
    expect(portableSql(dataSourceOf('better-sqlite3'), sql)).toBe(sql);
  });

  it('numbers the placeholders in order for PostgreSQL (node-postgres binds `$1`, `$2`, …)', () => {
    expect(portableSql(dataSourceOf('postgres'), sql)).toBe('SELECT data FROM "session" WHERE sid = $1 AND expires_at > $2');
  });
});
