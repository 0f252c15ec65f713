import type { ChartDataset, PointStyle } from 'chart.js';
import type { TrendResult } from '@tidemark/shared';
import { HIDDEN_LEGEND, scaleLook, tooltipLook } from '../chart-kit/chart-look';
import type { ChartPalette } from '../chart-kit/chart-palette';
import { formatNumber } from '../chart-kit/result-format';
import { CONTROL_LIMIT_DASH, referenceLine, type ControlChartConfiguration } from './p-chart-config';

/** Point styles on the CUSUM: a case with a complication, and a signal. */
export const CUSUM_POINT_STYLES: Readonly<Record<'complication' | 'signal', PointStyle>> = {
  complication: 'triangle',
  signal: 'rectRot',
};

/** Dataset index of the signal markers. */
export const SIGNAL_DATASET = 2;

/**
 * Complications CUSUM (Bernoulli, Steiner et al., Stat Med 2000;19:3123–3137) in order of
 * surgery, with its decision limit h dashed; cases with a complication get a triangle,
 * signals a diamond and a label, each as its own legend entry.
 */
export function buildCusumChart(trend: TrendResult, palette: ChartPalette): ControlChartConfiguration {
  const { points, h, signalAt, oddsRatio } = trend.cusum;
  const signals = new Set(signalAt);
  const values = points.map((point) => point.value);
  const markers = (label: string, style: PointStyle, radius: number, keep: (index: number) => boolean): ChartDataset<'line', (number | null)[]> => ({
    label,
    data: points.map((point, i) => (keep(i) ? point.value : null)),
    showLine: false,
    clip: false,
    pointStyle: style,
    pointRadius: radius,
    pointHoverRadius: radius + 1,
    pointBorderWidth: 1.5,
    pointBorderColor: palette.ink,
    backgroundColor: palette.coral,
    borderColor: palette.ink,
  });
  const datasets: ChartDataset<'line', (number | null)[]>[] = [
    {
      label: `CUSUM of complications (set to detect odds × ${formatNumber(oddsRatio, 1)})`,
      data: values,
      borderColor: palette.teal,
      backgroundColor: palette.teal,
      borderWidth: 2,
      pointRadius: 0,
      pointHitRadius: 4,
    },
    markers('Case with a complication (triangle)', CUSUM_POINT_STYLES.complication, 5, (i) => points[i].hadComplication && !signals.has(points[i].index)),
    markers('Signal: review the run (diamond)', CUSUM_POINT_STYLES.signal, 8, (i) => signals.has(points[i].index)),
    referenceLine(`Decision limit h = ${formatNumber(h, 2)}`, points.map(() => h), palette.coral, CONTROL_LIMIT_DASH),
  ];
  return {
    type: 'line',
    data: { labels: points.map((point) => point.surgeryDate), datasets },
    options: {
      scales: {
        x: { ...scaleLook(palette, 'Cases in order of surgery (date)'), ticks: { color: palette.inkMuted, maxTicksLimit: 8, maxRotation: 0 } },
        y: { ...scaleLook(palette, 'CUSUM'), min: 0, suggestedMax: h * 1.25 },
      },
      plugins: {
        legend: HIDDEN_LEGEND,
        tooltip: { ...tooltipLook(palette), filter: (item) => item.datasetIndex === 0 },
        tmPointLabels: {
          labels: points.flatMap((point, index) => (signals.has(point.index) ? [{ datasetIndex: SIGNAL_DATASET, index, text: 'signal: review', colour: palette.coral }] : [])),
          halo: palette.surface,
        },
      },
    },
  };
}
