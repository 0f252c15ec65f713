import type { AuditResults } from '@tidemark/shared';
import { countsLine } from './result-format';

/** "At 6 months: 339 sites · 50 patients. Cohort: 584 sites · 87 patients · 93 cases." */
export function intervalCountsLine(results: AuditResults, intervalKey: string | null): string {
  const cohort = `Cohort: ${countsLine({ sites: results.cohort.sites, patients: results.cohort.patients, cases: results.cohort.cases })}.`;
  const interval = results.summary.intervals.find((found) => found.intervalKey === intervalKey);
  if (!interval) return cohort;
  return `At ${interval.label}: ${countsLine({ sites: interval.nSites, patients: interval.nPatients })}. ${cohort}`;
}

/** The label of an interval key in the results' schedule. */
export function intervalLabelOf(results: AuditResults, intervalKey: string | null): string {
  return results.schedule.find((interval) => interval.key === intervalKey)?.label ?? 'the chosen interval';
}
