import { randomUUID } from 'node:crypto';
import type { DataSource } from 'typeorm';
import type { ImportCounts, ImportIssue, ImportJobState, ImportJobView } from '@tidemark/shared';
import { IMPORT_ERRORS_SHOWN } from '@tidemark/shared';
import { ExpiringJobs, JOB_LIFETIME_MS } from '../export/expiring-jobs';
import { HttpError } from '../http-error';
import type { ScheduleService } from '../services/schedule.service';
import { csvLine } from './csv-line';
import { buildImportPlan } from './import-plan';
import { importFileKind, readImportTable } from './import-table';
import { csvTemplate, xlsxTemplate } from './import-template';
import { writeImportPlan } from './import-writer';
import { writeImportPlanOnPostgres } from './postgres-import-writer';
import { sqliteConnection } from './sqlite-connection';

/** An import in progress or finished (kept in memory for an hour; the file itself is never stored). */
interface ImportJob {
  ownerId: number;
  state: ImportJobState;
  progress: number;
  counts: ImportCounts;
  issues: ImportIssue[];
}

/** Called as the import moves on (the kill test watches it; the job keeps it for polls). */
export type ImportProgress = (state: ImportJobState, progress: number) => void;

/** Options of the import service. */
export interface ImportServiceOptions {
  logError?: (error: unknown) => void;
  now?: () => number;
}

const NO_COUNTS: ImportCounts = { patients: 0, cases: 0, sites: 0, visits: 0 };

/**
 * Historical import (audit lead only): a long-format file checked row by row and as a whole,
 * then written all-or-nothing in one transaction. Jobs run one at a time.
 */
export class ImportService {
  readonly jobs: ExpiringJobs<ImportJob>;
  private queue: Promise<void> = Promise.resolve();
  private readonly logError: (error: unknown) => void;

  constructor(
    private readonly dataSource: DataSource,
    private readonly schedules: ScheduleService,
    options: ImportServiceOptions = {},
  ) {
    this.jobs = new ExpiringJobs<ImportJob>(() => [], JOB_LIFETIME_MS, options.now);
    this.logError = options.logError ?? ((error) => console.error('Historical import failed:', error));
  }

  private assertImporter(user: Express.User): void {
    if (user.role !== 'audit_lead') throw HttpError.forbidden('Only the audit lead imports historical records.');
  }

  /** The template in either format. */
  async template(user: Express.User, kind: 'xlsx' | 'csv'): Promise<Buffer> {
    this.assertImporter(user);
    return kind === 'csv' ? csvTemplate() : xlsxTemplate();
  }

  /** Checks the file's kind by content (415 otherwise) and queues the import; answers with its id. */
  async start(user: Express.User, bytes: Buffer | undefined): Promise<{ jobId: string }> {
    this.assertImporter(user);
    if (!bytes || bytes.length === 0) throw HttpError.badRequest('Attach the file to import.', { file: 'Attach an .xlsx or .csv file made from the template.' });
    await importFileKind(bytes);
    const jobId = randomUUID();
    const job: ImportJob = { ownerId: user.id, state: 'validating', progress: 0, counts: NO_COUNTS, issues: [] };
    this.jobs.add(jobId, job);
    this.queue = this.queue.then(async () => {
      try {
        const outcome = await this.importFile(user, bytes, (state, progress) => {
          job.state = state;
          job.progress = progress;
        });
        Object.assign(job, outcome);
      } catch (error) {
        job.state = 'failed';
        job.issues = [{ row: 0, column: '', message: 'The import stopped on an unexpected error; nothing was written. The error has been logged.' }];
        this.logError(error);
      }
    });
    return { jobId };
  }

  /**
   * Runs one import to its end: read, check every row and the file as a whole, then write in one
   * transaction (which also runs the database checks). Rejected imports write nothing.
   */
  async importFile(user: Express.User, bytes: Buffer, onProgress: ImportProgress = () => undefined): Promise<Omit<ImportJob, 'ownerId'>> {
    this.assertImporter(user);
    const kind = await importFileKind(bytes);
    onProgress('validating', 0.02);
    const table = await readImportTable(kind, bytes);
    if (table.issues.length) return { state: 'rejected', progress: 1, counts: NO_COUNTS, issues: table.issues };
    onProgress('validating', 0.1);
    const knownIntervals = await this.schedules.knownIntervalKeys();
    const plan = await buildImportPlan(table, knownIntervals, (fraction) => onProgress('validating', 0.1 + 0.6 * fraction));
    onProgress('importing', 0.7);
    const onWritten = (fraction: number): void => onProgress('importing', 0.7 + 0.3 * fraction);
    // SQLite keeps its fast synchronous path on the raw connection; PostgreSQL goes through a TypeORM transaction.
    const result =
      this.dataSource.options.type === 'postgres'
        ? await writeImportPlanOnPostgres(this.dataSource, plan, user.id, onWritten)
        : writeImportPlan(sqliteConnection(this.dataSource), plan, user.id, onWritten);
    if (!result.isWritten) {
      const issues = [...result.issues].sort((a, b) => a.row - b.row);
      return { state: 'rejected', progress: 1, counts: plan.counts, issues };
    }
    return { state: 'done', progress: 1, counts: result.counts, issues: [] };
  }

  /** A job of this user, or 404 (another person's job is not acknowledged). */
  private ownJob(user: Express.User, jobId: string): ImportJob {
    this.assertImporter(user);
    const job = this.jobs.get(jobId);
    if (!job || job.ownerId !== user.id) throw HttpError.notFound('The import');
    return job;
  }

  status(user: Express.User, jobId: string): ImportJobView {
    const job = this.ownJob(user, jobId);
    return { state: job.state, progress: Math.round(job.progress * 1000) / 1000, counts: job.counts, errors: job.issues.slice(0, IMPORT_ERRORS_SHOWN), errorCount: job.issues.length };
  }

  /** Every issue as CSV (row, column, message). */
  errorsCsv(user: Express.User, jobId: string): string {
    const job = this.ownJob(user, jobId);
    return csvLine(['row', 'column', 'message']) + job.issues.map((issue) => csvLine([issue.row, issue.column, issue.message])).join('');
  }

  /** Resolves when every queued import has finished (tests, shutdown). */
  idle(): Promise<void> {
    return this.queue;
  }
}
