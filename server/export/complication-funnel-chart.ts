import type { ChartConfiguration, PointStyle, ScatterDataPoint } from 'chart.js';
import type { FunnelResult } from '@tidemark/shared';
import { STATIC_CHART_OPTIONS } from './chart-canvas';
import { CHART_PALETTE } from './chart-palette';
import { valueLabelPlugin } from './value-label-plugin';

const percent = (share: number): number => Math.round(share * 1000) / 10;

/**
 * Complications funnel (Spiegelhalter 2005): each operator's share of cases with a complication
 * against the number of cases, inside 95% (dashed) and 99.8% (dotted) limits around the practice
 * rate. Operators are letters; a point outside the 95% limits is a coral diamond instead of a teal
 * circle, and every point carries its letter and rate.
 */
export function complicationFunnelChartConfig(funnel: FunnelResult): ChartConfiguration<'scatter', ScatterDataPoint[], string> {
  const curve = (pick: (point: FunnelResult['curve'][number]) => number): ScatterDataPoint[] => funnel.curve.map((point) => ({ x: point.n, y: percent(pick(point)) }));
  const isOutside = funnel.points.map((point) => point.position !== 'inside');
  const maxN = Math.max(1, ...funnel.curve.map((point) => point.n), ...funnel.points.map((point) => point.n));
  // Limits for one or two cases reach 100%; the axis follows the operators and the practice rate instead.
  const highest = Math.max(10, percent(funnel.target) * 3, ...funnel.points.map((point) => percent(point.rate) * 1.4));
  const yMax = Math.min(100, Math.ceil(highest / 10) * 10);
  const limitLine = (label: string, data: ScatterDataPoint[], colour: string, dash: number[]) => ({
    label,
    data,
    showLine: true,
    borderColor: colour,
    borderDash: dash,
    borderWidth: 2,
    pointRadius: 0,
    order: 2,
  });
  return {
    type: 'scatter',
    data: {
      datasets: [
        {
          label: 'Operators (circle inside 95% limits; diamond outside)',
          data: funnel.points.map((point) => ({ x: point.n, y: percent(point.rate) })),
          pointStyle: isOutside.map((outside): PointStyle => (outside ? 'rectRot' : 'circle')),
          pointRadius: 8,
          backgroundColor: isOutside.map((outside) => (outside ? CHART_PALETTE.coral : CHART_PALETTE.teal)),
          borderColor: CHART_PALETTE.ink,
          borderWidth: 1,
          order: 1,
        },
        limitLine(`Practice rate ${percent(funnel.target)}% (solid)`, [{ x: 1, y: percent(funnel.target) }, { x: maxN, y: percent(funnel.target) }], CHART_PALETTE.sandDark, []),
        limitLine('95% limits (dashed)', curve((point) => point.upper95), CHART_PALETTE.teal, [8, 5]),
        limitLine('', curve((point) => point.lower95), CHART_PALETTE.teal, [8, 5]),
        limitLine('99.8% limits (dotted)', curve((point) => point.upper998), CHART_PALETTE.coral, [2, 4]),
        limitLine('', curve((point) => point.lower998), CHART_PALETTE.coral, [2, 4]),
      ],
    },
    options: {
      ...STATIC_CHART_OPTIONS,
      layout: { padding: { top: 8, right: 24, bottom: 8, left: 8 } },
      plugins: {
        title: { display: true, text: 'Complications funnel: cases with a complication, by operator', font: { size: 18, weight: 'bold' } },
        // Lower limits share the legend entry of their upper limit.
        legend: { position: 'bottom', labels: { usePointStyle: true, padding: 16, filter: (item) => item.text !== '' } },
      },
      scales: {
        x: { type: 'linear', min: 0, suggestedMax: maxN, title: { display: true, text: 'Cases operated (n)' }, grid: { color: CHART_PALETTE.grid } },
        y: { min: 0, max: yMax, title: { display: true, text: 'Cases with ≥ 1 complication, %' }, grid: { color: CHART_PALETTE.grid } },
      },
    },
    plugins: [
      valueLabelPlugin((datasetIndex, index) => {
        const point = funnel.points[index];
        return datasetIndex === 0 && point ? `${point.label.replace(/^Operator /, '')} ${percent(point.rate)}%` : null;
      }, 'above'),
    ],
  };
}
