import { randomUUID } from 'node:crypto';
import { mkdirSync, readdirSync, rmSync, statSync } from 'node:fs';
import path from 'node:path';
import type { Role } from '@tidemark/shared';
import { HttpError } from '../http-error';
import { ExpiringJobs, JOB_LIFETIME_MS } from './expiring-jobs';
import type { GovernancePackService } from './governance-pack.service';
import { writeGovernanceWorkbook } from './governance-workbook';

/** DESIGN.md §2: the audit lead, partners and the governance committee export the workbook. */
export const EXPORT_ROLES: readonly Role[] = ['audit_lead', 'partner', 'governance'];

/** `GET /api/exports/:jobId`. */
export interface ExportJobView {
  state: 'running' | 'done' | 'failed';
  /** 0–1. */
  progress: number;
  /** Site-visit rows written so far. */
  rows: number;
  error?: string;
}

interface ExportJob extends ExportJobView {
  ownerId: number;
  stagePath: string;
  filePath: string;
  /** Download name: audit and cycle, never patient data. */
  downloadName: string;
}

/** A finished workbook ready to send. */
export interface ExportFile {
  path: string;
  downloadName: string;
}

/** Options of the export service. */
export interface GovernanceExportOptions {
  /** `<dataDir>/exports`. */
  exportsDir: string;
  /** Where a failed job's error goes (the job itself only says that it failed). */
  logError?: (error: unknown) => void;
  now?: () => number;
}

/**
 * Governance workbooks as background jobs: start, poll progress, download (only the person who
 * started it), gone after an hour. Jobs run one at a time, so two large exports never hold their
 * data in memory together.
 */
export class GovernanceExportService {
  readonly jobs: ExpiringJobs<ExportJob>;
  private queue: Promise<void> = Promise.resolve();
  private readonly exportsDir: string;
  private readonly logError: (error: unknown) => void;

  constructor(
    private readonly packs: GovernancePackService,
    options: GovernanceExportOptions,
  ) {
    this.exportsDir = options.exportsDir;
    this.logError = options.logError ?? ((error) => console.error('Governance export failed:', error));
    this.jobs = new ExpiringJobs<ExportJob>((job) => [job.stagePath, job.filePath], JOB_LIFETIME_MS, options.now);
    mkdirSync(this.exportsDir, { recursive: true, mode: 0o700 });
    this.removeLeftovers(options.now?.() ?? Date.now());
  }

  /** Files a previous run of the server left behind are past any job's lifetime once it restarted. */
  private removeLeftovers(now: number): void {
    for (const name of readdirSync(this.exportsDir)) {
      const file = path.join(this.exportsDir, name);
      if (/\.xlsx$/.test(name) && now - statSync(file).mtimeMs > JOB_LIFETIME_MS) rmSync(file, { force: true });
    }
  }

  private assertExporter(user: Express.User): void {
    if (!EXPORT_ROLES.includes(user.role)) throw HttpError.forbidden('The audit lead, partners and the governance committee export the governance workbook.');
  }

  /** Checks access, the audit and the cycle, then queues the job; answers at once with its id. */
  async start(user: Express.User, auditId: number, cycleId: number | null): Promise<{ jobId: string }> {
    this.assertExporter(user);
    const target = await this.packs.target(auditId, cycleId);
    const jobId = randomUUID();
    const cyclePart = target.cycle ? `cycle-${target.cycle.number}` : 'live';
    const job: ExportJob = {
      state: 'running',
      progress: 0,
      rows: 0,
      ownerId: user.id,
      stagePath: path.join(this.exportsDir, `${jobId}.stage.xlsx`),
      filePath: path.join(this.exportsDir, `${jobId}.xlsx`),
      downloadName: `tidemark-governance-audit-${auditId}-${cyclePart}-${new Date().toISOString().slice(0, 10)}.xlsx`,
    };
    this.jobs.add(jobId, job);
    this.queue = this.queue.then(async () => {
      try {
        const pack = await this.packs.build(user, target);
        await writeGovernanceWorkbook(pack, { stagePath: job.stagePath, targetPath: job.filePath }, (progress, rows) => {
          job.progress = Math.min(1, Math.round(progress * 1000) / 1000);
          job.rows = rows;
        });
        job.state = 'done';
        job.progress = 1;
      } catch (error) {
        job.state = 'failed';
        job.error = 'The workbook could not be made. The error has been logged; try again or tell the administrator.';
        this.logError(error);
      }
    });
    return { jobId };
  }

  /** A job of this user, or 404 (someone else's job is not acknowledged either). */
  private ownJob(user: Express.User, jobId: string): ExportJob {
    this.assertExporter(user);
    const job = this.jobs.get(jobId);
    if (!job || job.ownerId !== user.id) throw HttpError.notFound('The export');
    return job;
  }

  status(user: Express.User, jobId: string): ExportJobView {
    const job = this.ownJob(user, jobId);
    return { state: job.state, progress: job.progress, rows: job.rows, ...(job.error ? { error: job.error } : {}) };
  }

  /** The finished file; 409 while it is being written, 404 once failed or expired. */
  file(user: Express.User, jobId: string): ExportFile {
    const job = this.ownJob(user, jobId);
    if (job.state === 'running') throw HttpError.conflict('The workbook is still being written.');
    if (job.state === 'failed') throw HttpError.notFound('The workbook');
    return { path: job.filePath, downloadName: job.downloadName };
  }

  /** Resolves when every queued job has finished (tests, shutdown). */
  idle(): Promise<void> {
    return this.queue;
  }
}
