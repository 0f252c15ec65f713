import type { ChartConfiguration } from 'chart.js';
import type { RecallCompletionSummary } from '@tidemark/shared';
import { STATIC_CHART_OPTIONS } from './chart-canvas';
import { CHART_PALETTE } from './chart-palette';
import { valueLabelPlugin } from './value-label-plugin';

/** Parts of each interval's bar, in drawing order. */
const SEGMENTS = [
  { label: 'Seen in window', colour: CHART_PALETTE.teal, pick: (interval: RecallCompletionSummary['intervals'][number]) => interval.seenInWindow },
  { label: 'Seen early or late', colour: CHART_PALETTE.sand, pick: (interval: RecallCompletionSummary['intervals'][number]) => interval.seenEarly + interval.seenLate },
  { label: 'Missed (window closed)', colour: CHART_PALETTE.coral, pick: (interval: RecallCompletionSummary['intervals'][number]) => interval.missed },
  { label: 'Window open, not yet seen', colour: CHART_PALETTE.mist, pick: (interval: RecallCompletionSummary['intervals'][number]) => interval.pending },
] as const;

/**
 * Recall completion: one stacked bar of cases per interval — seen in window, seen early or late,
 * missed, still pending — with each part's count written on it and the completion share
 * (seen out of seen + missed) at the end of the bar.
 */
export function recallCompletionChartConfig(recall: RecallCompletionSummary): ChartConfiguration<'bar', number[], string> {
  const intervals = recall.intervals;
  const completion = intervals.map((interval) => (interval.completion.p === null ? 'no closed window yet' : `${(interval.completion.p * 100).toFixed(1)}% seen`));
  const counts = SEGMENTS.map((segment) => intervals.map((interval) => segment.pick(interval)));
  return {
    type: 'bar',
    data: {
      labels: intervals.map((interval) => interval.label),
      datasets: SEGMENTS.map((segment, index) => ({
        label: segment.label,
        data: counts[index],
        backgroundColor: segment.colour,
        borderColor: CHART_PALETTE.paper,
        borderWidth: 1,
        barPercentage: 0.7,
      })),
    },
    options: {
      ...STATIC_CHART_OPTIONS,
      indexAxis: 'y',
      layout: { padding: { top: 8, right: 150, bottom: 8, left: 8 } },
      plugins: {
        title: { display: true, text: `Recall completion by interval (${recall.nCases} cases, ${recall.nWithdrawn} withdrawn and left out)`, font: { size: 18, weight: 'bold' } },
        legend: { position: 'bottom', labels: { padding: 16 } },
      },
      scales: {
        x: { stacked: true, beginAtZero: true, title: { display: true, text: 'Cases due at the interval' }, grid: { color: CHART_PALETTE.grid } },
        y: { stacked: true, grid: { display: false } },
      },
    },
    plugins: [
      valueLabelPlugin((datasetIndex, index) => {
        const count = counts[datasetIndex]?.[index] ?? 0;
        return datasetIndex < 3 && count > 0 ? String(count) : null;
      }, 'centre', (datasetIndex) => (datasetIndex === 0 ? CHART_PALETTE.paper : CHART_PALETTE.ink)),
      valueLabelPlugin((datasetIndex, index) => (datasetIndex === SEGMENTS.length - 1 ? completion[index] : null), 'right'),
    ],
  };
}
