import { ChangeDetectionStrategy, Component, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { FIGURE_CAUTION, type FigureTable } from './figure-table';

let nextFigureId = 0;

/**
 * One Results chart as a figure: caption with title, counts, a "Show the numbers" toggle and
 * the caution; the chart canvas is projected into a sized box; the same data as a table on demand.
 */
@Component({
  selector: 'tm-results-figure',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatIconModule],
  templateUrl: './results-figure.html',
  styleUrl: './results-figure.scss',
})
export class ResultsFigure {
  /** The chart's title (our own names, DESIGN.md §5). */
  readonly heading = input.required<string>();
  /** The counts line: n sites · n patients (· n cases). */
  readonly counts = input.required<string>();
  /** The chart's data as a table. */
  readonly table = input.required<FigureTable>();
  /** Whether the canvas box is shown (false while there is nothing to draw). */
  readonly hasChart = input(true);

  protected readonly caution = FIGURE_CAUTION;
  protected readonly ids = { heading: `tm-figure-${++nextFigureId}`, table: `tm-figure-${nextFigureId}-numbers` };
  protected readonly isTableShown = signal(false);

  protected toggleNumbers(): void {
    this.isTableShown.update((shown) => !shown);
  }
}
