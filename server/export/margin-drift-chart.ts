import type { ChartConfiguration } from 'chart.js';
import type { OutcomeSummary, StabilityThresholds } from '@tidemark/shared';
import { STATIC_CHART_OPTIONS } from './chart-canvas';
import { CHART_PALETTE } from './chart-palette';
import { valueLabelPlugin } from './value-label-plugin';

/** One value per interval: a mean, a CI as [low, high], or nothing. */
type DriftPoint = number | [number, number] | null;

/** Rounds for a label: two decimals of a millimetre, as on the sheets. */
function mm(value: number): string {
  return value.toFixed(2);
}

/**
 * "Margin drift": mean site rebound (mm) per recall interval with its t-based 95% CI as a
 * floating bar, the patient-level mean as a dashed line with triangles, and the audit's relapse
 * threshold as a labelled reference line. Means are written beside the points.
 */
export function marginDriftChartConfig(summary: OutcomeSummary, thresholds: StabilityThresholds): ChartConfiguration<'bar' | 'line', DriftPoint[], string> {
  const intervals = summary.intervals;
  const siteMeans: DriftPoint[] = intervals.map((interval) => interval.rebound.site?.mean ?? null);
  const ci: DriftPoint[] = intervals.map((interval) => {
    const limits = interval.rebound.site?.ci95;
    return limits ? [limits[0], limits[1]] : null;
  });
  const patientMeans: DriftPoint[] = intervals.map((interval) => interval.rebound.patient?.mean ?? null);
  const labels = intervals.map((interval) => `${interval.label} (n = ${interval.nSites} sites)`);
  return {
    type: 'bar',
    data: {
      labels,
      datasets: [
        {
          type: 'bar',
          label: '95% CI of the site mean',
          data: ci,
          backgroundColor: CHART_PALETTE.tealLight,
          borderColor: CHART_PALETTE.teal,
          borderWidth: 1,
          barPercentage: 0.25,
          order: 3,
        },
        {
          type: 'line',
          label: 'Mean rebound, sites (circles)',
          data: siteMeans,
          borderColor: CHART_PALETTE.teal,
          backgroundColor: CHART_PALETTE.teal,
          pointStyle: 'circle',
          pointRadius: 6,
          borderWidth: 3,
          order: 1,
        },
        {
          type: 'line',
          label: 'Mean rebound, patients (triangles, dashed)',
          data: patientMeans,
          borderColor: CHART_PALETTE.sandDark,
          backgroundColor: CHART_PALETTE.sandDark,
          borderDash: [8, 5],
          pointStyle: 'triangle',
          pointRadius: 7,
          borderWidth: 2,
          order: 2,
        },
        {
          type: 'line',
          label: `Relapse threshold: ${thresholds.relapse.toFixed(1)} mm (dotted)`,
          data: intervals.map(() => thresholds.relapse),
          borderColor: CHART_PALETTE.coral,
          borderDash: [2, 4],
          pointRadius: 0,
          borderWidth: 2,
          order: 4,
        },
      ],
    },
    options: {
      ...STATIC_CHART_OPTIONS,
      layout: { padding: { top: 8, right: 24, bottom: 8, left: 8 } },
      plugins: {
        title: { display: true, text: 'Margin drift: mean rebound by recall interval, with 95% CI', font: { size: 18, weight: 'bold' } },
        legend: { position: 'bottom', labels: { usePointStyle: true, padding: 16 } },
      },
      scales: {
        x: { grid: { display: false } },
        y: {
          beginAtZero: true,
          suggestedMax: thresholds.relapse + 0.5,
          title: { display: true, text: 'Rebound, mm (post-op − recall REF→GM; positive = coronal regrowth)' },
          grid: { color: CHART_PALETTE.grid },
        },
      },
    },
    plugins: [valueLabelPlugin((datasetIndex, index) => (datasetIndex === 1 && typeof siteMeans[index] === 'number' ? mm(siteMeans[index]) : null), 'above')],
  };
}
