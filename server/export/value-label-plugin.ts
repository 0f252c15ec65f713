import type { Chart, Plugin } from 'chart.js';
import { CHART_FONT_FAMILY, CHART_PALETTE } from './chart-palette';

/** Where a label sits relative to its point or bar. */
export type ValueLabelPlacement = 'above' | 'centre' | 'right';

/** Which text goes with a data point (null: none). */
export type ValueLabelText = (datasetIndex: number, index: number) => string | null;

/**
 * Writes each point's value (or a letter) beside it, so the picture reads without colour
 * and without a legend lookup (DESIGN.md §8). An inline plugin: only the chart it is given to uses it.
 */
export function valueLabelPlugin(text: ValueLabelText, placement: ValueLabelPlacement, colour: (datasetIndex: number) => string = () => CHART_PALETTE.ink): Plugin {
  return {
    id: `tidemarkValueLabels-${placement}`,
    afterDatasetsDraw: (chart: Chart) => {
      const context = chart.ctx;
      context.save();
      context.font = `600 12px ${CHART_FONT_FAMILY}`;
      chart.data.datasets.forEach((_dataset, datasetIndex) => {
        const meta = chart.getDatasetMeta(datasetIndex);
        if (meta.hidden) return;
        context.fillStyle = colour(datasetIndex);
        meta.data.forEach((element, index) => {
          const label = text(datasetIndex, index);
          if (label === null) return;
          const { x, y } = element.tooltipPosition(true);
          // Points without a value (null data) have no position.
          if (x === null || y === null) return;
          if (placement === 'above') {
            context.textAlign = 'center';
            context.textBaseline = 'bottom';
            context.fillText(label, x, y - 8);
          } else if (placement === 'right') {
            context.textAlign = 'left';
            context.textBaseline = 'middle';
            context.fillText(label, x + 6, y);
          } else {
            // A horizontal bar runs from its base to x: the label goes half-way.
            const { base } = element.getProps(['base'], true);
            context.textAlign = 'center';
            context.textBaseline = 'middle';
            context.fillText(label, (x + Number(base)) / 2, y);
          }
        });
      });
      context.restore();
    },
  };
}
