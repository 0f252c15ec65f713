import type { Chart, ChartType, Plugin } from 'chart.js';
import type { PatternFill, PatternFillOptions } from './chart-extensions';

/** Tile size in CSS pixels: small enough to read as texture, large enough to survive scaling. */
const TILE = 8;

/** Patterns already drawn, per chart (a pattern belongs to the canvas that made it). */
const cache = new WeakMap<Chart, Map<string, CanvasPattern | string>>();

/**
 * Fills datasets with a pattern over their colour (`options.plugins.tmPatterns`), so stability
 * classes and recall states read without colour; legend swatches show the same pattern.
 */
export const patternFillPlugin: Plugin<ChartType, PatternFillOptions> = {
  id: 'tmPatterns',
  beforeUpdate(chart, _args, options) {
    const fills = options.fills ?? [];
    chart.data.datasets.forEach((dataset, index) => {
      const fill = fills[index];
      if (fill) dataset.backgroundColor = patternFor(chart, fill);
    });
  },
  afterDestroy(chart) {
    cache.delete(chart);
  },
};

function patternFor(chart: Chart, fill: PatternFill): CanvasPattern | string {
  if (fill.kind === 'solid') return fill.colour;
  let patterns = cache.get(chart);
  if (!patterns) {
    patterns = new Map();
    cache.set(chart, patterns);
  }
  const key = `${fill.kind}|${fill.colour}|${fill.ink}`;
  const known = patterns.get(key);
  if (known) return known;
  const drawn = drawPattern(chart, fill);
  patterns.set(key, drawn);
  return drawn;
}

function drawPattern(chart: Chart, fill: PatternFill): CanvasPattern | string {
  const ratio = chart.currentDevicePixelRatio || 1;
  const tile = document.createElement('canvas');
  tile.width = tile.height = Math.round(TILE * ratio);
  const ctx = tile.getContext('2d');
  if (!ctx) return fill.colour;
  ctx.scale(ratio, ratio);
  if (fill.kind !== 'open') {
    ctx.fillStyle = fill.colour;
    ctx.fillRect(0, 0, TILE, TILE);
  }
  ctx.strokeStyle = fill.ink;
  ctx.fillStyle = fill.ink;
  ctx.lineWidth = 1.25;
  ctx.beginPath();
  switch (fill.kind) {
    case 'diagonal':
      ctx.moveTo(0, TILE);
      ctx.lineTo(TILE, 0);
      ctx.moveTo(-2, 2);
      ctx.lineTo(2, -2);
      ctx.moveTo(TILE - 2, TILE + 2);
      ctx.lineTo(TILE + 2, TILE - 2);
      ctx.stroke();
      break;
    case 'cross':
      ctx.moveTo(0, 0);
      ctx.lineTo(TILE, TILE);
      ctx.moveTo(0, TILE);
      ctx.lineTo(TILE, 0);
      ctx.stroke();
      break;
    case 'vertical':
      ctx.moveTo(TILE / 2, 0);
      ctx.lineTo(TILE / 2, TILE);
      ctx.stroke();
      break;
    case 'dots':
    case 'open':
      ctx.arc(TILE / 2, TILE / 2, 1.3, 0, Math.PI * 2);
      ctx.fill();
      break;
  }
  return chart.ctx.createPattern(tile, 'repeat') ?? fill.colour;
}
