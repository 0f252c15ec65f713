/**
 * `npm run restore -- FILE`: replaces the SQLite database with a backup, and the uploads folder
 * with the backup's photo folder, after checking both and keeping a safety copy of the current
 * ones; refuses while the server (or anything else) has the database open, and when the photo
 * folder lacks a photograph the backup refers to. Exits 1 on a refusal, 2 on a usage error.
 */
import 'reflect-metadata';
import path from 'node:path';
import { loadConfig } from '../config';
import { restoreDatabase, RestoreRefusedError } from '../maintenance/database-restore';
import { describePhotoRestore } from '../maintenance/restore-photos';

const source = process.argv[2];
if (!source || process.argv.length > 3) {
  console.error('Usage: npm run restore -- <backup.sqlite>');
  process.exit(2);
}
const config = loadConfig();
if (config.databaseUrl) {
  console.error('DATABASE_URL names PostgreSQL: restore it with pg_restore. npm run restore replaces the SQLite file only.');
  process.exit(1);
}
try {
  const result = await restoreDatabase({ source: path.resolve(source), databaseFile: config.databaseFile, backupsDir: config.backupsDir, photoStorage: config.photoStorage });
  console.log(`Restored ${path.resolve(source)} into ${config.databaseFile} (${result.bytes} bytes; PRAGMA integrity_check: ok).`);
  console.log(result.safetyCopy ? `The database as it was before is kept in ${result.safetyCopy}.` : 'There was no database before; no safety copy was needed.');
  for (const line of describePhotoRestore(result.photos, result.safetyPhotos)) console.log(line);
  if (result.photosSetAside) console.log(`The uploads folder as it was (there was no database to go with it) is kept in ${result.photosSetAside}.`);
  console.log(result.appliedMigrations.length ? `Migrations applied: ${result.appliedMigrations.join(', ')}.` : 'The backup was already at this version (no migrations to run).');
  console.log('Everyone has been signed out. Start the server again.');
} catch (error) {
  // A command line answers with a sentence and an exit code, not a stack trace.
  const message = error instanceof Error ? error.message : String(error);
  console.error(error instanceof RestoreRefusedError ? `Restore refused: ${message} Nothing was changed.` : `Restore failed: ${message}`);
  process.exit(1);
}
