import type { ChartConfiguration, ChartDataset } from 'chart.js';
import type { SurvivalResult } from '@tidemark/shared';
import type {} from '../chart-kit/chart-extensions';
import { HIDDEN_LEGEND, scaleLook, tooltipLook } from '../chart-kit/chart-look';
import type { ChartPalette } from '../chart-kit/chart-palette';
import type { FigureTable } from '../chart-kit/figure-table';
import { NOT_AVAILABLE, formatInterval, formatNumber, formatShare } from '../chart-kit/result-format';

/** A point of the curve: days on x, percent free of relapse on y (null where the CI is not estimable). */
export interface SurvivalXY {
  readonly x: number;
  readonly y: number | null;
}

/** The survival chart's configuration type. */
export type SurvivalChartConfiguration = ChartConfiguration<'line', SurvivalXY[]>;

/** Dash of the median guide lines. */
export const MEDIAN_DASH = [4, 4];

/**
 * "Time to relapse": Kaplan–Meier share of sites free of relapse as a step curve with its
 * 95% log-log band, from 100% at surgery; guide lines at the median when it is reached.
 * Chart.js's `stepped: 'before'` keeps each level until the next event time and drops
 * there ('after' would drop at the previous time, a step too early).
 */
export function buildSurvivalChart(survival: SurvivalResult, palette: ChartPalette): SurvivalChartConfiguration {
  const steps = survival.curve.steps;
  const start = { time: 0, survival: 1, lower: 1, upper: 1 };
  const curve = [start, ...steps];
  const percent = (value: number | null) => (value === null ? null : value * 100);
  const stepLine = (label: string, data: SurvivalXY[]): ChartDataset<'line', SurvivalXY[]> => ({
    label,
    data,
    stepped: 'before',
    pointRadius: 0,
    pointHitRadius: 0,
    borderWidth: 0,
    backgroundColor: palette.tealBand,
    borderColor: palette.tealBand,
    fill: false,
  });
  const datasets: ChartDataset<'line', SurvivalXY[]>[] = [
    { ...stepLine('95% CI (log-log)', curve.map((step) => ({ x: step.time, y: percent(step.upper) }))), fill: '+1' },
    stepLine('', curve.map((step) => ({ x: step.time, y: percent(step.lower) }))),
    {
      label: `Sites free of relapse (rebound above ${formatNumber(survival.relapseThresholdMm, 1)} mm)`,
      data: curve.map((step) => ({ x: step.time, y: step.survival * 100 })),
      stepped: 'before',
      borderColor: palette.teal,
      backgroundColor: palette.teal,
      borderWidth: 2.5,
      pointRadius: 0,
      pointHitRadius: 6,
      fill: false,
    },
  ];
  const median = survival.curve.median;
  if (median !== null) {
    datasets.push({
      label: `Median time to relapse: ${median} days`,
      data: [
        { x: 0, y: 50 },
        { x: median, y: 50 },
        { x: median, y: 0 },
      ],
      borderColor: palette.coral,
      backgroundColor: palette.coral,
      borderDash: MEDIAN_DASH,
      borderWidth: 1.5,
      pointRadius: 0,
      fill: false,
    });
  }
  return {
    type: 'line',
    data: { datasets },
    options: {
      scales: {
        x: { ...scaleLook(palette, 'Days since surgery'), type: 'linear', min: 0 },
        y: { ...scaleLook(palette, 'Sites free of relapse, %'), min: 0, max: 100 },
      },
      plugins: {
        legend: HIDDEN_LEGEND,
        tooltip: { ...tooltipLook(palette), filter: (item) => item.datasetIndex === 2 },
      },
    },
  };
}

/** The curve's numbers: each event time with sites at risk, relapses, share free of relapse and CI. */
export function buildSurvivalTable(survival: SurvivalResult): FigureTable {
  return {
    caption: `Kaplan–Meier estimate at each time a site relapsed (rebound above ${formatNumber(survival.relapseThresholdMm, 1)} mm); sites without relapse are censored at their last recall.`,
    columns: ['Days since surgery', 'Sites at risk', 'Relapsed', 'Free of relapse', '95% CI'],
    rows: survival.curve.steps.map((step) => [
      String(step.time),
      String(step.atRisk),
      String(step.events),
      formatShare(step.survival),
      step.lower !== null && step.upper !== null ? formatInterval(step.lower, step.upper, (value) => formatNumber(value * 100, 1)) + '%' : NOT_AVAILABLE,
    ]),
  };
}
