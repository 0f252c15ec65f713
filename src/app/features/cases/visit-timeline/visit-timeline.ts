import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import { todayIso, type CaseStatus, type VisitView } from '@tidemark/shared';
import { type TimelineState, recallTimeline, unscheduledVisits } from './recall-timeline';
import { LocalDatePipe } from '../../../shared/dates/local-date-pipe';

/** Icon and word per timeline state; coral (`.closed`) always comes with both. */
export const TIMELINE_LOOK: Readonly<Record<TimelineState, { icon: string; word: string }>> = {
  recorded: { icon: 'check_circle', word: 'Recorded' },
  open: { icon: 'event_available', word: 'Window open' },
  closed: { icon: 'event_busy', word: 'Window closed' },
  later: { icon: 'schedule', word: 'Not yet due' },
};

/** The case's recall schedule: what was recorded, what is open, and one click to enter or correct each. */
@Component({
  selector: 'tm-visit-timeline',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [LocalDatePipe, MatButtonModule, MatIconModule, RouterLink],
  templateUrl: './visit-timeline.html',
  styleUrl: './visit-timeline.scss',
})
export class VisitTimeline {
  readonly caseId = input.required<number>();
  readonly surgeryDate = input.required<string>();
  readonly status = input.required<CaseStatus>();
  readonly visits = input.required<readonly VisitView[]>();
  /** Whether the person may record on this case (audit lead, or the case's own clinician). */
  readonly canWrite = input(false);
  /** Today's date (YYYY-MM-DD); settable so the windows can be checked against a fixed day. */
  readonly today = input(todayIso());

  protected readonly look = TIMELINE_LOOK;
  protected readonly steps = computed(() => recallTimeline(this.surgeryDate(), this.visits(), this.today()));
  protected readonly otherVisits = computed(() => unscheduledVisits(this.visits()));
  /** New recalls only make sense once the surgery is done and while the case is followed up. */
  protected readonly canEnter = computed(() => this.canWrite() && (this.status() === 'operated' || this.status() === 'in-recall'));
  protected readonly canCorrect = computed(() => this.canWrite() && this.status() !== 'withdrawn');
  protected readonly note = computed(() => {
    switch (this.status()) {
      case 'planned':
        return 'Windows count from the planned surgery date. Recalls can be entered once the case is recorded as operated.';
      case 'withdrawn':
        return 'This case is withdrawn: no further recalls are expected.';
      case 'concluded':
        return 'This case is concluded. Recorded recalls can still be corrected, with a reason.';
      default:
        return null;
    }
  });
}
