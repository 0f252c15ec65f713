import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { AuditResults, SurvivalResult } from '@tidemark/shared';
import { BaseChartDirective } from 'ng2-charts';
import type { ChartPalette } from '../chart-kit/chart-palette';
import { provideResultsCharts } from '../chart-kit/chart-registrables';
import { ChartLegend } from '../chart-kit/chart-legend';
import { legendEntries } from '../chart-kit/legend-entries';
import { ResultsFigure } from '../chart-kit/results-figure';
import { countsLine, formatNumber } from '../chart-kit/result-format';
import { buildSurvivalChart, buildSurvivalTable } from './survival-chart-config';

/** "Time to relapse": Kaplan–Meier curve of sites free of relapse, censored at the last recall. */
@Component({
  selector: 'tm-time-to-relapse-figure',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [BaseChartDirective, ChartLegend, ResultsFigure],
  providers: [provideResultsCharts()],
  template: `
    <tm-results-figure heading="Time to relapse" [counts]="counts()" [table]="table()" [hasChart]="survival().nSites > 0">
      <span tmFigureNote>
        A site counts as relapsed at the first recall where its rebound is above {{ threshold() }} mm. Sites that never relapsed are censored at their last
        recall: they count as at risk up to then and drop out after, without counting as relapsed. {{ medianSentence() }}
      </span>
      <canvas baseChart [type]="'line'" [data]="config().data" [options]="config().options" [legend]="false" role="img" [attr.aria-label]="label"></canvas>
      <tm-chart-legend tmFigureLegend [entries]="legend()" />
    </tm-results-figure>
  `,
})
export class TimeToRelapseFigure {
  readonly survival = input.required<SurvivalResult>();
  readonly results = input.required<AuditResults>();
  readonly palette = input.required<ChartPalette>();

  protected readonly label = 'Step curve of the share of sites free of relapse over days since surgery. The numbers are in the table under “Show the numbers”.';
  protected readonly config = computed(() => buildSurvivalChart(this.survival(), this.palette()));
  protected readonly legend = computed(() => legendEntries(this.config()));
  protected readonly table = computed(() => buildSurvivalTable(this.survival()));
  protected readonly threshold = computed(() => formatNumber(this.survival().relapseThresholdMm, 1));
  protected readonly medianSentence = computed(() => {
    const { curve } = this.survival();
    if (curve.median !== null) return `Median time to relapse: ${curve.median} days.`;
    const last = curve.steps.at(-1);
    return last ? `Median not reached: more than half the sites were still free of relapse at day ${last.time}.` : 'No site has relapsed.';
  });
  protected readonly counts = computed(() => {
    const survival = this.survival();
    return `${countsLine({ sites: survival.nSites, patients: this.results().cohort.patients })} · ${survival.events} relapsed, ${survival.censored} censored.`;
  });
}
