import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { AuditResults } from '@tidemark/shared';
import { BaseChartDirective } from 'ng2-charts';
import type { ChartPalette } from '../chart-kit/chart-palette';
import { provideResultsCharts } from '../chart-kit/chart-registrables';
import { ChartLegend } from '../chart-kit/chart-legend';
import { legendEntries } from '../chart-kit/legend-entries';
import { ResultsFigure } from '../chart-kit/results-figure';
import { countsLine } from '../chart-kit/result-format';
import { buildPapillaChart, buildPapillaTable } from './papilla-chart-config';

/** "Papilla fill by interval": stacked shares of papilla scores 0–4 per interval (Jemt 1997). */
@Component({
  selector: 'tm-papilla-fill-figure',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [BaseChartDirective, ChartLegend, ResultsFigure],
  providers: [provideResultsCharts()],
  template: `
    <tm-results-figure heading="Papilla fill by interval" [counts]="counts()" [table]="table()">
      <span tmFigureNote>Papilla index 0–4 after Jemt (1997), interdental sites scored at each recall. Each segment is labelled with its score and share.</span>
      <canvas baseChart [type]="'bar'" [data]="config().data" [options]="config().options" [legend]="false" role="img" [attr.aria-label]="label"></canvas>
      <tm-chart-legend tmFigureLegend [entries]="legend()" />
    </tm-results-figure>
  `,
})
export class PapillaFillFigure {
  readonly results = input.required<AuditResults>();
  readonly intervalKey = input.required<string | null>();
  readonly palette = input.required<ChartPalette>();

  protected readonly label = 'Stacked bars of papilla score shares per recall interval. The numbers are in the table under “Show the numbers”.';
  protected readonly config = computed(() => buildPapillaChart(this.results(), this.palette()));
  protected readonly legend = computed(() => legendEntries(this.config()));
  protected readonly table = computed(() => buildPapillaTable(this.results()));
  protected readonly counts = computed(() => {
    const interval = this.results().summary.intervals.find((found) => found.intervalKey === this.intervalKey());
    const scored = interval ? `At ${interval.label}: ${countsLine({ sites: interval.papilla.nSites, patients: interval.papilla.nPatients })} scored. ` : '';
    const cohort = this.results().cohort;
    return `${scored}Cohort: ${countsLine({ sites: cohort.sites, patients: cohort.patients, cases: cohort.cases })}.`;
  });
}
