import { ChangeDetectionStrategy, Component, LOCALE_ID, computed, inject, input, signal } from '@angular/core';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import type { AuditResults, TrendResult } from '@tidemark/shared';
import { BaseChartDirective } from 'ng2-charts';
import type { ChartPalette } from '../chart-kit/chart-palette';
import { provideResultsCharts } from '../chart-kit/chart-registrables';
import { intervalLabelOf } from '../chart-kit/figure-counts';
import { ChartLegend } from '../chart-kit/chart-legend';
import { legendEntries } from '../chart-kit/legend-entries';
import { ResultsFigure } from '../chart-kit/results-figure';
import { countsLine } from '../chart-kit/result-format';
import { buildCusumTable, buildPChartTable, buildXmrTable } from './control-tables';
import { buildCusumChart } from './cusum-chart-config';
import { buildRelapsePChart } from './p-chart-config';
import { buildReboundXmrChart } from './xmr-chart-config';

/** Which control chart is shown. */
export type ControlView = 'relapse' | 'rebound' | 'cusum';

const NOTES: Readonly<Record<ControlView, string>> = {
  relapse: 'Share of sites in relapse by month of surgery (p-chart). Each month has its own 3-sigma limits, wider when fewer sites were measured; a diamond marks a month outside them.',
  rebound: 'Mean site rebound by month of surgery (individuals chart, XmR). Limits come from the month-to-month moving range; a diamond marks a month outside them.',
  cusum: 'Complications in order of surgery (Bernoulli CUSUM, Steiner et al. 2000): the line climbs with each complication and drifts down otherwise; crossing h signals a run worth reviewing. Triangles: cases with a complication; diamonds: signals.',
};

/** "Monthly relapse control": p-chart of monthly relapse share, with the XmR of mean rebound and the complications CUSUM one toggle away. */
@Component({
  selector: 'tm-monthly-control-figure',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [BaseChartDirective, ChartLegend, MatButtonToggleModule, ResultsFigure],
  providers: [provideResultsCharts()],
  template: `
    <tm-results-figure heading="Monthly relapse control" [counts]="counts()" [table]="table()" [hasChart]="hasPoints()">
      <span tmFigureNote>{{ note() }}</span>
      <mat-button-toggle-group tmFigureControls hideSingleSelectionIndicator aria-label="Control chart shown" [value]="view()" (change)="chooseView($event.value)">
        <mat-button-toggle value="relapse">Relapse share</mat-button-toggle>
        <mat-button-toggle value="rebound">Mean rebound</mat-button-toggle>
        <mat-button-toggle value="cusum">Complications CUSUM</mat-button-toggle>
      </mat-button-toggle-group>
      <canvas baseChart [type]="'line'" [data]="config().data" [options]="config().options" [legend]="false" role="img" [attr.aria-label]="label()"></canvas>
      <tm-chart-legend tmFigureLegend [entries]="legend()" />
    </tm-results-figure>
  `,
})
export class MonthlyControlFigure {
  readonly trend = input.required<TrendResult>();
  readonly results = input.required<AuditResults>();
  readonly palette = input.required<ChartPalette>();

  /** Months on the axis and in the table are named the way the person's locale names them, as `localDate` does. */
  private readonly locale = inject(LOCALE_ID);

  protected readonly view = signal<ControlView>('relapse');
  private readonly intervalLabel = computed(() => intervalLabelOf(this.results(), this.trend().intervalKey));
  protected readonly note = computed(() => NOTES[this.view()]);
  protected readonly label = computed(() => `Control chart: ${NOTES[this.view()]} The numbers are in the table under “Show the numbers”.`);

  protected readonly config = computed(() => {
    const trend = this.trend();
    switch (this.view()) {
      case 'relapse':
        return buildRelapsePChart(trend, this.intervalLabel(), this.palette(), this.locale);
      case 'rebound':
        return buildReboundXmrChart(trend, this.intervalLabel(), this.palette(), this.locale);
      case 'cusum':
        return buildCusumChart(trend, this.palette());
    }
  });
  protected readonly legend = computed(() => legendEntries(this.config()));

  protected readonly table = computed(() => {
    switch (this.view()) {
      case 'relapse':
        return buildPChartTable(this.trend(), this.intervalLabel(), this.locale);
      case 'rebound':
        return buildXmrTable(this.trend(), this.intervalLabel(), this.locale);
      case 'cusum':
        return buildCusumTable(this.trend());
    }
  });

  protected readonly hasPoints = computed(() => (this.view() === 'cusum' ? this.trend().cusum.points.length : this.trend().relapse.points.length) > 0);

  protected readonly counts = computed(() => {
    const trend = this.trend();
    if (this.view() === 'cusum') return `${countsLine({ cases: trend.cusum.points.length })} in order of surgery.`;
    const sites = trend.relapse.points.reduce((sum, point) => sum + point.n, 0);
    const interval = this.results().summary.intervals.find((found) => found.intervalKey === trend.intervalKey);
    return `At ${this.intervalLabel()}: ${countsLine({ sites, patients: interval?.nPatients })} over ${trend.relapse.points.length} months of surgery.`;
  });

  protected chooseView(value: unknown): void {
    this.view.set(value === 'rebound' || value === 'cusum' ? value : 'relapse');
  }
}
