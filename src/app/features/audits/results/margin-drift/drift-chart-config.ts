import type { ChartConfiguration, ChartDataset, PointStyle } from 'chart.js';
import type { AuditResults, DescriptiveStatistics } from '@tidemark/shared';
import type {} from '../chart-kit/chart-extensions';
import { HIDDEN_LEGEND, scaleLook, tooltipLook } from '../chart-kit/chart-look';
import { SERIES_DASHES, SERIES_POINT_STYLES, withAlpha, type ChartPalette } from '../chart-kit/chart-palette';
import { formatNumber } from '../chart-kit/result-format';
import { ARORA_2013, driftSeries, referenceInterval, type DriftLevel } from './drift-series';

/** A value on the interval axis, or a point placed on an interval by its label. */
export type DriftPoint = number | null | { readonly x: string; readonly y: number };

/** The drift chart's configuration type. */
export type DriftChartConfiguration = ChartConfiguration<'line', DriftPoint[], string>;

/** Choices on the drift chart. */
export interface DriftChartOptions {
  readonly level: DriftLevel;
  readonly showReference: boolean;
  /** Whether the 95% CI bands are drawn (the table always has the intervals). */
  readonly showBands: boolean;
  /** The interval chosen in the filters, drawn with a larger point. */
  readonly highlightInterval: string | null;
  readonly palette: ChartPalette;
  /** The ungrouped line's name: what the narrowing leaves (see `cohortLabel`); "All cases" when left out. */
  readonly cohortLabel?: string;
}

/** Dash patterns of the stability threshold lines: stable long dashes, relapse short. */
export const STABLE_THRESHOLD_DASH = [10, 5];
export const RELAPSE_THRESHOLD_DASH = [3, 4];

/**
 * "Margin drift by interval": mean rebound per interval with its 95% CI band (patient or
 * site level; bands optional), one line per subgroup, dashed stability thresholds and, optionally, the
 * published 6-month reference drawn as mean ± SD.
 */
export function buildDriftChart(results: AuditResults, options: DriftChartOptions): DriftChartConfiguration {
  const { palette, level } = options;
  const labels = results.schedule.map((interval) => interval.label);
  const highlight = results.schedule.findIndex((interval) => interval.key === options.highlightInterval);
  const datasets: ChartDataset<'line', DriftPoint[]>[] = [];

  driftSeries(results, options.cohortLabel).forEach((series, index) => {
    const colour = results.groups.length > 0 ? palette.series[index % palette.series.length] : palette.teal;
    const stats = series.intervals.map((interval) => interval?.rebound[level] ?? null);
    const band = results.groups.length > 0 ? withAlpha(colour, palette.scheme === 'dark' ? 0.16 : 0.12) : palette.tealBand;
    if (options.showBands) datasets.push(...bandDatasets(series.name, stats, band));
    datasets.push({
      label: `${series.name}: mean rebound`,
      data: stats.map((value) => value?.mean ?? null),
      borderColor: colour,
      backgroundColor: colour,
      borderWidth: 2.5,
      borderDash: [...SERIES_DASHES[index % SERIES_DASHES.length]],
      pointStyle: SERIES_POINT_STYLES[index % SERIES_POINT_STYLES.length],
      pointRadius: labels.map((_, i) => (i === highlight ? 7 : 4)),
      pointHoverRadius: 8,
      fill: false,
    });
  });

  const { stable, relapse } = results.thresholds;
  datasets.push(
    thresholdLine(`Stable: rebound at or below ${formatNumber(stable, 1)} mm`, stable, labels.length, palette.slate, STABLE_THRESHOLD_DASH),
    thresholdLine(`Relapse: rebound above ${formatNumber(relapse, 1)} mm`, relapse, labels.length, palette.coral, RELAPSE_THRESHOLD_DASH),
  );

  const reference = referenceInterval(results.schedule);
  if (options.showReference && reference) {
    const x = reference.label;
    const low = ARORA_2013.mean - ARORA_2013.sd;
    const high = ARORA_2013.mean + ARORA_2013.sd;
    // The mean comes first so the legend shows its diamond; the line then runs over mean − SD to mean + SD.
    const styles: PointStyle[] = ['rectRot', 'dash', 'dash'];
    datasets.push({
      label: `Published: ${ARORA_2013.citation}, ${ARORA_2013.mean} ± ${ARORA_2013.sd} mm (mean ± SD) at 6 months`,
      data: [
        { x, y: ARORA_2013.mean },
        { x, y: low },
        { x, y: high },
      ],
      borderColor: palette.sandInk,
      backgroundColor: palette.sand,
      borderWidth: 2,
      pointStyle: styles,
      pointRadius: [7, 10, 10],
      pointBorderWidth: 2,
      fill: false,
    });
  }

  return {
    type: 'line',
    data: { labels, datasets },
    options: {
      interaction: { mode: 'nearest', intersect: false },
      spanGaps: false,
      scales: {
        x: { ...scaleLook(palette, 'Recall interval') },
        y: { ...scaleLook(palette, `Mean rebound, mm (${level} level)`), suggestedMin: 0, suggestedMax: relapse + 0.5 },
      },
      plugins: {
        legend: HIDDEN_LEGEND,
        tooltip: { ...tooltipLook(palette), filter: (item) => item.dataset.label !== '' && !item.dataset.label?.endsWith('95% CI') },
      },
    },
  };
}

/** A series' 95% CI as a band: the upper limit filled down to the next dataset, the unlabelled lower limit. */
function bandDatasets(name: string, stats: readonly (DescriptiveStatistics | null)[], band: string): ChartDataset<'line', DriftPoint[]>[] {
  const edge = { borderWidth: 0, pointRadius: 0, pointHitRadius: 0, backgroundColor: band, borderColor: band };
  return [
    { ...edge, label: `${name}: 95% CI`, data: stats.map((value) => value?.ci95?.[1] ?? null), fill: '+1' },
    { ...edge, label: '', data: stats.map((value) => value?.ci95?.[0] ?? null), fill: false },
  ];
}

function thresholdLine(label: string, value: number, length: number, colour: string, dash: number[]): ChartDataset<'line', DriftPoint[]> {
  return {
    label,
    data: new Array<number>(length).fill(value),
    borderColor: colour,
    backgroundColor: colour,
    borderWidth: 1.5,
    borderDash: dash,
    pointRadius: 0,
    pointHitRadius: 0,
    fill: false,
  };
}
