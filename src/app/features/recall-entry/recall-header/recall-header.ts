import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import type { RecallInterval } from '@tidemark/shared';
import { recallWindow, windowTiming } from '../recall-context';
import { LocalDatePipe } from '../../../shared/dates/local-date-pipe';

/** Icon and words for where the visit date falls against the recall window. */
const TIMING_LOOK = {
  'in-window': { icon: 'event_available', word: 'In window' },
  early: { icon: 'arrow_back', word: 'Before the window' },
  late: { icon: 'arrow_forward', word: 'After the window' },
} as const;

/**
 * Which recall this is: patient code, teeth, interval and its window (target = surgery +
 * target days of the default schedule), and where the visit date falls against it.
 */
@Component({
  selector: 'tm-recall-header',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [LocalDatePipe, MatIconModule],
  templateUrl: './recall-header.html',
  styleUrl: './recall-header.scss',
})
export class RecallHeader {
  /** Pseudonymous patient code. */
  readonly patientCode = input.required<string>();
  /** FDI numbers of the teeth treated. */
  readonly teeth = input.required<readonly number[]>();
  /** The interval being entered. */
  readonly interval = input.required<RecallInterval>();
  /** Surgery date, YYYY-MM-DD. */
  readonly surgeryDate = input.required<string>();
  /** The visit date entered so far, YYYY-MM-DD (may be empty while typing). */
  readonly visitDate = input('');
  /** Whether an already recorded recall is being corrected. */
  readonly isCorrection = input(false);

  protected readonly window = computed(() => recallWindow(this.surgeryDate(), this.interval()));
  protected readonly timing = computed(() => {
    const visitDate = this.visitDate();
    if (!/^\d{4}-\d{2}-\d{2}$/.test(visitDate)) {
      return null;
    }
    const timing = windowTiming(this.window(), visitDate);
    const look = TIMING_LOOK[timing.kind];
    return timing.kind === 'in-window' ? { ...look, detail: '' } : { ...look, detail: `by ${timing.days} ${timing.days === 1 ? 'day' : 'days'}` };
  });
  protected readonly teethText = computed(() => this.teeth().join(', '));
}
