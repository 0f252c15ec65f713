import 'reflect-metadata';
import type { Server } from 'node:http';
import { LocalPhotoStorage } from './storage/photo-storage';
import { createApp } from './app';
import { loadConfig } from './config';
import { openDatabase } from './data-source';
import { seedDemo } from './demo/seed-demo';

/** Starts Tidemark: migrate, seed the demo on an empty database, serve app + API. */
async function main(): Promise<void> {
  const config = loadConfig();
  const dataSource = await openDatabase({ database: config.databaseFile });
  const { app, sessions, users, services } = createApp({
    dataSource,
    secret: config.secret,
    photoStorage: new LocalPhotoStorage(config.uploadsDir),
    clientDir: config.clientDir,
    logLevel: config.logLevel,
    trustProxy: config.trustProxy,
  });
  if (config.isDemo && (await users.count()) === 0) {
    console.log('Empty database: seeding the demo practice (demo mode; set TIDEMARK_DEMO=off to skip).');
    const report = await seedDemo(dataSource, users, services);
    console.log(`Demo practice: ${report.accounts} accounts, ${report.patients} patients, ${report.cases} cases, ${report.visits} recall visits, ${report.photos} photographs.`);
  }
  const stopPruning = sessions.startPruning();
  const server: Server = app.listen(config.port, () => {
    const address = server.address();
    const port = typeof address === 'object' && address ? address.port : config.port;
    console.log(`Tidemark is listening on http://localhost:${port} (data in ${config.dataDir})`);
  });
  const shutdown = (): void => {
    stopPruning();
    server.close(() => {
      dataSource.destroy().finally(() => process.exit(0));
    });
  };
  process.on('SIGTERM', shutdown);
  process.on('SIGINT', shutdown);
}

main().catch((error: unknown) => {
  console.error('Tidemark could not start:', error);
  process.exit(1);
});
