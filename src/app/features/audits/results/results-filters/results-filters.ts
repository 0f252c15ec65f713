import { ChangeDetectionStrategy, Component, input, output } from '@angular/core';
import { MatChipsModule, type MatChipSelectionChange } from '@angular/material/chips';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatSelectModule } from '@angular/material/select';
import { CYCLE_STATE_LABELS, PHENOTYPES, PHENOTYPE_LABELS, type CycleView, type GroupBy, type Phenotype, type RecallInterval } from '@tidemark/shared';
import type { OperatorChoice } from '../operator-choices';
import type { FunnelMeasure } from '../results-api';
import type { ResultsQuery } from '../results-query';
import { LocalDatePipe } from '../../../../shared/dates/local-date-pipe';

/** Subgroup choices, "whole cohort" first. */
export const GROUP_CHOICES: readonly { readonly value: GroupBy | null; readonly label: string }[] = [
  { value: null, label: 'Whole cohort' },
  { value: 'operator', label: 'Operator' },
  { value: 'procedure', label: 'Procedure' },
  { value: 'phenotype', label: 'Phenotype' },
  { value: 'indication', label: 'Indication' },
  { value: 'smoking', label: 'Smoking' },
];

/** Funnel measures in words. */
export const MEASURE_CHOICES: readonly { readonly value: FunnelMeasure; readonly label: string }[] = [
  { value: 'complication', label: 'Complications' },
  { value: 'relapse', label: 'Relapse' },
];

/**
 * The Results area's controls: the scope (live or a cycle, with the frozen date), the cohort
 * narrowed to a phenotype and/or an operator, and filter chips for grouping, interval and funnel
 * measure. Reports choices; the board keeps them in the address.
 */
@Component({
  selector: 'tm-results-filters',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [LocalDatePipe, MatChipsModule, MatFormFieldModule, MatIconModule, MatSelectModule],
  templateUrl: './results-filters.html',
  styleUrl: './results-filters.scss',
})
export class ResultsFilters {
  readonly groupBy = input.required<GroupBy | null>();
  /** The interval in force (already checked against the schedule). */
  readonly intervalKey = input.required<string | null>();
  readonly measure = input.required<FunnelMeasure>();
  readonly cycleId = input.required<number | null>();
  readonly schedule = input.required<readonly RecallInterval[]>();
  readonly cycles = input.required<readonly CycleView[]>();
  /** When the shown cycle's results were frozen; null for live or unfrozen results. */
  readonly frozenAt = input.required<string | null>();
  /** The phenotype the results are narrowed to, or null. */
  readonly phenotype = input<Phenotype | null>(null);
  /** The operator the results are narrowed to (already checked against the choices), or null. */
  readonly operatorId = input<number | null>(null);
  /** Operators this viewer may narrow to; empty hides the operator filter. */
  readonly operatorChoices = input<readonly OperatorChoice[]>([]);
  /** A change of view. */
  readonly changed = output<Partial<ResultsQuery>>();

  protected readonly groupChoices = GROUP_CHOICES;
  protected readonly measureChoices = MEASURE_CHOICES;
  protected readonly stateLabels = CYCLE_STATE_LABELS;
  protected readonly phenotypes = PHENOTYPES;
  protected readonly phenotypeLabels = PHENOTYPE_LABELS;
  /** The select's value for live results (Material reads null as "nothing chosen"). */
  protected readonly liveScope = 'live';
  /** The narrowing selects' value for "no narrowing", for the same reason. */
  protected readonly everyone = 'every';

  protected chooseCycle(value: unknown): void {
    const cycle = typeof value === 'number' ? value : null;
    if (cycle !== this.cycleId()) this.changed.emit({ cycle });
  }

  protected choosePhenotype(value: unknown): void {
    const phenotype = PHENOTYPES.find((option) => option === value) ?? null;
    if (phenotype !== this.phenotype()) this.changed.emit({ phenotype });
  }

  protected chooseOperator(value: unknown): void {
    const operator = typeof value === 'number' ? value : null;
    if (operator !== this.operatorId()) this.changed.emit({ operator });
  }

  protected chooseGroupBy(event: MatChipSelectionChange, groupBy: GroupBy | null): void {
    if (this.isNewChoice(event, groupBy === this.groupBy())) this.changed.emit({ groupBy });
  }

  protected chooseInterval(event: MatChipSelectionChange, interval: string): void {
    if (this.isNewChoice(event, interval === this.intervalKey())) this.changed.emit({ interval });
  }

  protected chooseMeasure(event: MatChipSelectionChange, measure: FunnelMeasure): void {
    if (this.isNewChoice(event, measure === this.measure())) this.changed.emit({ measure });
  }

  /**
   * True when a person picked a chip that is not yet in force. One chip per row is always in
   * force, so clicking the chosen chip again keeps it chosen instead of leaving the row empty.
   */
  private isNewChoice(event: MatChipSelectionChange, isCurrent: boolean): boolean {
    if (!event.isUserInput) return false;
    if (!event.selected) {
      if (isCurrent) event.source.select();
      return false;
    }
    return !isCurrent;
  }
}
