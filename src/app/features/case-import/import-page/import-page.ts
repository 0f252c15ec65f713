import { HttpEventType, HttpResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, DestroyRef, LOCALE_ID, ElementRef, computed, inject, signal, viewChild } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import { filter, map, switchMap, tap } from 'rxjs';
import { failureSentence } from '../../../shared/failure-sentence/failure-sentence';
import { JOB_POLL_INTERVAL_MS, pollUntilFinished } from '../../../shared/job-polling/poll-until-finished';
import { JobProgress } from '../../../shared/job-progress/job-progress';
import {
  CaseImportApi,
  IMPORT_MAX_BYTES,
  ImportCounts,
  ImportJob,
  ImportJobId,
  ImportStarted,
  importErrorReportUrl,
  importTemplateUrl,
  isImportFinished,
} from '../case-import-api';
import { ImportColumnGuide } from '../import-column-guide/import-column-guide';
import { ImportErrorTable } from '../import-error-table/import-error-table';

/** What the picker offers; the server checks the content either way. */
export const ACCEPTED_IMPORT_TYPES = '.xlsx,.csv,application/vnd.openxmlformats-officedocument.spreadsheetml.sheet,text/csv';

/** Where the page stands: nothing sent, sending the file, the server working, or an ending. */
type ImportPhase = 'idle' | 'uploading' | 'working' | 'done' | 'rejected' | 'failed';

/** The stored counts in one sentence, numbers written the way `locale` (Angular's `LOCALE_ID`) writes them. */
export function describeCounts(counts: ImportCounts, locale: string): string {
  const count = (n: number, one: string, many: string) => `${n.toLocaleString(locale)} ${n === 1 ? one : many}`;
  return `${count(counts.patients, 'patient', 'patients')}, ${count(counts.cases, 'case', 'cases')}, ${count(counts.sites, 'site', 'sites')} and ${count(counts.visits, 'recall visit', 'recall visits')} were stored.`;
}

/** Import past cases (audit lead): template, upload, the server's check, then counts or row errors. */
@Component({
  selector: 'tm-import-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ImportColumnGuide, ImportErrorTable, JobProgress, MatButtonModule, MatIconModule, RouterLink],
  templateUrl: './import-page.html',
  styleUrl: './import-page.scss',
})
export class ImportPage {
  private readonly api = inject(CaseImportApi);
  private readonly destroyRef = inject(DestroyRef);
  private readonly pollIntervalMs = inject(JOB_POLL_INTERVAL_MS);
  /** Numbers are written the way the browser's language writes them. */
  private readonly locale = inject(LOCALE_ID);
  private readonly fileInput = viewChild.required<ElementRef<HTMLInputElement>>('fileInput');

  protected readonly accept = ACCEPTED_IMPORT_TYPES;
  protected readonly maxMegabytes = IMPORT_MAX_BYTES / (1024 * 1024);
  protected readonly xlsxTemplate = importTemplateUrl('xlsx');
  protected readonly csvTemplate = importTemplateUrl('csv');

  protected readonly file = signal<File | null>(null);
  protected readonly phase = signal<ImportPhase>('idle');
  protected readonly uploadFraction = signal(0);
  protected readonly job = signal<ImportJob | null>(null);
  private readonly jobId = signal<ImportJobId | null>(null);
  protected readonly failure = signal<string | null>(null);

  protected readonly isBusy = computed(() => this.phase() === 'uploading' || this.phase() === 'working');
  protected readonly workLabel = computed(() => (this.job()?.state === 'importing' ? 'Storing the cases' : 'Checking every row'));
  protected readonly errorReportUrl = computed(() => {
    const jobId = this.jobId();
    return jobId === null ? null : importErrorReportUrl(jobId);
  });
  protected readonly rowsToCorrect = computed(() => new Set(this.job()?.errors.map((error) => error.row) ?? []).size);
  protected readonly storedSentence = computed(() => {
    const job = this.job();
    return job ? describeCounts(job.counts, this.locale) : '';
  });

  protected chooseFile(files: FileList | null): void {
    const file = files?.item(0) ?? null;
    this.clearOutcome();
    if (file && file.size > IMPORT_MAX_BYTES) {
      // Saves sending a large file only to hear the server refuse it.
      this.failure.set(`That file is ${(file.size / (1024 * 1024)).toFixed(1)} MB; files up to ${this.maxMegabytes} MB are accepted.`);
      this.phase.set('failed');
      this.file.set(null);
      this.fileInput().nativeElement.value = '';
      return;
    }
    this.file.set(file);
  }

  protected importFile(): void {
    const file = this.file();
    if (!file || this.isBusy()) return;
    this.clearOutcome();
    this.phase.set('uploading');
    this.api
      .upload(file)
      .pipe(
        tap((event) => {
          if (event.type === HttpEventType.UploadProgress && event.total) {
            this.uploadFraction.set(event.loaded / event.total);
          }
        }),
        filter((event): event is HttpResponse<ImportStarted> => event.type === HttpEventType.Response),
        map((response) => response.body),
        filter((body): body is ImportStarted => body !== null),
        tap(({ jobId }) => {
          this.jobId.set(jobId);
          this.uploadFraction.set(1);
          this.phase.set('working');
        }),
        switchMap(({ jobId }) => pollUntilFinished(() => this.api.status(jobId), isImportFinished, this.pollIntervalMs)),
        takeUntilDestroyed(this.destroyRef),
      )
      .subscribe({
        next: (job) => this.follow(job),
        error: (error: unknown) => this.fail(failureSentence(error, 'The file could not be imported. Try again.')),
      });
  }

  private follow(job: ImportJob): void {
    this.job.set(job);
    if (job.state === 'done' || job.state === 'rejected') {
      this.phase.set(job.state);
      this.file.set(null);
      this.fileInput().nativeElement.value = '';
    } else if (job.state === 'failed') {
      this.fail(job.error || 'The import stopped before anything was stored. Try again.');
    }
  }

  private fail(sentence: string): void {
    this.phase.set('failed');
    this.failure.set(sentence);
  }

  private clearOutcome(): void {
    this.phase.set('idle');
    this.failure.set(null);
    this.job.set(null);
    this.jobId.set(null);
    this.uploadFraction.set(0);
  }
}
