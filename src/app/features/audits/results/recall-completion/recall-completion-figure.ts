import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { AuditResults } from '@tidemark/shared';
import { BaseChartDirective } from 'ng2-charts';
import type { ChartPalette } from '../chart-kit/chart-palette';
import { provideResultsCharts } from '../chart-kit/chart-registrables';
import { ChartLegend } from '../chart-kit/chart-legend';
import { legendEntries } from '../chart-kit/legend-entries';
import { ResultsFigure } from '../chart-kit/results-figure';
import { countsLine, formatProportion } from '../chart-kit/result-format';
import { buildRecallChart, buildRecallTable } from './recall-chart-config';

/** "Recall completion": recall states per interval as patterned stacked bars, with loss to follow-up. */
@Component({
  selector: 'tm-recall-completion-figure',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [BaseChartDirective, ChartLegend, ResultsFigure],
  providers: [provideResultsCharts()],
  template: `
    <tm-results-figure heading="Recall completion" [counts]="counts()" [table]="table()">
      <span tmFigureNote>
        Cases whose recall window has opened. <strong>Loss to follow-up: {{ loss() }}</strong> of cases with a closed window
        (no visit at their last closed interval or later).
      </span>
      <canvas baseChart [type]="'bar'" [data]="config().data" [options]="config().options" [legend]="false" role="img" [attr.aria-label]="label"></canvas>
      <tm-chart-legend tmFigureLegend [entries]="legend()" />
    </tm-results-figure>
  `,
})
export class RecallCompletionFigure {
  readonly results = input.required<AuditResults>();
  readonly palette = input.required<ChartPalette>();

  protected readonly label = 'Stacked bars of recall states per interval. The numbers are in the table under “Show the numbers”.';
  private readonly recall = computed(() => this.results().summary.recall);
  protected readonly config = computed(() => buildRecallChart(this.recall(), this.palette()));
  protected readonly legend = computed(() => legendEntries(this.config()));
  protected readonly table = computed(() => buildRecallTable(this.recall()));
  protected readonly loss = computed(() => {
    const loss = this.recall().lossToFollowUp;
    return `${loss.count} of ${loss.n}, ${formatProportion(loss)}`;
  });
  protected readonly counts = computed(() => {
    const recall = this.recall();
    return `${countsLine({ cases: recall.nCases, patients: this.results().cohort.patients })}; ${recall.nWithdrawn} withdrawn and left out.`;
  });
}
