import type { ChartDataset } from 'chart.js';
import type { TrendResult } from '@tidemark/shared';
import { HIDDEN_LEGEND, scaleLook, tooltipLook } from '../chart-kit/chart-look';
import type { ChartPalette } from '../chart-kit/chart-palette';
import { formatMm } from '../chart-kit/result-format';
import { formatLocalDate } from '../../../../shared/dates/local-date';
import { CONTROL_LIMIT_DASH, outsideLabels, outsideMarkers, referenceLine, seriesLine, type ControlChartConfiguration } from './p-chart-config';

/**
 * "Monthly relapse control", XmR view: mean site rebound per month of surgery as an
 * individuals chart with its mean and natural process limits; outside months marked.
 * Months are named in `locale` (Angular's `LOCALE_ID`), as the app's `localDate` pipe names them.
 */
export function buildReboundXmrChart(trend: TrendResult, intervalLabel: string, palette: ChartPalette, locale: string): ControlChartConfiguration {
  const { points, mean, lcl, ucl } = trend.rebound;
  const isOutside = points.map((point) => point.isOutside);
  const values = points.map((point) => point.value);
  const constant = (value: number | null) => points.map(() => value);
  const datasets: ChartDataset<'line', (number | null)[]>[] = [
    seriesLine(`Mean site rebound at ${intervalLabel}`, values, palette),
    outsideMarkers(values, isOutside, palette),
    referenceLine(`Mean ${formatMm(mean)}`, constant(mean), palette.slate, []),
    referenceLine('Natural process limits', constant(ucl), palette.coral, CONTROL_LIMIT_DASH),
    referenceLine('', constant(lcl), palette.coral, CONTROL_LIMIT_DASH),
  ];
  return {
    type: 'line',
    data: { labels: points.map((point) => formatLocalDate(point.month, 'month', locale)), datasets },
    options: {
      scales: {
        x: scaleLook(palette, 'Month of surgery'),
        y: { ...scaleLook(palette, `Mean rebound at ${intervalLabel}, mm`), suggestedMin: 0 },
      },
      plugins: {
        legend: HIDDEN_LEGEND,
        tooltip: { ...tooltipLook(palette), filter: (item) => item.datasetIndex === 0 },
        tmPointLabels: { labels: outsideLabels(isOutside, palette), halo: palette.surface },
      },
    },
  };
}
