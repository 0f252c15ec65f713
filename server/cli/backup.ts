/**
 * `npm run backup`: an online, verified backup of the SQLite database into `<dataDir>/backups/`
 * (safe while the server runs), with the photographs it refers to in `<backup name>-photos/` when
 * they are kept in the uploads folder.
 */
import { loadConfig } from '../config';
import { describePhotoBackup, megabytes } from '../maintenance/backup-photos';
import { backupDatabase } from '../maintenance/database-backup';

const config = loadConfig();
if (config.databaseUrl) {
  console.error('DATABASE_URL names PostgreSQL: back it up with pg_dump. npm run backup copies the SQLite file only.');
  process.exit(1);
}
try {
  const backup = await backupDatabase({ databaseFile: config.databaseFile, backupsDir: config.backupsDir, photoStorage: config.photoStorage });
  console.log(`Backup written: ${backup.file}`);
  console.log(`Size: ${backup.bytes} bytes (${megabytes(backup.bytes)}); PRAGMA integrity_check: ok; ${backup.durationMs} ms.`);
  for (const line of describePhotoBackup(backup.photos)) console.log(line);
} catch (error) {
  // A command line answers with a sentence and an exit code, not a stack trace.
  console.error(`Backup failed: ${error instanceof Error ? error.message : String(error)}`);
  process.exit(1);
}
