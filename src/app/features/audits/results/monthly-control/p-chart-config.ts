import type { ChartConfiguration, ChartDataset, PointStyle } from 'chart.js';
import type { TrendResult } from '@tidemark/shared';
import type { PointLabel } from '../chart-kit/chart-extensions';
import { HIDDEN_LEGEND, scaleLook, tooltipLook } from '../chart-kit/chart-look';
import type { ChartPalette } from '../chart-kit/chart-palette';
import { formatShare } from '../chart-kit/result-format';
import { formatLocalDate } from '../../../../shared/dates/local-date';

/** Control charts' configuration type: values per month (or per case) on a category axis. */
export type ControlChartConfiguration = ChartConfiguration<'line', (number | null)[], string>;

/** Dash of control limits; centre lines are solid. */
export const CONTROL_LIMIT_DASH = [6, 4];
/** Point style of a month inside its limits, and of one outside them. */
export const INSIDE_POINT_STYLE: PointStyle = 'circle';
export const OUTSIDE_POINT_STYLE: PointStyle = 'rectRot';
/** Dataset index of the "outside the limits" markers on the p-chart and the XmR chart. */
export const OUTSIDE_DATASET = 1;

/** The monthly series as a line with round points. */
export function seriesLine(label: string, values: (number | null)[], palette: ChartPalette): ChartDataset<'line', (number | null)[]> {
  return { label, data: values, borderColor: palette.teal, backgroundColor: palette.teal, borderWidth: 2, pointStyle: INSIDE_POINT_STYLE, pointRadius: 4, pointBorderColor: palette.surface };
}

/**
 * Months outside their limits as a second, points-only dataset drawn over the line: a larger
 * coral diamond with its own legend entry, so "outside" never rests on colour.
 */
export function outsideMarkers(values: (number | null)[], isOutside: readonly boolean[], palette: ChartPalette): ChartDataset<'line', (number | null)[]> {
  return {
    label: 'Outside the limits (diamond)',
    data: values.map((value, i) => (isOutside[i] ? value : null)),
    showLine: false,
    clip: false,
    pointStyle: OUTSIDE_POINT_STYLE,
    pointRadius: 8,
    pointHoverRadius: 9,
    pointBorderWidth: 1.5,
    pointBorderColor: palette.ink,
    backgroundColor: palette.coral,
    borderColor: palette.ink,
  };
}

/** A horizontal or stepped reference line. */
export function referenceLine(label: string, data: (number | null)[], colour: string, dash: number[]): ChartDataset<'line', (number | null)[]> {
  return { label, data, borderColor: colour, backgroundColor: colour, borderDash: dash, borderWidth: 1.5, pointRadius: 0, pointHitRadius: 0, fill: false };
}

/** Words beside the outside markers. */
export function outsideLabels(isOutside: readonly boolean[], palette: ChartPalette, text = 'outside the limits'): PointLabel[] {
  return isOutside.flatMap((outside, index) => (outside ? [{ datasetIndex: OUTSIDE_DATASET, index, text, colour: palette.coral }] : []));
}

/**
 * "Monthly relapse control", p-chart view: share of relapse sites per month of surgery with
 * per-month 3-sigma limits (stepped, dashed) and the centre line; months outside their
 * limits get a diamond marker and a label. Months are named in `locale` (Angular's `LOCALE_ID`).
 */
export function buildRelapsePChart(trend: TrendResult, intervalLabel: string, palette: ChartPalette, locale: string): ControlChartConfiguration {
  const points = trend.relapse.points;
  const isOutside = points.map((point) => point.isOutside);
  const shares = points.map((point) => point.p * 100);
  const centre = trend.relapse.centre;
  const datasets: ChartDataset<'line', (number | null)[]>[] = [
    seriesLine(`Relapse share at ${intervalLabel}`, shares, palette),
    outsideMarkers(shares, isOutside, palette),
    referenceLine(`Centre ${formatShare(centre)}`, points.map(() => (centre === null ? null : centre * 100)), palette.slate, []),
    { ...referenceLine('Control limits (3 sigma, per month)', points.map((point) => point.ucl * 100), palette.coral, CONTROL_LIMIT_DASH), stepped: 'middle' },
    { ...referenceLine('', points.map((point) => point.lcl * 100), palette.coral, CONTROL_LIMIT_DASH), stepped: 'middle' },
  ];
  return {
    type: 'line',
    data: { labels: points.map((point) => formatLocalDate(point.month, 'month', locale)), datasets },
    options: {
      scales: {
        x: scaleLook(palette, 'Month of surgery'),
        y: { ...scaleLook(palette, `Sites in relapse at ${intervalLabel}, %`), min: 0, suggestedMax: 50 },
      },
      plugins: {
        legend: HIDDEN_LEGEND,
        tooltip: {
          ...tooltipLook(palette),
          filter: (item) => item.datasetIndex === 0,
          callbacks: {
            label: (item) => {
              const point = points[item.dataIndex];
              return point ? `${point.count} of ${point.n} sites (${formatShare(point.p)})${point.isOutside ? ', outside the limits' : ''}` : '';
            },
          },
        },
        tmPointLabels: { labels: outsideLabels(isOutside, palette), halo: palette.surface },
      },
    },
  };
}
