import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { OUTBOX_KIND_LABELS, OutboxEntry, canRetry } from '../outbox-entry';
import { OutboxStatusBadge } from '../outbox-status-badge/outbox-status-badge';
import { LocalDatePipe } from '../../../shared/dates/local-date-pipe';

/** One message in full: addressee, state, times, the last error and the body as sent. */
@Component({
  selector: 'tm-message-detail',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [LocalDatePipe, MatButtonModule, MatIconModule, OutboxStatusBadge],
  templateUrl: './message-detail.html',
  styleUrl: './message-detail.scss',
})
export class MessageDetail {
  /** The message shown. */
  readonly entry = input.required<OutboxEntry>();
  /** Whether a retry of this message is under way. */
  readonly isRetrying = input(false);
  /** Asks to send the message again. */
  readonly retry = output<OutboxEntry>();
  /** Asks to close the panel. */
  readonly closed = output<void>();

  protected readonly kindLabel = computed(() => OUTBOX_KIND_LABELS[this.entry().kind]);
  protected readonly canRetry = computed(() => canRetry(this.entry()));
}
