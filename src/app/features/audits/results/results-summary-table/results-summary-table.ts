import { ChangeDetectionStrategy, Component, computed, input, signal } from '@angular/core';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatTableModule } from '@angular/material/table';
import type { AuditResults } from '@tidemark/shared';
import { WHOLE_COHORT_LABEL } from '../cohort-label';
import { summaryRows } from './summary-rows';

/** Intervals shown in the table: the one chosen in the filters, or all. */
type IntervalScope = 'chosen' | 'all';

/** Summary per interval (per group when grouped): n, mean rebound site and patient level with CIs, stability shares, % retained. */
@Component({
  selector: 'tm-results-summary-table',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonToggleModule, MatFormFieldModule, MatIconModule, MatInputModule, MatTableModule],
  templateUrl: './results-summary-table.html',
  styleUrl: './results-summary-table.scss',
})
export class ResultsSummaryTable {
  readonly results = input.required<AuditResults>();
  /** The interval chosen in the filters. */
  readonly intervalKey = input.required<string | null>();
  /** The cohort shown, named as the narrowing filters word it (see `cohortLabel`): heads the first row. */
  readonly cohortLabel = input(WHOLE_COHORT_LABEL);

  protected readonly scope = signal<IntervalScope>('chosen');
  protected readonly text = signal('');
  protected readonly rows = computed(() =>
    summaryRows(this.results(), { intervalKey: this.scope() === 'all' ? null : this.intervalKey(), text: this.text(), cohortLabel: this.cohortLabel() }),
  );
  /** The group column names each row: needed when grouped, and when narrowed so the cohort row says what it covers. */
  protected readonly isGroupNamed = computed(() => this.results().groups.length > 0 || this.cohortLabel() !== WHOLE_COHORT_LABEL);
  protected readonly columns = computed(() => [
    ...(this.isGroupNamed() ? ['group'] : []),
    // With one interval shown, the interval is said once above the table instead of on every row.
    ...(this.scope() === 'all' ? ['interval'] : []),
    'n',
    'reboundSite',
    'reboundPatient',
    'stable',
    'minor',
    'relapse',
    'retained',
  ]);
  protected readonly thresholds = computed(() => this.results().thresholds);
  protected readonly shownIntervals = computed(() =>
    this.scope() === 'all' ? 'All intervals.' : `At ${this.results().schedule.find((interval) => interval.key === this.intervalKey())?.label ?? 'the chosen interval'}.`,
  );

  protected chooseScope(value: unknown): void {
    this.scope.set(value === 'all' ? 'all' : 'chosen');
  }

  protected filterRows(event: Event): void {
    const target = event.target;
    this.text.set(target instanceof HTMLInputElement ? target.value : '');
  }
}
