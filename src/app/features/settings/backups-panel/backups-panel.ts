import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, DestroyRef, LOCALE_ID, computed, inject, input, output, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatTableModule } from '@angular/material/table';
import type { BackupFile, BackupTaken, BackupsOverview, PhotoStorageOverview } from '@tidemark/shared';
import { apiErrorDetails } from '../../../core/http/api-error-details';
import { describeHttpError } from '../../../core/http/describe-http-error';
import { LocalDatePipe } from '../../../shared/dates/local-date-pipe';
import { formatByteSize } from '../byte-size';
import { BACKUP_KIND_LABELS, backupPhotosNote } from '../installation-wording';
import { SettingsApi } from '../settings-api';

/** Columns of the backups table, in order. */
const COLUMNS = ['takenAt', 'kind', 'name', 'size'] as const;

/** The backups card: the files in the backups folder and "take a backup now" (SQLite only). */
@Component({
  selector: 'tm-backups-panel',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [LocalDatePipe, MatButtonModule, MatIconModule, MatProgressBarModule, MatTableModule],
  templateUrl: './backups-panel.html',
  styleUrl: './backups-panel.scss',
})
export class BackupsPanel {
  private readonly settingsApi = inject(SettingsApi);
  private readonly snackBar = inject(MatSnackBar);
  private readonly destroyRef = inject(DestroyRef);
  private readonly locale = inject(LOCALE_ID);

  /** The backups folder as the overview reported it. */
  readonly backups = input.required<BackupsOverview>();
  /** Where photographs are kept: backups hold those of the uploads folder, not those in object storage. */
  readonly photoStorage = input<PhotoStorageOverview>(null);
  /** A backup was taken and checked: the page reads the overview again. */
  readonly backupTaken = output<BackupTaken>();

  protected readonly columns = COLUMNS;
  protected readonly photosNote = computed(() => backupPhotosNote(this.photoStorage()));
  protected readonly isTakingBackup = signal(false);
  /** Why the last attempt failed, in a sentence. */
  protected readonly failure = signal<string | null>(null);

  protected kindLabel(file: BackupFile): string {
    return BACKUP_KIND_LABELS[file.kind];
  }

  protected size(bytes: number): string {
    return formatByteSize(bytes, this.locale);
  }

  /** Rows keyed by folder and name: a daily and a manual backup of the same second share a name. */
  protected readonly trackByFile = (_index: number, file: BackupFile): string => `${file.kind}/${file.name}`;

  protected takeBackup(): void {
    if (this.isTakingBackup()) return;
    this.isTakingBackup.set(true);
    this.failure.set(null);
    this.settingsApi
      .takeBackup()
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: (taken) => {
          this.isTakingBackup.set(false);
          this.snackBar.open(`Backup ${taken.name} taken and checked (${this.size(taken.bytes)}).`, 'OK', { duration: 8000 });
          this.backupTaken.emit(taken);
        },
        error: (error: unknown) => {
          this.isTakingBackup.set(false);
          this.failure.set(backupFailure(error));
        },
      });
  }
}

/** Why a backup failed, in the person's words: the server's own reason for a refusal (409), ours otherwise. */
export function backupFailure(error: unknown): string {
  if (!(error instanceof HttpErrorResponse)) return 'The backup could not be taken. Try again.';
  const details = apiErrorDetails(error);
  if (error.status === 409 && details) return details.message;
  if (error.status >= 500) return 'The backup could not be taken: the server could not write or check the copy. The live database is unchanged. Look at free disk space, then try again.';
  return describeHttpError(error);
}
