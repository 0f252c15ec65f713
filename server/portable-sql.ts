/**
 * A statement written with SQLite's `?` placeholders, rewritten for `dataSource`'s driver:
 * unchanged for SQLite (better-sqlite3), `$1, $2, …` in order for PostgreSQL (node-postgres
 * numbers its parameters). For the few statements on every request's path that skip TypeORM's
 * query builder (its SQL generation costs several times the query itself): rewrite once, when
 * the service is built, and keep the SQL readable by both databases (double-quoted identifiers,
 * no `?` inside string literals or comments).
 *
 * @example portableSql(postgres, 'SELECT data FROM "session" WHERE sid = ?') // 'SELECT data FROM "session" WHERE sid = $1'
 */
export function portableSql(dataSource: { readonly options: { readonly type: string } }, sql: string): string {
  if (dataSource.options.type !== 'postgres') return sql;
  let index = 0;
  return sql.replace(/\?/g, () => `$${++index}`);
}
