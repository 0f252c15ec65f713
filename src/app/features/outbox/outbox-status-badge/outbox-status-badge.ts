import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import type { OutboxEntry } from '../outbox-entry';

/** The look of a message's state: icon, word and tone. */
export interface OutboxStatusLook {
  readonly icon: string;
  readonly word: string;
  readonly tone: 'calm' | 'attention' | 'quiet';
}

/**
 * A message's state in words. A queued message that has been tried already is waiting to
 * retry (with a reason in the last-error column); one never tried is waiting for its first send.
 */
export function outboxStatusLook(entry: Pick<OutboxEntry, 'status' | 'attempts'>): OutboxStatusLook {
  switch (entry.status) {
    case 'sent':
      return { icon: 'mark_email_read', word: 'Sent', tone: 'calm' };
    case 'failed':
      return { icon: 'unsubscribe', word: 'Failed', tone: 'attention' };
    case 'queued':
      return entry.attempts > 0
        ? { icon: 'schedule_send', word: 'Waiting to retry', tone: 'attention' }
        : { icon: 'outgoing_mail', word: 'Waiting to send', tone: 'quiet' };
  }
}

/** A message's state as an icon and a word, never colour alone. */
@Component({
  selector: 'tm-outbox-status-badge',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatIconModule],
  template: `<mat-icon aria-hidden="true">{{ look().icon }}</mat-icon><span>{{ look().word }}</span>`,
  styles: `
    :host {
      display: inline-flex;
      align-items: center;
      gap: 6px;
      padding: 3px 12px 3px 8px;
      border-radius: var(--mat-sys-corner-full);
      font: var(--mat-sys-label-large);
      white-space: nowrap;
      background: var(--mat-sys-secondary-container);
      color: var(--mat-sys-on-secondary-container);
    }
    :host(.attention) {
      background: var(--tm-attention-container);
      color: var(--tm-on-attention-container);
    }
    :host(.quiet) {
      background: transparent;
      color: var(--mat-sys-on-surface);
      box-shadow: inset 0 0 0 1px var(--mat-sys-outline);
    }
    mat-icon {
      width: 20px;
      height: 20px;
      font-size: 20px;
    }
  `,
  host: { '[class]': 'look().tone' },
})
export class OutboxStatusBadge {
  /** The message whose state is shown. */
  readonly entry = input.required<Pick<OutboxEntry, 'status' | 'attempts'>>();

  protected readonly look = computed(() => outboxStatusLook(this.entry()));
}
