import type { ChartConfiguration, ChartDataset, PointStyle } from 'chart.js';
import type { FunnelPoint, FunnelResult } from '@tidemark/shared';
import type { PointLabel } from '../chart-kit/chart-extensions';
import { HIDDEN_LEGEND, scaleLook, tooltipLook } from '../chart-kit/chart-look';
import type { ChartPalette } from '../chart-kit/chart-palette';
import type { FigureTable } from '../chart-kit/figure-table';
import { formatInterval, formatNumber, formatShare } from '../chart-kit/result-format';

/** A point on the funnel's axes: n on x, rate in percent on y. */
export interface FunnelXY {
  readonly x: number;
  readonly y: number;
}

/** The funnel chart's configuration type. */
export type FunnelChartConfiguration = ChartConfiguration<'line', FunnelXY[]>;

/** Choices on the funnel chart. */
export interface FunnelChartOptions {
  /** Label of the interval relapse is measured at (relapse funnel only). */
  readonly intervalLabel: string | null;
  readonly palette: ChartPalette;
}

/** Dash patterns of the limit curves: 95% medium dashes, 99.8% fine dots. */
export const LIMIT_95_DASH = [7, 4];
export const LIMIT_998_DASH = [2, 3];

/** Point style per position: beyond a limit is never shown by colour alone. */
export const POSITION_POINT_STYLE: Readonly<Record<FunnelPoint['position'], PointStyle>> = {
  inside: 'circle',
  'warning-high': 'triangle',
  'warning-low': 'triangle',
  'alarm-high': 'rectRot',
  'alarm-low': 'rectRot',
};

/** Operators are drawn as three datasets by position, each with its own marker and legend entry. */
export const OPERATOR_GROUPS: readonly { readonly label: string; readonly style: PointStyle; readonly positions: readonly FunnelPoint['position'][] }[] = [
  { label: 'Operator within the 95% limits (circle)', style: POSITION_POINT_STYLE.inside, positions: ['inside'] },
  { label: 'Beyond a 95% limit (triangle)', style: POSITION_POINT_STYLE['warning-high'], positions: ['warning-high', 'warning-low'] },
  { label: 'Beyond a 99.8% limit (diamond)', style: POSITION_POINT_STYLE['alarm-high'], positions: ['alarm-high', 'alarm-low'] },
];

/** Index of the first operator dataset (after the target line and the four limit curves). */
export const FIRST_OPERATOR_DATASET = 5;

/** Words per position, for labels and the table. */
export const POSITION_WORDS: Readonly<Record<FunnelPoint['position'], string>> = {
  inside: 'within the 95% limits',
  'warning-high': 'above the 95% limit',
  'warning-low': 'below the 95% limit',
  'alarm-high': 'above the 99.8% limit',
  'alarm-low': 'below the 99.8% limit',
};

/** Axis words for a measure. */
export function funnelAxisTitles(measure: FunnelResult['measure'], intervalLabel: string | null): { x: string; y: string } {
  return measure === 'complication'
    ? { x: 'Cases operated (n)', y: 'Cases with a complication, %' }
    : { x: `Sites measured at ${intervalLabel ?? 'the interval'} (n)`, y: `Sites in relapse at ${intervalLabel ?? 'the interval'}, %` };
}

/**
 * "Complications by operator": each operator's rate against the practice rate (target line)
 * with 95% and 99.8% limits (Spiegelhalter, Stat Med 2005;24:1185–1202) in two dash patterns;
 * points beyond a limit get their own point style and a label that says so.
 */
export function buildFunnelChart(funnel: FunnelResult, options: FunnelChartOptions): FunnelChartConfiguration {
  const { palette } = options;
  const curve = funnel.curve;
  const maxN = Math.max(1, ...curve.map((point) => point.n), ...funnel.points.map((point) => point.n));
  const along = (pick: (point: FunnelResult['curve'][number]) => number): FunnelXY[] => curve.map((point) => ({ x: point.n, y: pick(point) * 100 }));
  const line = (label: string, data: FunnelXY[], colour: string, dash: number[], width: number): ChartDataset<'line', FunnelXY[]> => ({
    label,
    data,
    borderColor: colour,
    backgroundColor: colour,
    borderDash: dash,
    borderWidth: width,
    pointRadius: 0,
    pointHitRadius: 0,
    fill: false,
  });
  const groups = OPERATOR_GROUPS.map((group) => ({ ...group, points: funnel.points.filter((point) => group.positions.includes(point.position)) }));
  const datasets: ChartDataset<'line', FunnelXY[]>[] = [
    line(`Practice rate ${formatShare(funnel.target)}`, [{ x: 0, y: funnel.target * 100 }, { x: maxN, y: funnel.target * 100 }], palette.slate, [], 2),
    line('95% limits', along((point) => point.upper95), palette.teal, LIMIT_95_DASH, 1.5),
    line('', along((point) => point.lower95), palette.teal, LIMIT_95_DASH, 1.5),
    line('99.8% limits', along((point) => point.upper998), palette.coral, LIMIT_998_DASH, 1.5),
    line('', along((point) => point.lower998), palette.coral, LIMIT_998_DASH, 1.5),
    ...groups.map((group): ChartDataset<'line', FunnelXY[]> => {
      const isBeyond = group.style !== 'circle';
      return {
        label: group.label,
        data: group.points.map((point) => ({ x: point.n, y: point.rate * 100 })),
        showLine: false,
        // Points on an axis (a rate of 0, the largest n) are drawn whole rather than cut by the plot edge.
        clip: false,
        pointStyle: group.style,
        pointRadius: isBeyond ? 9 : 6,
        pointHoverRadius: 10,
        pointBorderWidth: 2,
        // The signed-in operator's own point carries a dark ring as well as "(you)".
        pointBorderColor: group.points.map((point) => (point.isSelf ? palette.ink : palette.surface)),
        backgroundColor: isBeyond ? palette.coral : palette.teal,
        borderColor: isBeyond ? palette.coral : palette.teal,
      };
    }),
  ];
  const labels: PointLabel[] = groups.flatMap((group, g) =>
    group.points.map((point, index) => ({
      datasetIndex: FIRST_OPERATOR_DATASET + g,
      index,
      text: point.position === 'inside' ? point.label : `${point.label}: ${POSITION_WORDS[point.position]}`,
      colour: point.position === 'inside' ? palette.ink : palette.coral,
    })),
  );
  const highest = Math.max(funnel.target * 2, ...funnel.points.map((point) => Math.max(point.rate, point.limits998.upper)));
  const titles = funnelAxisTitles(funnel.measure, options.intervalLabel);

  return {
    type: 'line',
    data: { datasets },
    options: {
      scales: {
        x: { ...scaleLook(palette, titles.x), type: 'linear', min: 0, max: Math.ceil(maxN * 1.08) },
        y: { ...scaleLook(palette, titles.y), min: 0, max: Math.min(100, Math.ceil((highest * 100 * 1.2) / 5) * 5) },
      },
      plugins: {
        legend: HIDDEN_LEGEND,
        tooltip: {
          ...tooltipLook(palette),
          filter: (item) => item.datasetIndex >= FIRST_OPERATOR_DATASET,
          callbacks: { label: (item) => funnelPointSentence(groups[item.datasetIndex - FIRST_OPERATOR_DATASET]?.points[item.dataIndex]) },
        },
        tmPointLabels: { labels, halo: palette.surface },
      },
    },
  };
}

/** One operator in words: "Operator B: 6 of 20 (30.0%), above the 95% limit". */
export function funnelPointSentence(point: FunnelPoint | undefined): string {
  if (!point) return '';
  return `${point.label}: ${point.events} of ${point.n} (${formatShare(point.rate)}), ${POSITION_WORDS[point.position]}`;
}

/** The funnel's numbers: per operator, events, n, rate, limits and position. */
export function buildFunnelTable(funnel: FunnelResult, intervalLabel: string | null): FigureTable {
  const percent = (value: number) => formatNumber(value * 100, 1);
  const what = funnel.measure === 'complication' ? 'Cases with a complication' : `Sites in relapse at ${intervalLabel ?? 'the interval'}`;
  return {
    caption: `${what} per operator against the practice rate of ${formatShare(funnel.target)} (${funnel.totalEvents} of ${funnel.totalN}).`,
    columns: ['Operator', 'Events', 'n', 'Rate', '95% limits, %', '99.8% limits, %', 'Position'],
    rows: funnel.points.map((point) => [
      point.label,
      String(point.events),
      String(point.n),
      formatShare(point.rate),
      formatInterval(point.limits95.lower, point.limits95.upper, percent),
      formatInterval(point.limits998.lower, point.limits998.upper, percent),
      POSITION_WORDS[point.position],
    ]),
  };
}
