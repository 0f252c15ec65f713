import { ChangeDetectionStrategy, Component, input, output } from '@angular/core';
import type { AuditResults, FunnelResult, SurvivalResult, TrendResult } from '@tidemark/shared';
import type { ChartPalette } from '../chart-kit/chart-palette';
import { WHOLE_COHORT_LABEL } from '../cohort-label';
import { MarginDriftFigure } from '../margin-drift/margin-drift-figure';
import { MonthlyControlFigure } from '../monthly-control/monthly-control-figure';
import { OperatorFunnelFigure } from '../operator-funnel/operator-funnel-figure';
import { PapillaFillFigure } from '../papilla-fill/papilla-fill-figure';
import { ReboundSpreadFigure } from '../rebound-spread/rebound-spread-figure';
import { RecallCompletionFigure } from '../recall-completion/recall-completion-figure';
import type { Loaded } from '../results-load';
import { PendingFigure } from './pending-figure';
import { TimeToRelapseFigure } from '../time-to-relapse/time-to-relapse-figure';

/**
 * Every Results chart, in reading order. The board loads this component in a `@defer`
 * block, so Chart.js arrives in its own chunk only when results are shown.
 */
@Component({
  selector: 'tm-results-charts',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    MarginDriftFigure,
    MonthlyControlFigure,
    PendingFigure,
    OperatorFunnelFigure,
    PapillaFillFigure,
    ReboundSpreadFigure,
    RecallCompletionFigure,
    TimeToRelapseFigure,
  ],
  templateUrl: './results-charts.html',
  styleUrl: './results-charts.scss',
})
export class ResultsCharts {
  readonly results = input.required<AuditResults>();
  readonly funnel = input.required<Loaded<FunnelResult>>();
  readonly trend = input.required<Loaded<TrendResult>>();
  readonly survival = input.required<Loaded<SurvivalResult>>();
  /** The interval chosen in the filters, already checked against the schedule. */
  readonly intervalKey = input.required<string | null>();
  readonly palette = input.required<ChartPalette>();
  /** The cohort shown, named as the narrowing filters word it (see `cohortLabel`). */
  readonly cohortLabel = input(WHOLE_COHORT_LABEL);
  /** Asks the board to load what failed again. */
  readonly retry = output<void>();
}
