import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, DestroyRef, LOCALE_ID, computed, effect, inject, input, signal, untracked } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { Subscription, switchMap, tap } from 'rxjs';
import { failureSentence } from '../../../shared/failure-sentence/failure-sentence';
import { JOB_POLL_INTERVAL_MS, pollUntilFinished } from '../../../shared/job-polling/poll-until-finished';
import { JobProgress } from '../../../shared/job-progress/job-progress';
import { ReportScope, scopeWords, workbookFileName } from '../report-scope';
import { ExportJob, JobId, ReportsApi, exportFileUrl, isExportFinished } from '../reports-api';

/** Where the builder stands: nothing asked yet, building, ready to download, or failed. */
type BuildPhase = 'idle' | 'building' | 'ready' | 'failed';

/**
 * Starts a governance workbook export for one scope, follows the server job with a
 * determinate bar, then offers the file. A failure is told once, in the server's words.
 */
@Component({
  selector: 'tm-workbook-builder',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DecimalPipe, JobProgress, MatButtonModule, MatIconModule],
  templateUrl: './workbook-builder.html',
  styleUrl: './workbook-builder.scss',
})
export class WorkbookBuilder {
  private readonly api = inject(ReportsApi);
  private readonly destroyRef = inject(DestroyRef);
  private readonly pollIntervalMs = inject(JOB_POLL_INTERVAL_MS);
  /** Numbers are written the way the browser's language writes them. */
  private readonly locale = inject(LOCALE_ID);
  private running: Subscription | null = null;

  /** The audit and scope the workbook covers. */
  readonly scope = input.required<ReportScope>();

  protected readonly phase = signal<BuildPhase>('idle');
  protected readonly job = signal<ExportJob | null>(null);
  private readonly jobId = signal<JobId | null>(null);
  private readonly startedAt = signal(new Date());
  protected readonly failure = signal<string | null>(null);

  protected readonly scopeWords = computed(() => scopeWords(this.scope()));
  protected readonly fileName = computed(() => this.job()?.fileName || workbookFileName(this.scope(), this.startedAt()));
  protected readonly fileUrl = computed(() => {
    const jobId = this.jobId();
    return jobId === null ? null : exportFileUrl(jobId);
  });
  protected readonly progressLabel = computed(() => {
    const rows = this.job()?.rows ?? 0;
    return rows > 0 ? `Building the workbook: ${rows.toLocaleString(this.locale)} rows written` : 'Building the workbook';
  });

  constructor() {
    // A workbook belongs to the scope it was built for: a new choice starts afresh.
    effect(() => {
      this.scope();
      untracked(() => this.reset());
    });
  }

  protected buildWorkbook(): void {
    if (this.phase() === 'building') return;
    const { audit, cycle } = this.scope();
    this.reset();
    this.phase.set('building');
    this.job.set({ state: 'running', progress: 0, rows: 0 });
    this.running = this.api
      .startExport(audit.id, cycle?.id ?? null)
      .pipe(
        tap(({ jobId }) => {
          this.jobId.set(jobId);
          this.startedAt.set(new Date());
        }),
        switchMap(({ jobId }) => pollUntilFinished(() => this.api.exportStatus(jobId), isExportFinished, this.pollIntervalMs)),
        takeUntilDestroyed(this.destroyRef),
      )
      .subscribe({
        next: (job) => this.follow(job),
        error: (error: unknown) => this.fail(failureSentence(error, 'The workbook could not be built. Try again.')),
      });
  }

  private follow(job: ExportJob): void {
    this.job.set(job);
    if (job.state === 'done') {
      this.phase.set('ready');
    } else if (job.state === 'failed') {
      this.fail(job.error || 'The workbook could not be built. Try again.');
    }
  }

  private fail(sentence: string): void {
    this.phase.set('failed');
    this.failure.set(sentence);
  }

  private reset(): void {
    this.running?.unsubscribe();
    this.running = null;
    this.phase.set('idle');
    this.job.set(null);
    this.jobId.set(null);
    this.failure.set(null);
  }
}
