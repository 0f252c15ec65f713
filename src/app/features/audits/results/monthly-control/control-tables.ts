import type { TrendResult } from '@tidemark/shared';
import type { FigureTable } from '../chart-kit/figure-table';
import { NOT_AVAILABLE, formatInterval, formatMm, formatNumber, formatShare } from '../chart-kit/result-format';
import { formatLocalDate } from '../../../../shared/dates/local-date';

const percent = (value: number) => formatNumber(value * 100, 1);

/** The p-chart's numbers: per month (named in `locale`, Angular's `LOCALE_ID`), relapse sites out of sites, share, limits, and whether outside. */
export function buildPChartTable(trend: TrendResult, intervalLabel: string, locale: string): FigureTable {
  return {
    caption: `Sites in relapse at ${intervalLabel} per month of surgery; centre ${formatShare(trend.relapse.centre)}, 3-sigma limits per month.`,
    columns: ['Month of surgery', 'Relapse sites', 'Sites', 'Share', 'Limits, %', 'Outside the limits'],
    rows: trend.relapse.points.map((point) => [
      formatLocalDate(point.month, 'month', locale),
      String(point.count),
      String(point.n),
      formatShare(point.p),
      formatInterval(point.lcl, point.ucl, percent),
      point.isOutside ? 'Yes' : 'No',
    ]),
  };
}

/** The XmR chart's numbers: per month (named in `locale`, Angular's `LOCALE_ID`), mean rebound and whether outside the process limits. */
export function buildXmrTable(trend: TrendResult, intervalLabel: string, locale: string): FigureTable {
  const { mean, lcl, ucl } = trend.rebound;
  const limits = lcl !== null && ucl !== null ? formatInterval(lcl, ucl, (value) => formatNumber(value, 2)) + ' mm' : NOT_AVAILABLE;
  return {
    caption: `Mean site rebound at ${intervalLabel} per month of surgery; mean ${formatMm(mean)}, natural process limits ${limits}.`,
    columns: ['Month of surgery', 'Mean rebound, mm', 'Outside the limits'],
    rows: trend.rebound.points.map((point) => [formatLocalDate(point.month, 'month', locale), formatMm(point.value), point.isOutside ? 'Yes' : 'No']),
  };
}

/** The CUSUM's numbers: every case in order, whether it had a complication, the CUSUM and signals. */
export function buildCusumTable(trend: TrendResult): FigureTable {
  const signals = new Set(trend.cusum.signalAt);
  return {
    caption: `Complications CUSUM in order of surgery; decision limit h = ${formatNumber(trend.cusum.h, 2)}.`,
    columns: ['Case (order)', 'Surgery date', 'Complication', 'CUSUM', 'Signal'],
    rows: trend.cusum.points.map((point) => [
      String(point.index + 1),
      point.surgeryDate,
      point.hadComplication ? 'Yes' : 'No',
      formatNumber(point.value, 2),
      signals.has(point.index) ? 'Signal' : '',
    ]),
  };
}
