import { DOCUMENT } from '@angular/common';
import { ChangeDetectionStrategy, Component, DestroyRef, computed, inject, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import type { OperatorView, RecallDueItem, RecallDueList } from '@tidemark/shared';
import { AuthSession } from '../../../core/auth/auth-session';
import { RecallCard } from '../recall-card/recall-card';
import { TodayApi } from '../today-api';
import { LocalDatePipe } from '../../../shared/dates/local-date-pipe';

/** One group of the Today page. */
interface RecallGroup {
  readonly key: 'inWindow' | 'overdue' | 'upcoming';
  readonly title: string;
  /** The title as it reads after a count, e.g. "3 overdue". */
  readonly countLabel: string;
  readonly icon: string;
  readonly hint: string;
  readonly empty: string;
  readonly items: readonly RecallDueItem[];
}

/** The groups in the order people act on them, with our words for each. */
const GROUPS: readonly Omit<RecallGroup, 'items'>[] = [
  {
    key: 'inWindow',
    title: 'In window now',
    countLabel: 'in window now',
    icon: 'event_available',
    hint: 'Seen now, these recalls count as on time. Soonest-closing first.',
    empty: 'No recall window is open today. Windows opening soon are listed under Coming up.',
  },
  {
    key: 'overdue',
    title: 'Overdue',
    countLabel: 'overdue',
    icon: 'event_busy',
    hint: 'The window closed with no recall entered. Enter it if the patient was seen, or arrange a visit.',
    empty: 'Nothing is overdue: every closed window has its recall.',
  },
  {
    key: 'upcoming',
    title: 'Coming up (next 14 days)',
    countLabel: 'coming up in 14 days',
    icon: 'upcoming',
    hint: 'Windows that open within the next two weeks, for booking.',
    empty: 'No recall window opens in the next 14 days. New cases join this list once their surgery is recorded.',
  },
];

/** Today: the recalls to see to now, overdue, and soon; each one click from entry. */
@Component({
  selector: 'tm-today-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [LocalDatePipe, MatButtonModule, MatFormFieldModule, MatIconModule, MatProgressBarModule, MatSelectModule, RecallCard],
  templateUrl: './today-page.html',
  styleUrl: './today-page.scss',
})
export class TodayPage {
  private readonly api = inject(TodayApi);
  private readonly destroyRef = inject(DestroyRef);
  private readonly document = inject(DOCUMENT);
  private readonly user = inject(AuthSession).user;

  /** The audit lead sees every operator's recalls, so names and a filter help; a clinician sees only their own. */
  protected readonly isLead = computed(() => this.user()?.role === 'audit_lead');
  protected readonly list = signal<RecallDueList | null>(null);
  protected readonly isLoading = signal(true);
  protected readonly hasLoadFailed = signal(false);
  /** Operator chosen in the lead's filter. A word rather than null for "everyone", so the select shows it. */
  protected readonly operatorId = signal<number | 'all'>('all');

  /** Everyone with a recall on the list, by name. */
  protected readonly operators = computed<OperatorView[]>(() => {
    const list = this.list();
    if (!list) return [];
    const byId = new Map<number, OperatorView>();
    for (const item of [...list.inWindow, ...list.overdue, ...list.upcoming]) byId.set(item.operator.id, item.operator);
    return [...byId.values()].sort((a, b) => a.displayName.localeCompare(b.displayName));
  });

  protected readonly groups = computed<RecallGroup[]>(() => {
    const list = this.list();
    const operatorId = this.operatorId();
    if (!list) return [];
    const keep = (item: RecallDueItem) => operatorId === 'all' || item.operator.id === operatorId;
    return GROUPS.map((group) => ({ ...group, items: list[group.key].filter(keep) }));
  });

  constructor() {
    this.loadRecalls();
  }

  protected loadRecalls(): void {
    this.isLoading.set(true);
    this.hasLoadFailed.set(false);
    this.api
      .due()
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: (list) => {
          this.list.set(list);
          this.isLoading.set(false);
        },
        // The error notice has said why; the page offers a retry.
        error: () => {
          this.isLoading.set(false);
          this.hasLoadFailed.set(true);
        },
      });
  }

  /** Scrolls a group into view (the router would treat a bare `#fragment` link as a new address). */
  protected showGroup(key: RecallGroup['key']): void {
    this.document.getElementById(`group-${key}`)?.scrollIntoView({ behavior: 'smooth', block: 'start' });
  }

  protected chooseOperator(operatorId: number | 'all'): void {
    this.operatorId.set(operatorId);
  }
}
