import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import type { RecallDueItem, RecallDueState } from '@tidemark/shared';
import { LocalDatePipe } from '../../../shared/dates/local-date-pipe';

/** Icon and word per recall state; coral marks overdue, always with both. */
export const RECALL_STATE_LOOK: Readonly<Record<RecallDueState, { icon: string; word: string }>> = {
  'in-window': { icon: 'event_available', word: 'In window' },
  overdue: { icon: 'event_busy', word: 'Overdue' },
  upcoming: { icon: 'upcoming', word: 'Coming up' },
};

const DAY_MS = 86_400_000;

/** Whole days from `from` to `to` (both YYYY-MM-DD). */
export function daysBetween(from: string, to: string): number {
  return Math.round((Date.parse(`${to}T00:00:00Z`) - Date.parse(`${from}T00:00:00Z`)) / DAY_MS);
}

/** How far the window is from today, in words, e.g. "closes in 3 days". */
export function windowDistance(item: RecallDueItem, asOf: string): string {
  const days = (count: number) => (count === 1 ? '1 day' : `${count} days`);
  switch (item.state) {
    case 'in-window': {
      const left = daysBetween(asOf, item.windowCloses);
      return left === 0 ? 'Window closes today' : `Window closes in ${days(left)}`;
    }
    case 'overdue':
      return `Window closed ${days(daysBetween(item.windowCloses, asOf))} ago`;
    case 'upcoming': {
      const until = daysBetween(asOf, item.windowOpens);
      return until === 0 ? 'Window opens today' : `Window opens in ${days(until)}`;
    }
  }
}

/** One recall to see to: whose, which teeth, which interval, its window, and one click to enter it. */
@Component({
  selector: 'tm-recall-card',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [LocalDatePipe, MatButtonModule, MatIconModule, RouterLink],
  templateUrl: './recall-card.html',
  styleUrl: './recall-card.scss',
  host: { '[class]': 'item().state' },
})
export class RecallCard {
  readonly item = input.required<RecallDueItem>();
  /** The day the list was worked out for (the API's `asOf`). */
  readonly asOf = input.required<string>();
  /** Shows the operator's name (the audit lead sees everyone's recalls). */
  readonly showOperator = input(false);

  protected readonly look = computed(() => RECALL_STATE_LOOK[this.item().state]);
  protected readonly distance = computed(() => windowDistance(this.item(), this.asOf()));
  protected readonly entryLink = computed(() => ['/cases', this.item().caseId, 'recall', this.item().intervalKey]);
  protected readonly caseLink = computed(() => ['/cases', this.item().caseId]);
}
