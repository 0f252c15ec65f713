import path from 'node:path';
import { createTestApp } from '../../api/support/test-app';
import { startServer, type RunningServer } from '../../e2e/support/server';

/** A data dir for the real server and the maintenance CLIs to share. */
export interface PreparedDataDir {
  dataDir: string;
  /** Its SQLite file. */
  database: string;
  /** The CLIs' environment: the same data dir as the server. */
  env: Record<string, string>;
}

/** A temporary data dir holding a migrated database with the demo accounts (a server started on it then skips the demo practice). */
export async function preparedDataDir(): Promise<PreparedDataDir> {
  const t = await createTestApp();
  await t.dataSource.destroy();
  return { dataDir: t.dataDir, database: path.join(t.dataDir, 'tidemark.sqlite'), env: { TIDEMARK_DATA_DIR: t.dataDir } };
}

/** Starts the server as users do on that data dir, without daily backups (startServer's own temporary dir stays unused). */
export function startServerOn(dataDir: string): Promise<RunningServer> {
  return startServer({ TIDEMARK_DATA_DIR: dataDir, TIDEMARK_DAILY_BACKUPS: '0' });
}
