/**
 * `npm run migrate [-- --revert | --revert-all]`: applies pending migrations, reverts the last
 * one, or reverts every one (an empty schema; used to prove each `down` works). Works on the
 * SQLite file or, with DATABASE_URL=postgres://…, on PostgreSQL.
 */
import 'reflect-metadata';
import { loadConfig } from '../config';
import { createDataSource } from '../data-source';

const config = loadConfig();
const dataSource = createDataSource({ database: config.databaseFile, url: config.databaseUrl });
await dataSource.initialize();
const where = config.databaseUrl ? 'PostgreSQL' : config.databaseFile;
if (process.argv.includes('--revert-all')) {
  const runner = dataSource.createQueryRunner();
  const appliedCount = async (): Promise<number> =>
    (await runner.hasTable('migrations')) ? Number(((await runner.query('SELECT COUNT(*) AS n FROM migrations')) as { n: number | string }[])[0]?.n ?? 0) : 0;
  let reverted = 0;
  while ((await appliedCount()) > 0) {
    await dataSource.undoLastMigration({ transaction: 'each' });
    reverted += 1;
  }
  await runner.release();
  console.log(`Reverted ${reverted} migrations on ${where}.`);
} else if (process.argv.includes('--revert')) {
  await dataSource.undoLastMigration({ transaction: 'each' });
  console.log(`Reverted the last migration on ${where}.`);
} else {
  const applied = await dataSource.runMigrations({ transaction: 'each' });
  console.log(applied.length ? `Applied on ${where}: ${applied.map((migration) => migration.name).join(', ')}` : `The schema on ${where} is up to date.`);
}
await dataSource.destroy();
