import Database from 'better-sqlite3';
import type { DataSource } from 'typeorm';

/**
 * The better-sqlite3 connection under TypeORM's data source. The import writes through it
 * directly: one synchronous transaction with prepared statements is both the fastest way to add
 * tens of thousands of rows and atomic by construction — nothing else can run on the shared
 * connection until it commits or rolls back.
 *
 * @throws {Error} when the data source is not TypeORM's better-sqlite3 driver
 */
export function sqliteConnection(dataSource: DataSource): Database.Database {
  const connection: unknown = Reflect.get(dataSource.driver, 'databaseConnection');
  if (!(connection instanceof Database)) throw new Error('The historical import needs the better-sqlite3 driver.');
  return connection;
}
