import 'reflect-metadata';
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
import { RecallSchedule } from './entities/recall-schedule.entity';
import { ReviewNote } from './entities/review-note.entity';
import { SessionRow } from './entities/session.entity';
import { SiteMeasurement } from './entities/site-measurement.entity';
import { Site } from './entities/site.entity';
import { SurgicalCase } from './entities/surgical-case.entity';
import { User } from './entities/user.entity';
import { Visit } from './entities/visit.entity';
import { migrations } from './migrations';

/** Every entity the application maps. */
export const entities = [User, SessionRow, Patient, SurgicalCase, Site, Visit, SiteMeasurement, Complication, Photo, ChangeRecord, RecallSchedule, Audit, AuditStandard, AuditCycle, ActionItem, ReviewNote, CalibrationReading, MailMessage];

/** Options for {@link createDataSource}. */
export interface DataSourceOptions {
  /** SQLite file path, or ':memory:'. */
  database: string;
  /** Log SQL (debugging only). */
  isLogging?: boolean;
}

/**
 * The one place a TypeORM DataSource is built. Pragmas are set on every open:
 * better-sqlite3 reports synchronous=NORMAL on later opens of a WAL file unless told.
 */
export function createDataSource(options: DataSourceOptions): DataSource {
  if (options.database !== ':memory:') {
    mkdirSync(path.dirname(options.database), { recursive: true });
  }
  return new DataSource({
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
}

/** Opens the data source and brings the schema up to date. */
export async function openDatabase(options: DataSourceOptions): Promise<DataSource> {
  const dataSource = createDataSource(options);
  await dataSource.initialize();
  await dataSource.runMigrations({ transaction: 'each' });
  return dataSource;
}
