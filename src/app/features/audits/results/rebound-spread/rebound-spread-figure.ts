import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { AuditResults } from '@tidemark/shared';
import { BaseChartDirective } from 'ng2-charts';
import type { ChartPalette } from '../chart-kit/chart-palette';
import { provideResultsCharts } from '../chart-kit/chart-registrables';
import { intervalCountsLine, intervalLabelOf } from '../chart-kit/figure-counts';
import { ChartLegend } from '../chart-kit/chart-legend';
import { legendEntries } from '../chart-kit/legend-entries';
import { ResultsFigure } from '../chart-kit/results-figure';
import { buildSpreadChart, buildSpreadTable, histogramFor } from './spread-chart-config';

/** "Rebound spread": histogram of site rebound at the chosen interval, bars patterned by stability class. */
@Component({
  selector: 'tm-rebound-spread-figure',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [BaseChartDirective, ChartLegend, ResultsFigure],
  providers: [provideResultsCharts()],
  template: `
    <tm-results-figure heading="Rebound spread" [counts]="counts()" [table]="table()" [hasChart]="hasBins()">
      <span tmFigureNote>
        Site rebound at {{ intervalLabel() }}. Bars at or below 0 mm hold sites whose margin sits at or apical to where it was placed; negative ones are
        flagged for review (possible recession or over-exposure).
      </span>
      <canvas baseChart [type]="'bar'" [data]="config().data" [options]="config().options" [legend]="false" role="img" [attr.aria-label]="label"></canvas>
      <tm-chart-legend tmFigureLegend [entries]="legend()" />
    </tm-results-figure>
  `,
})
export class ReboundSpreadFigure {
  readonly results = input.required<AuditResults>();
  readonly intervalKey = input.required<string>();
  readonly palette = input.required<ChartPalette>();

  protected readonly label = 'Histogram of site rebound by stability class. The numbers are in the table under “Show the numbers”.';
  protected readonly config = computed(() => buildSpreadChart(this.results(), { intervalKey: this.intervalKey(), palette: this.palette() }));
  protected readonly legend = computed(() => legendEntries(this.config()));
  protected readonly table = computed(() => buildSpreadTable(this.results(), this.intervalKey()));
  protected readonly counts = computed(() => intervalCountsLine(this.results(), this.intervalKey()));
  protected readonly intervalLabel = computed(() => intervalLabelOf(this.results(), this.intervalKey()));
  protected readonly hasBins = computed(() => (histogramFor(this.results(), this.intervalKey())?.bins.length ?? 0) > 0);
}
