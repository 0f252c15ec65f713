import type { ChartConfiguration, ChartDataset } from 'chart.js';
import type { IntervalCompletion, RecallCompletionSummary } from '@tidemark/shared';
import type { PatternFill } from '../chart-kit/chart-extensions';
import { HIDDEN_LEGEND, scaleLook, tooltipLook } from '../chart-kit/chart-look';
import type { ChartPalette } from '../chart-kit/chart-palette';
import type { FigureTable } from '../chart-kit/figure-table';
import { formatProportion } from '../chart-kit/result-format';

/** The recall chart's configuration type. */
export type RecallChartConfiguration = ChartConfiguration<'bar', number[], string>;

/** Recall states drawn, in stacking order from the axis up. */
export type RecallState = 'seenInWindow' | 'seenEarly' | 'seenLate' | 'missed' | 'pending';

/** Legend words per state, naming the pattern too. */
export const RECALL_STATE_LABELS: Readonly<Record<RecallState, string>> = {
  seenInWindow: 'Seen in window (plain)',
  seenEarly: 'Seen early (vertical lines)',
  seenLate: 'Seen late (striped)',
  missed: 'Missed (cross-hatched)',
  pending: 'Window open, not seen yet (dotted)',
};

/** "Seen early" appears only when some interval has early visits, to keep the legend short. */
export function recallStates(recall: RecallCompletionSummary): RecallState[] {
  const hasEarly = recall.intervals.some((interval) => interval.seenEarly > 0);
  return ['seenInWindow', ...(hasEarly ? (['seenEarly'] as const) : []), 'seenLate', 'missed', 'pending'];
}

/**
 * "Recall completion": per interval, cases seen in window, early, late, missed and pending as
 * stacked bars, each state with its own pattern as well as colour.
 */
export function buildRecallChart(recall: RecallCompletionSummary, palette: ChartPalette): RecallChartConfiguration {
  const fills: Record<RecallState, PatternFill> = {
    seenInWindow: { kind: 'solid', colour: palette.teal, ink: palette.teal },
    seenEarly: { kind: 'vertical', colour: palette.tealBand, ink: palette.teal },
    seenLate: { kind: 'diagonal', colour: palette.sand, ink: palette.sandHatch },
    missed: { kind: 'cross', colour: palette.coral, ink: palette.surface },
    pending: { kind: 'open', colour: palette.surface, ink: palette.inkMuted },
  };
  const edges: Record<RecallState, string> = { seenInWindow: palette.teal, seenEarly: palette.teal, seenLate: palette.sandInk, missed: palette.coral, pending: palette.inkMuted };
  const states = recallStates(recall);
  const datasets: ChartDataset<'bar', number[]>[] = states.map((state) => ({
    label: RECALL_STATE_LABELS[state],
    data: recall.intervals.map((interval) => interval[state]),
    backgroundColor: fills[state].colour,
    borderColor: edges[state],
    borderWidth: 1.5,
    barPercentage: 0.7,
  }));
  return {
    type: 'bar',
    data: { labels: recall.intervals.map((interval) => interval.label), datasets },
    options: {
      scales: {
        x: { ...scaleLook(palette, 'Recall interval'), stacked: true },
        y: { ...scaleLook(palette, 'Cases due'), stacked: true, beginAtZero: true, ticks: { color: palette.inkMuted, precision: 0 } },
      },
      plugins: {
        legend: HIDDEN_LEGEND,
        tooltip: tooltipLook(palette),
        tmPatterns: { fills: states.map((state) => fills[state]) },
      },
    },
  };
}

/** The chart's numbers per interval, with completion and its Wilson interval. */
export function buildRecallTable(recall: RecallCompletionSummary): FigureTable {
  const cells = (interval: IntervalCompletion) => [
    interval.label,
    String(interval.due),
    String(interval.seenInWindow),
    String(interval.seenEarly),
    String(interval.seenLate),
    String(interval.missed),
    String(interval.pending),
    String(interval.notYetDue),
    formatProportion(interval.completion),
  ];
  return {
    caption: `Recalls per interval (${recall.nCases} cases, ${recall.nWithdrawn} withdrawn and left out). Completion = seen at any time out of seen and missed, with Wilson 95% CI.`,
    columns: ['Interval', 'Due', 'Seen in window', 'Seen early', 'Seen late', 'Missed', 'Pending', 'Not yet due', 'Completion'],
    rows: recall.intervals.map(cells),
  };
}
