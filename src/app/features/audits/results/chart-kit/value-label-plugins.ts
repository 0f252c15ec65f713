import type { ChartType, Plugin } from 'chart.js';
import type { BarLabelOptions, PointLabelOptions } from './chart-extensions';

/** Writes each bar segment's value inside it (`options.plugins.tmBarLabels`): labels as well as hue. */
export const barLabelPlugin: Plugin<ChartType, BarLabelOptions> = {
  id: 'tmBarLabels',
  afterDatasetsDraw(chart, _args, options) {
    if (!options.display) return;
    const { ctx } = chart;
    ctx.save();
    ctx.font = `600 12px ${FONT}`;
    ctx.textAlign = 'center';
    ctx.textBaseline = 'middle';
    chart.data.datasets.forEach((dataset, datasetIndex) => {
      const meta = chart.getDatasetMeta(datasetIndex);
      if (meta.hidden || !chart.isDatasetVisible(datasetIndex)) return;
      meta.data.forEach((element, index) => {
        const value = dataset.data[index];
        if (typeof value !== 'number' || value <= 0) return;
        const { x, y, base, width } = element.getProps(['x', 'y', 'base', 'width'], true);
        if (typeof base !== 'number' || Math.abs(base - y) < options.minHeight) return;
        const text = options.format === 'percent' ? `${Math.round(value)}%` : String(value);
        ctx.fillStyle = options.inks[datasetIndex] ?? '#000';
        const name = options.names?.[datasetIndex];
        const room = typeof width === 'number' ? width - 4 : 0;
        const middle = (y + base) / 2;
        if (name && Math.abs(base - y) >= 2 * LINE && ctx.measureText(name).width <= room) {
          // Room for two lines: the name above, the value below.
          ctx.fillText(name, x, middle - LINE / 2);
          ctx.fillText(text, x, middle + LINE / 2);
        } else if (name && ctx.measureText(`${name} · ${text}`).width <= room) {
          ctx.fillText(`${name} · ${text}`, x, middle);
        } else {
          ctx.fillText(text, x, middle);
        }
      });
    });
    ctx.restore();
  },
};

/** Writes words beside chosen points (`options.plugins.tmPointLabels`), over a halo so they read on lines. */
export const pointLabelPlugin: Plugin<ChartType, PointLabelOptions> = {
  id: 'tmPointLabels',
  afterDatasetsDraw(chart, _args, options) {
    const labels = options.labels ?? [];
    if (labels.length === 0) return;
    const { ctx, chartArea } = chart;
    ctx.save();
    ctx.font = `500 12px ${FONT}`;
    ctx.textBaseline = 'middle';
    ctx.lineJoin = 'round';
    ctx.lineWidth = 4;
    ctx.strokeStyle = options.halo;
    const placed: Box[] = [];
    for (const label of labels) {
      const meta = chart.getDatasetMeta(label.datasetIndex);
      const element = meta.data[label.index];
      if (!element || !chart.isDatasetVisible(label.datasetIndex)) continue;
      const { x, y } = element.getProps(['x', 'y'], true);
      const width = ctx.measureText(label.text).width;
      // Labels flip to the left of points near the right edge so they stay inside the plot.
      const isLeft = x + 10 + width > chartArea.right;
      ctx.textAlign = isLeft ? 'right' : 'left';
      const textX = isLeft ? x - 10 : x + 10;
      const left = isLeft ? textX - width : textX;
      // Labels of nearby points would print over each other: move up a line until clear (down when the top is reached).
      let textY = Math.max(chartArea.top + LINE / 2, y - 10);
      for (let step = 0; step < 6 && placed.some((box) => overlaps(box, left, textY, width)); step++) {
        textY = textY - LINE >= chartArea.top + LINE / 2 ? textY - LINE : textY + LINE * (step + 1);
      }
      placed.push({ left, right: left + width, top: textY - LINE / 2, bottom: textY + LINE / 2 });
      ctx.strokeText(label.text, textX, textY);
      ctx.fillStyle = label.colour;
      ctx.fillText(label.text, textX, textY);
    }
    ctx.restore();
  },
};

const FONT = "'Work Sans', system-ui, sans-serif";
/** Height of one label line, px. */
const LINE = 15;

interface Box {
  readonly left: number;
  readonly right: number;
  readonly top: number;
  readonly bottom: number;
}

function overlaps(box: Box, left: number, middle: number, width: number): boolean {
  return left < box.right && left + width > box.left && middle - LINE / 2 < box.bottom && middle + LINE / 2 > box.top;
}
