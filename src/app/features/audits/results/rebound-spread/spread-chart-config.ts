import type { ChartConfiguration, ChartDataset } from 'chart.js';
import type { AuditResults, ReboundHistogram, StabilityThresholds } from '@tidemark/shared';
import type { PatternFill } from '../chart-kit/chart-extensions';
import { HIDDEN_LEGEND, scaleLook, tooltipLook } from '../chart-kit/chart-look';
import type { ChartPalette } from '../chart-kit/chart-palette';
import type { FigureTable } from '../chart-kit/figure-table';
import { formatNumber, formatShare } from '../chart-kit/result-format';

/** A bin's stability class; `mixed` when custom thresholds cut through the bin. */
export type BinClass = 'stable' | 'minor' | 'relapse' | 'mixed';

/** The spread chart's configuration type. */
export type SpreadChartConfiguration = ChartConfiguration<'bar', (number | null)[], string>;

/** Choices on the spread chart. */
export interface SpreadChartOptions {
  readonly intervalKey: string;
  readonly palette: ChartPalette;
}

const CLASS_ORDER: readonly BinClass[] = ['stable', 'minor', 'relapse', 'mixed'];

/**
 * The class of a bin (from, to]: bins sit wholly inside one class with the default 0.5 mm
 * bins and thresholds, which is why the server cuts them that way.
 */
export function binClass(bin: { readonly from: number; readonly to: number }, thresholds: StabilityThresholds): BinClass {
  if (bin.to <= thresholds.stable) return 'stable';
  if (bin.from >= thresholds.relapse) return 'relapse';
  if (bin.from >= thresholds.stable && bin.to <= thresholds.relapse) return 'minor';
  return 'mixed';
}

/** Legend words per class: the rule and the pattern, so the class never rests on hue. */
export function classLabel(kind: BinClass, thresholds: StabilityThresholds): string {
  const stable = formatNumber(thresholds.stable, 1);
  const relapse = formatNumber(thresholds.relapse, 1);
  switch (kind) {
    case 'stable':
      return `Stable, at or below ${stable} mm (plain)`;
    case 'minor':
      return `Minor, above ${stable} to ${relapse} mm (striped)`;
    case 'relapse':
      return `Relapse, above ${relapse} mm (cross-hatched)`;
    case 'mixed':
      return 'Bin spans a threshold (dotted)';
  }
}

/** The histogram of one interval, or null when the server sent none. */
export function histogramFor(results: AuditResults, intervalKey: string): ReboundHistogram | null {
  return results.reboundHistograms.find((histogram) => histogram.intervalKey === intervalKey) ?? null;
}

/** Bin label: "0.5 to 1.0", upper edge included. */
export function binLabel(bin: { readonly from: number; readonly to: number }): string {
  return `${formatNumber(bin.from, 1)} to ${formatNumber(bin.to, 1)}`;
}

/**
 * "Rebound spread": site rebound at one interval as a histogram whose bars are filled by
 * stability class with a pattern as well as a colour (plain, striped, cross-hatched).
 */
export function buildSpreadChart(results: AuditResults, options: SpreadChartOptions): SpreadChartConfiguration {
  const { palette } = options;
  const bins = histogramFor(results, options.intervalKey)?.bins ?? [];
  const classes = bins.map((bin) => binClass(bin, results.thresholds));
  const shown = CLASS_ORDER.filter((kind) => kind !== 'mixed' || classes.includes('mixed'));
  const fills: Record<BinClass, PatternFill> = {
    stable: { kind: 'solid', colour: palette.teal, ink: palette.teal },
    minor: { kind: 'diagonal', colour: palette.sand, ink: palette.sandHatch },
    relapse: { kind: 'cross', colour: palette.coral, ink: palette.surface },
    mixed: { kind: 'dots', colour: palette.grid, ink: palette.ink },
  };
  const edges: Record<BinClass, string> = { stable: palette.teal, minor: palette.sandInk, relapse: palette.coral, mixed: palette.inkMuted };
  const datasets: ChartDataset<'bar', (number | null)[]>[] = shown.map((kind) => ({
    label: classLabel(kind, results.thresholds),
    data: bins.map((bin, i) => (classes[i] === kind ? bin.count : null)),
    backgroundColor: fills[kind].colour,
    borderColor: edges[kind],
    borderWidth: 1.5,
    barPercentage: 1,
    categoryPercentage: 0.94,
  }));

  return {
    type: 'bar',
    data: { labels: bins.map(binLabel), datasets },
    options: {
      scales: {
        x: { ...scaleLook(palette, 'Site rebound, mm (each bar includes its upper edge)'), stacked: true },
        y: { ...scaleLook(palette, 'Sites'), stacked: true, beginAtZero: true, ticks: { color: palette.inkMuted, precision: 0 } },
      },
      plugins: {
        legend: HIDDEN_LEGEND,
        tooltip: { ...tooltipLook(palette), filter: (item) => item.raw !== null },
        tmPatterns: { fills: shown.map((kind) => fills[kind]) },
      },
    },
  };
}

/** The histogram's numbers: bin, class, sites, share of sites. */
export function buildSpreadTable(results: AuditResults, intervalKey: string): FigureTable {
  const bins = histogramFor(results, intervalKey)?.bins ?? [];
  const total = bins.reduce((sum, bin) => sum + bin.count, 0);
  const names: Record<BinClass, string> = { stable: 'Stable', minor: 'Minor', relapse: 'Relapse', mixed: 'Spans a threshold' };
  const label = results.schedule.find((interval) => interval.key === intervalKey)?.label ?? intervalKey;
  return {
    caption: `Sites by rebound at ${label}, in 0.5 mm bins (upper edge included).`,
    columns: ['Rebound, mm', 'Stability class', 'Sites', 'Share of sites'],
    rows: bins.map((bin) => [binLabel(bin), names[binClass(bin, results.thresholds)], String(bin.count), formatShare(total === 0 ? null : bin.count / total)]),
  };
}
