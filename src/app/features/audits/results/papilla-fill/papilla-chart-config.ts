import type { ChartConfiguration, ChartDataset } from 'chart.js';
import type { AuditResults, IntervalOutcomeSummary } from '@tidemark/shared';
import type {} from '../chart-kit/chart-extensions';
import { HIDDEN_LEGEND, scaleLook, tooltipLook } from '../chart-kit/chart-look';
import { readableInk, type ChartPalette } from '../chart-kit/chart-palette';
import type { FigureTable } from '../chart-kit/figure-table';
import { formatNumber, formatShare } from '../chart-kit/result-format';

/** The papilla chart's configuration type. */
export type PapillaChartConfiguration = ChartConfiguration<'bar', (number | null)[], string>;

/** The papilla index, 0–4 (Jemt, Int J Periodontics Restorative Dent 1997;17:326–333), in our words. */
export const PAPILLA_SCORES = [
  'Score 0: no papilla',
  'Score 1: less than half the height',
  'Score 2: half or more',
  'Score 3: fills the embrasure',
  'Score 4: overgrown',
] as const;

/** Segments shorter than this (px) carry no number. */
const LABEL_MIN_HEIGHT = 14;

/** Shares of a score per scheduled interval, in percent (null where nothing was scored). */
function sharesOf(results: AuditResults, score: number): (number | null)[] {
  return results.schedule.map((interval) => {
    const summary = intervalSummary(results, interval.key);
    const estimate = summary?.papilla.distribution.find((entry) => entry.score === score)?.estimate;
    return estimate && estimate.p !== null ? estimate.p * 100 : null;
  });
}

function intervalSummary(results: AuditResults, key: string): IntervalOutcomeSummary | null {
  return results.summary.intervals.find((interval) => interval.intervalKey === key) ?? null;
}

/**
 * "Papilla fill by interval": stacked shares of papilla scores 0–4 per interval, each
 * segment carrying its score and percentage so the scores never rest on hue alone.
 */
export function buildPapillaChart(results: AuditResults, palette: ChartPalette): PapillaChartConfiguration {
  const datasets: ChartDataset<'bar', (number | null)[]>[] = PAPILLA_SCORES.map((label, score) => ({
    label,
    data: sharesOf(results, score),
    backgroundColor: palette.papilla[score],
    borderColor: palette.surface,
    borderWidth: 1,
    barPercentage: 0.7,
  }));
  return {
    type: 'bar',
    data: { labels: results.schedule.map((interval) => interval.label), datasets },
    options: {
      scales: {
        x: { ...scaleLook(palette, 'Recall interval'), stacked: true },
        y: { ...scaleLook(palette, 'Share of scored papilla sites, %'), stacked: true, min: 0, max: 100 },
      },
      plugins: {
        legend: HIDDEN_LEGEND,
        tooltip: tooltipLook(palette),
        tmBarLabels: {
          display: true,
          format: 'percent',
          inks: palette.papilla.map((colour) => readableInk(colour)),
          minHeight: LABEL_MIN_HEIGHT,
          names: PAPILLA_SCORES.map((_, score) => `Score ${score}`),
        },
      },
    },
  };
}

/** The chart's numbers: per interval, scored sites and the share (count) of each score, and change from baseline. */
export function buildPapillaTable(results: AuditResults): FigureTable {
  return {
    caption: 'Papilla scores (Jemt 1997) per interval: share of scored sites, with counts.',
    columns: ['Interval', 'Scored sites', 'Patients', ...PAPILLA_SCORES.map((_, score) => `Score ${score}`), 'Mean change from baseline, score points'],
    rows: results.schedule.map((interval) => {
      const papilla = intervalSummary(results, interval.key)?.papilla;
      const scores = PAPILLA_SCORES.map((_, score) => {
        const estimate = papilla?.distribution.find((entry) => entry.score === score)?.estimate;
        return estimate ? `${formatShare(estimate.p)} (${estimate.count})` : '—';
      });
      const change = papilla?.change.site?.mean;
      return [interval.label, String(papilla?.nSites ?? 0), String(papilla?.nPatients ?? 0), ...scores, change === undefined ? '—' : formatNumber(change, 2)];
    }),
  };
}
