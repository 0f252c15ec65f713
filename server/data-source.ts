import 'reflect-metadata';
import { AsyncLocalStorage } from 'node:async_hooks';
import { mkdirSync } from 'node:fs';
import path from 'node:path';
import { DataSource } from 'typeorm';
import { ActionItem } from './entities/action-item.entity';
import { AuditCycle } from './entities/audit-cycle.entity';
import { AuditStandard } from './entities/audit-standard.entity';
import { Audit } from './entities/audit.entity';
import { CalibrationReading } from './entities/calibration-reading.entity';
import { ChangeRecord } from './entities/change-record.entity';
import { Complication } from './entities/complication.entity';
import { MailMessage } from './entities/mail-message.entity';
import { Patient } from './entities/patient.entity';
import { Photo } from './entities/photo.entity';
import { RecoveryCode } from './entities/recovery-code.entity';
import { RecallSchedule } from './entities/recall-schedule.entity';
import { ReviewNote } from './entities/review-note.entity';
import { SessionRow } from './entities/session.entity';
import { SiteMeasurement } from './entities/site-measurement.entity';
import { Site } from './entities/site.entity';
import { SurgicalCase } from './entities/surgical-case.entity';
import { User } from './entities/user.entity';
import { UserSecondFactor } from './entities/user-second-factor.entity';
import { Visit } from './entities/visit.entity';
import { IS_POSTGRES_SCHEMA, isPostgresUrl } from './entities/column-types';
import { migrations } from './migrations';

/** Every entity the application maps. */
export const entities = [User, SessionRow, Patient, SurgicalCase, Site, Visit, SiteMeasurement, Complication, Photo, ChangeRecord, RecallSchedule, Audit, AuditStandard, AuditCycle, ActionItem, ReviewNote, CalibrationReading, MailMessage, UserSecondFactor, RecoveryCode];

/** Options for {@link createDataSource}. */
export interface DataSourceOptions {
  /** SQLite file path, or ':memory:' (used when `url` is not a PostgreSQL address). */
  database: string;
  /** A `postgres://` connection string (DATABASE_URL): PostgreSQL instead of the SQLite file. */
  url?: string | null;
  /** Log SQL (debugging only). */
  isLogging?: boolean;
}

/**
 * The one place a TypeORM DataSource is built: PostgreSQL when `url` is a postgres:// address,
 * otherwise the SQLite file. SQLite pragmas are set on every open: better-sqlite3 reports
 * synchronous=NORMAL on later opens of a WAL file unless told.
 *
 * @throws {Error} when `url` is PostgreSQL but the process started without DATABASE_URL pointing
 *   there (entities and migrations pick their column types from it at start)
 */
export function createDataSource(options: DataSourceOptions): DataSource {
  if (isPostgresUrl(options.url)) {
    if (!IS_POSTGRES_SCHEMA) throw new Error('A PostgreSQL data source needs DATABASE_URL=postgres://… in the environment when the process starts.');
    return new DataSource({
      type: 'postgres',
      url: options.url ?? undefined,
      entities,
      migrations,
      synchronize: false,
      migrationsRun: false,
      logging: options.isLogging ?? false,
      applicationName: 'tidemark',
    });
  }
  if (IS_POSTGRES_SCHEMA) throw new Error('DATABASE_URL names PostgreSQL, but this data source was asked for the SQLite file.');
  if (options.database !== ':memory:') {
    mkdirSync(path.dirname(options.database), { recursive: true });
  }
  const dataSource = new DataSource({
    type: 'better-sqlite3',
    database: options.database,
    entities,
    migrations,
    synchronize: false,
    migrationsRun: false,
    logging: options.isLogging ?? false,
    prepareDatabase: (db) => {
      db.pragma('journal_mode = WAL');
      db.pragma('synchronous = FULL');
      db.pragma('foreign_keys = ON');
      db.pragma('busy_timeout = 5000');
    },
  });
  queueTransactions(dataSource);
  return dataSource;
}

/**
 * TypeORM drives SQLite through one connection, so two transactions begun at the same time
 * (two awaits in a `Promise.all`, a timer firing while a request's transaction waits) would
 * share it: SQLite refuses the second BEGIN and the first can commit the other's half.
 * Transactions on this data source therefore wait for each other, in the order begun. A
 * transaction begun inside another (same async context) runs at once, as TypeORM nests it.
 */
export function queueTransactions(dataSource: DataSource): void {
  const manager = dataSource.manager;
  const begin = manager.transaction.bind(manager) as (...args: unknown[]) => Promise<unknown>;
  const inside = new AsyncLocalStorage<true>();
  let tail: Promise<unknown> = Promise.resolve();
  const queued = (...args: unknown[]): Promise<unknown> => {
    if (inside.getStore()) return begin(...args);
    const run = tail.then(() => inside.run(true, () => begin(...args)));
    tail = run.catch(() => undefined);
    return run;
  };
  manager.transaction = queued as typeof manager.transaction;
}

/** Opens the data source and brings the schema up to date. */
export async function openDatabase(options: DataSourceOptions): Promise<DataSource> {
  const dataSource = createDataSource(options);
  await dataSource.initialize();
  await dataSource.runMigrations({ transaction: 'each' });
  return dataSource;
}
