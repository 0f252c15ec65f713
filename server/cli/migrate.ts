/** `npm run migrate [-- --revert]`: applies pending migrations, or reverts the last one. */
import 'reflect-metadata';
import { loadConfig } from '../config';
import { createDataSource } from '../data-source';

const config = loadConfig();
const dataSource = createDataSource({ database: config.databaseFile });
await dataSource.initialize();
if (process.argv.includes('--revert')) {
  await dataSource.undoLastMigration({ transaction: 'each' });
  console.log('Reverted the last migration.');
} else {
  const applied = await dataSource.runMigrations({ transaction: 'each' });
  console.log(applied.length ? `Applied: ${applied.map((migration) => migration.name).join(', ')}` : 'The schema is up to date.');
}
await dataSource.destroy();
