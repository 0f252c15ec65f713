import type { AuditResults } from '@tidemark/shared';
import type { FigureTable } from '../chart-kit/figure-table';
import { NOT_AVAILABLE, formatInterval, formatMm, formatNumber } from '../chart-kit/result-format';
import { ARORA_2013, driftSeries, type DriftLevel } from './drift-series';

/** The drift chart's numbers: one row per interval (per subgroup when grouped). */
export function buildDriftTable(results: AuditResults, level: DriftLevel): FigureTable {
  const isGrouped = results.groups.length > 0;
  const rows = driftSeries(results).flatMap((series) =>
    results.schedule.map((interval, i) => {
      const summary = series.intervals[i];
      const stats = summary?.rebound[level] ?? null;
      const cells = [
        interval.label,
        String(summary?.rebound.nSites ?? 0),
        String(summary?.rebound.nPatients ?? 0),
        formatMm(stats?.mean),
        stats?.ci95 ? formatInterval(stats.ci95[0], stats.ci95[1], (value) => formatNumber(value, 2)) : NOT_AVAILABLE,
      ];
      return isGrouped ? [series.name, ...cells] : cells;
    }),
  );
  const columns = ['Interval', 'n sites', 'n patients', `Mean rebound, mm (${level} level)`, '95% CI, mm'];
  return {
    caption: `Mean rebound per interval, ${level} level. Published reference: ${ARORA_2013.citation}, ${ARORA_2013.mean} ± ${ARORA_2013.sd} mm at 6 months.`,
    columns: isGrouped ? ['Group', ...columns] : columns,
    rows,
  };
}
