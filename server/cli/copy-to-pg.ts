/**
 * `npm run copy-to-pg [-- --from FILE]`: copies the SQLite database (TIDEMARK_DATA_DIR's
 * tidemark.sqlite unless --from names another file) into the PostgreSQL database named by
 * DATABASE_URL, after bringing that database's schema up to date. All rows or none; the target
 * must be new (no accounts). Stop the server first: saves made during the copy are not copied.
 */
import 'reflect-metadata';
import { existsSync } from 'node:fs';
import path from 'node:path';
import { loadConfig } from '../config';
import { CopyRefusedError, copySqliteToPostgres } from '../database-copy/copy-sqlite-to-postgres';
import { openDatabase } from '../data-source';

const config = loadConfig();
if (!config.databaseUrl) {
  console.error('Set DATABASE_URL=postgres://… to the new PostgreSQL database to copy into.');
  process.exit(2);
}
const fromIndex = process.argv.indexOf('--from');
const sqliteFile = path.resolve(fromIndex >= 0 ? (process.argv[fromIndex + 1] ?? '') : config.databaseFile);
if (!existsSync(sqliteFile)) {
  console.error(`No SQLite database at ${sqliteFile}.`);
  process.exit(2);
}

const target = await openDatabase({ database: '', url: config.databaseUrl });
try {
  console.log(`Copying ${sqliteFile} into PostgreSQL (one transaction; nothing is kept unless every table copies).`);
  const copied = await copySqliteToPostgres(sqliteFile, target, ({ table, rows }) => console.log(`  ${table}: ${rows} rows`));
  console.log(`Done: ${copied.reduce((sum, table) => sum + table.rows, 0)} rows in ${copied.length} tables. Sessions were not copied: everyone signs in again.`);
  console.log('Keep the same TIDEMARK_SECRET (or data/secret.key) and photo storage: sign-in codes are sealed with that secret.');
} catch (error) {
  if (!(error instanceof CopyRefusedError)) throw error;
  console.error(`Nothing copied: ${error.message}`);
  process.exitCode = 1;
} finally {
  await target.destroy();
}
