/** `npm run backup`: an online, verified backup of the SQLite database into `<dataDir>/backups/` (safe while the server runs). */
import { loadConfig } from '../config';
import { backupDatabase } from '../maintenance/database-backup';

const config = loadConfig();
if (config.databaseUrl) {
  console.error('DATABASE_URL names PostgreSQL: back it up with pg_dump. npm run backup copies the SQLite file only.');
  process.exit(1);
}
try {
  const backup = await backupDatabase({ databaseFile: config.databaseFile, backupsDir: config.backupsDir });
  console.log(`Backup written: ${backup.file}`);
  console.log(`Size: ${backup.bytes} bytes (${(backup.bytes / 1024 / 1024).toFixed(1)} MB); PRAGMA integrity_check: ok; ${backup.durationMs} ms.`);
} catch (error) {
  // A command line answers with a sentence and an exit code, not a stack trace.
  console.error(`Backup failed: ${error instanceof Error ? error.message : String(error)}`);
  process.exit(1);
}
