import type { AuditResults, DescriptiveStatistics, IntervalOutcomeSummary, ProportionEstimate } from '@tidemark/shared';
import { NOT_AVAILABLE, formatInterval, formatNumber, formatShare } from '../chart-kit/result-format';
import { WHOLE_COHORT_LABEL } from '../cohort-label';

/** An estimate and its 95% interval, worded apart so the table can set the interval on its own line. */
export interface WordedEstimate {
  readonly value: string;
  readonly ci: string | null;
}

/** One row of the summary table: a group (or the whole cohort) at one interval, already worded. */
export interface SummaryRow {
  readonly id: string;
  readonly group: string;
  readonly interval: string;
  readonly nSites: number;
  readonly nPatients: number;
  readonly reboundSite: WordedEstimate;
  readonly reboundPatient: WordedEstimate;
  readonly stable: WordedEstimate;
  readonly minor: WordedEstimate;
  readonly relapse: WordedEstimate;
  readonly retained: WordedEstimate;
}

/** Which rows to show. */
export interface SummaryFilter {
  /** One interval's key, or null for every interval. */
  readonly intervalKey: string | null;
  /** Words a row's group or interval must contain (case-insensitive); empty keeps all. */
  readonly text: string;
  /** The first row's name: the cohort the results show (see `cohortLabel`); "All cases" when left out. */
  readonly cohortLabel?: string;
}

/**
 * Rows of the summary table: the cohort shown (named after the narrowing, so a narrowed table
 * never claims "All cases"), then one per group when grouped, at the chosen interval (or every
 * interval), filtered by the typed words.
 */
export function summaryRows(results: AuditResults, filter: SummaryFilter): SummaryRow[] {
  const lines = [{ group: filter.cohortLabel ?? WHOLE_COHORT_LABEL, summary: results.summary }, ...results.groups.map((group) => ({ group: group.label, summary: group.summary }))];
  const intervals = results.schedule.filter((interval) => filter.intervalKey === null || interval.key === filter.intervalKey);
  const words = filter.text.trim().toLowerCase();
  return lines
    .flatMap((line) =>
      intervals.map((interval) => {
        const found = line.summary.intervals.find((summary) => summary.intervalKey === interval.key) ?? null;
        return summaryRow(`${line.group}|${interval.key}`, line.group, interval.label, found);
      }),
    )
    .filter((row) => words === '' || `${row.group} ${row.interval}`.toLowerCase().includes(words));
}

const MISSING: WordedEstimate = { value: NOT_AVAILABLE, ci: null };

/** A mean with its t-based 95% CI, the unit once at the end: "0.79 mm", "0.72 to 0.86 mm". */
export function wordedMean(stats: DescriptiveStatistics | null, digits: number, unit: string): WordedEstimate {
  if (!stats) return MISSING;
  const number = (value: number) => formatNumber(value, digits);
  return { value: `${number(stats.mean)}${unit}`, ci: stats.ci95 ? `${formatInterval(stats.ci95[0], stats.ci95[1], number)}${unit}` : null };
}

/** A share with its Wilson 95% interval: "49.9%", "44.6 to 55.1%". */
export function wordedShare(estimate: ProportionEstimate): WordedEstimate {
  if (estimate.p === null) return MISSING;
  const percent = (value: number) => formatNumber(value * 100, 1);
  const ci = estimate.lower !== null && estimate.upper !== null ? `${formatInterval(estimate.lower, estimate.upper, percent)}%` : null;
  return { value: formatShare(estimate.p), ci };
}

function summaryRow(id: string, group: string, interval: string, summary: IntervalOutcomeSummary | null): SummaryRow {
  if (!summary) {
    return { id, group, interval, nSites: 0, nPatients: 0, reboundSite: MISSING, reboundPatient: MISSING, stable: MISSING, minor: MISSING, relapse: MISSING, retained: MISSING };
  }
  return {
    id,
    group,
    interval,
    nSites: summary.nSites,
    nPatients: summary.nPatients,
    reboundSite: wordedMean(summary.rebound.site, 2, ' mm'),
    reboundPatient: wordedMean(summary.rebound.patient, 2, ' mm'),
    stable: wordedShare(summary.stability.stable),
    minor: wordedShare(summary.stability.minor),
    relapse: wordedShare(summary.stability.relapse),
    retained: wordedMean(summary.percentRetained.patient, 1, '%'),
  };
}
