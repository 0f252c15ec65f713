import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { AuditResults, FunnelResult } from '@tidemark/shared';
import { BaseChartDirective } from 'ng2-charts';
import type { ChartPalette } from '../chart-kit/chart-palette';
import { provideResultsCharts } from '../chart-kit/chart-registrables';
import { intervalLabelOf } from '../chart-kit/figure-counts';
import { ChartLegend } from '../chart-kit/chart-legend';
import { legendEntries } from '../chart-kit/legend-entries';
import { ResultsFigure } from '../chart-kit/results-figure';
import { countsLine, formatShare } from '../chart-kit/result-format';
import { buildFunnelChart, buildFunnelTable } from './funnel-chart-config';

/** "Complications by operator": the funnel plot of operators against the practice rate. */
@Component({
  selector: 'tm-operator-funnel-figure',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [BaseChartDirective, ChartLegend, ResultsFigure],
  providers: [provideResultsCharts()],
  template: `
    <tm-results-figure heading="Complications by operator" [counts]="counts()" [table]="table()" [hasChart]="funnel().points.length > 0">
      <span tmFigureNote>
        {{ measureSentence() }} Points outside the funnel differ from the practice rate by more than chance would usually explain (dashes: 95% limits;
        dots: 99.8% limits, Spiegelhalter 2005). Small operators sit where the funnel is wide.
      </span>
      <canvas baseChart [type]="'line'" [data]="config().data" [options]="config().options" [legend]="false" role="img" [attr.aria-label]="label"></canvas>
      <tm-chart-legend tmFigureLegend [entries]="legend()" />
    </tm-results-figure>
  `,
})
export class OperatorFunnelFigure {
  readonly funnel = input.required<FunnelResult>();
  readonly results = input.required<AuditResults>();
  readonly palette = input.required<ChartPalette>();

  protected readonly label = 'Funnel plot of operators’ rates against the practice rate. The numbers are in the table under “Show the numbers”.';
  private readonly intervalLabel = computed(() => intervalLabelOf(this.results(), this.funnel().intervalKey));
  protected readonly config = computed(() =>
    buildFunnelChart(this.funnel(), { intervalLabel: this.funnel().measure === 'relapse' ? this.intervalLabel() : null, palette: this.palette() }),
  );
  protected readonly legend = computed(() => legendEntries(this.config()));
  protected readonly table = computed(() => buildFunnelTable(this.funnel(), this.intervalLabel()));
  protected readonly measureSentence = computed(() => {
    const funnel = this.funnel();
    return funnel.measure === 'complication'
      ? `Measure: cases with at least one complication (practice rate ${formatShare(funnel.target)}).`
      : `Measure: sites in relapse at ${this.intervalLabel()} (practice rate ${formatShare(funnel.target)}).`;
  });
  protected readonly counts = computed(() => {
    const funnel = this.funnel();
    const operators = `${funnel.points.length} operator${funnel.points.length === 1 ? '' : 's'}`;
    if (funnel.measure === 'complication') {
      return `${countsLine({ cases: funnel.totalN, patients: this.results().cohort.patients })} · ${operators}.`;
    }
    const interval = this.results().summary.intervals.find((found) => found.intervalKey === funnel.intervalKey);
    return `At ${this.intervalLabel()}: ${countsLine({ sites: funnel.totalN, patients: interval?.nPatients })} · ${operators}.`;
  });
}
