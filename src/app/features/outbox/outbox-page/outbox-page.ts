import { ChangeDetectionStrategy, Component, DestroyRef, computed, effect, inject, signal, viewChild } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatPaginator, MatPaginatorModule } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatTableDataSource, MatTableModule } from '@angular/material/table';
import { switchMap } from 'rxjs';
import { MessageDetail } from '../message-detail/message-detail';
import { OutboxApi } from '../outbox-api';
import { OUTBOX_KIND_LABELS, OutboxEntry, canRetry, describeScheduleRun } from '../outbox-entry';
import { OutboxStatusBadge, outboxStatusLook } from '../outbox-status-badge/outbox-status-badge';
import { LocalDatePipe } from '../../../shared/dates/local-date-pipe';

/** Columns of the message table, in order. */
const COLUMNS = ['message', 'to', 'status', 'attempts', 'lastError', 'times', 'actions'] as const;

/** What became of a retried message, once the list was read again. */
export function retryOutcome(entry: OutboxEntry | undefined, to: string): string {
  if (!entry) return `The message to ${to} was sent again.`;
  if (entry.status === 'sent') return `The message to ${to} was sent.`;
  const look = outboxStatusLook(entry);
  return `The message to ${to} is ${look.word.toLowerCase()}${entry.lastError ? `: ${entry.lastError}` : '.'}`;
}

/** Outbox (admin): every e-mail Tidemark queued or sent, with retry and "run the schedules now". */
@Component({
  selector: 'tm-outbox-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [LocalDatePipe, MatButtonModule, MatIconModule, MatPaginatorModule, MatProgressBarModule, MatTableModule, MessageDetail, OutboxStatusBadge],
  templateUrl: './outbox-page.html',
  styleUrl: './outbox-page.scss',
})
export class OutboxPage {
  private readonly api = inject(OutboxApi);
  private readonly destroyRef = inject(DestroyRef);

  protected readonly columns = COLUMNS;
  protected readonly canRetry = canRetry;

  protected readonly messages = new MatTableDataSource<OutboxEntry>([]);
  private readonly entries = signal<readonly OutboxEntry[]>([]);
  protected readonly isLoading = signal(true);
  protected readonly hasLoadFailed = signal(false);
  protected readonly isRunning = signal(false);
  /** The message being retried, so its buttons pause meanwhile. */
  protected readonly retryingId = signal<number | null>(null);
  /** The last thing an action achieved, in one sentence. */
  protected readonly outcome = signal<string | null>(null);

  private readonly selectedId = signal<number | null>(null);
  protected readonly selected = computed(() => this.entries().find((entry) => entry.id === this.selectedId()) ?? null);
  protected readonly problemCount = computed(() => this.entries().filter((entry) => entry.status !== 'sent').length);

  private readonly paginator = viewChild.required(MatPaginator);

  constructor() {
    effect(() => (this.messages.paginator = this.paginator()));
    this.loadMessages();
  }

  protected loadMessages(): void {
    this.isLoading.set(true);
    this.hasLoadFailed.set(false);
    this.api
      .list()
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: (entries) => this.show(entries),
        // The error notice has said why; the table offers a retry.
        error: () => {
          this.isLoading.set(false);
          this.hasLoadFailed.set(true);
        },
      });
  }

  protected kindLabel(entry: OutboxEntry): string {
    return OUTBOX_KIND_LABELS[entry.kind];
  }

  protected openMessage(entry: OutboxEntry): void {
    this.selectedId.set(entry.id);
  }

  protected closeMessage(): void {
    this.selectedId.set(null);
  }

  protected retryMessage(entry: OutboxEntry): void {
    this.retryingId.set(entry.id);
    this.outcome.set(null);
    this.api
      .retry(entry.id)
      .pipe(
        // The server tries the delivery at once; read the list again to show how it went.
        switchMap(() => this.api.list()),
        takeUntilDestroyed(this.destroyRef),
      )
      .subscribe({
        next: (entries) => {
          this.retryingId.set(null);
          this.show(entries);
          this.outcome.set(retryOutcome(entries.find((row) => row.id === entry.id), entry.to));
        },
        // The error notice gives the server's reason (e.g. already sent); the row is unchanged.
        error: () => this.retryingId.set(null),
      });
  }

  protected runSchedules(): void {
    this.isRunning.set(true);
    this.outcome.set(null);
    this.api
      .runSchedules()
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: (run) => {
          this.isRunning.set(false);
          this.outcome.set(describeScheduleRun(run));
          this.loadMessages();
        },
        error: () => this.isRunning.set(false),
      });
  }

  private show(entries: readonly OutboxEntry[]): void {
    this.entries.set(entries);
    this.messages.data = [...entries];
    this.isLoading.set(false);
  }
}
