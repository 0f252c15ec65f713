import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { markerShape, type LegendEntry } from './legend-entries';

let nextLegendId = 0;

/**
 * A chart's legend in HTML: each entry's swatch is drawn in SVG with the same dash, marker
 * and fill pattern as on the canvas, so series never rest on hue alone, and the words wrap.
 */
@Component({
  selector: 'tm-chart-legend',
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './chart-legend.html',
  styleUrl: './chart-legend.scss',
})
export class ChartLegend {
  readonly entries = input.required<readonly LegendEntry[]>();

  protected readonly id = `tm-legend-${++nextLegendId}`;
  protected readonly markerShape = markerShape;

  protected dashArray(entry: LegendEntry): string | null {
    return entry.dash.length > 0 ? entry.dash.join(' ') : null;
  }
}
