import { ChangeDetectionStrategy, Component, computed, input, signal } from '@angular/core';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatCheckboxModule } from '@angular/material/checkbox';
import type { AuditResults } from '@tidemark/shared';
import { BaseChartDirective } from 'ng2-charts';
import type { ChartPalette } from '../chart-kit/chart-palette';
import { provideResultsCharts } from '../chart-kit/chart-registrables';
import { intervalCountsLine } from '../chart-kit/figure-counts';
import { ChartLegend } from '../chart-kit/chart-legend';
import { legendEntries } from '../chart-kit/legend-entries';
import { ResultsFigure } from '../chart-kit/results-figure';
import { WHOLE_COHORT_LABEL } from '../cohort-label';
import { buildDriftChart } from './drift-chart-config';
import type { DriftLevel } from './drift-series';
import { buildDriftTable } from './drift-table';

/** "Margin drift by interval": mean rebound per interval, patient or site level, with the published reference on demand. */
@Component({
  selector: 'tm-margin-drift-figure',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [BaseChartDirective, ChartLegend, MatButtonToggleModule, MatCheckboxModule, ResultsFigure],
  providers: [provideResultsCharts()],
  template: `
    <tm-results-figure heading="Margin drift by interval" [counts]="counts()" [table]="table()">
      <span tmFigureNote>
        Rebound is post-op minus recall REF→GM: above zero, the margin crept back coronally. Bands show the 95% CI of each mean.
      </span>
      <mat-button-toggle-group
        tmFigureControls
        hideSingleSelectionIndicator
        aria-label="Level of the means"
        [value]="level()"
        (change)="chooseLevel($event.value)"
      >
        <mat-button-toggle value="patient">Patient level</mat-button-toggle>
        <mat-button-toggle value="site">Site level</mat-button-toggle>
      </mat-button-toggle-group>
      <mat-checkbox tmFigureControls [checked]="showBands()" (change)="bandsChoice.set($event.checked)">95% CI bands</mat-checkbox>
      <mat-checkbox tmFigureControls [checked]="showReference()" (change)="showReference.set($event.checked)">
        Published reference at 6 months
      </mat-checkbox>
      <canvas baseChart [type]="'line'" [data]="config().data" [options]="config().options" [legend]="false" role="img" [attr.aria-label]="label"></canvas>
      <tm-chart-legend tmFigureLegend [entries]="legend()" />
    </tm-results-figure>
  `,
})
export class MarginDriftFigure {
  readonly results = input.required<AuditResults>();
  /** The interval chosen in the filters. */
  readonly intervalKey = input.required<string | null>();
  readonly palette = input.required<ChartPalette>();
  /** The cohort shown, named as the narrowing filters word it (see `cohortLabel`). */
  readonly cohortLabel = input(WHOLE_COHORT_LABEL);

  /** Patient level by default: sites of one patient are not independent (DESIGN.md §3). */
  protected readonly level = signal<DriftLevel>('patient');
  protected readonly showReference = signal(false);
  /** The person's choice of bands; until they choose, bands show for the whole cohort only (overlapping subgroup bands blur). */
  protected readonly bandsChoice = signal<boolean | null>(null);
  protected readonly showBands = computed(() => this.bandsChoice() ?? this.results().groups.length === 0);
  protected readonly label = 'Line chart of mean rebound by recall interval. The numbers are in the table under “Show the numbers”.';

  protected readonly config = computed(() =>
    buildDriftChart(this.results(), {
      level: this.level(),
      showReference: this.showReference(),
      showBands: this.showBands(),
      highlightInterval: this.intervalKey(),
      palette: this.palette(),
      cohortLabel: this.cohortLabel(),
    }),
  );
  protected readonly legend = computed(() => legendEntries(this.config()));
  protected readonly table = computed(() => buildDriftTable(this.results(), this.level()));
  protected readonly counts = computed(() => intervalCountsLine(this.results(), this.intervalKey()));

  protected chooseLevel(value: unknown): void {
    this.level.set(value === 'site' ? 'site' : 'patient');
  }
}
