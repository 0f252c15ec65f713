import type { AuditResults, IntervalOutcomeSummary, RecallInterval } from '@tidemark/shared';
import { WHOLE_COHORT_LABEL } from '../cohort-label';

/** Patient level (mean of each patient's sites, the default) or site level. */
export type DriftLevel = 'patient' | 'site';

/** One line on the drift chart: the whole cohort, or one subgroup. */
export interface DriftSeries {
  readonly name: string;
  /** The series' summary per scheduled interval (null when nothing was recorded there). */
  readonly intervals: readonly (IntervalOutcomeSummary | null)[];
}

/** Published rebound after crown lengthening to compare with (DESIGN.md §9). */
export const ARORA_2013 = {
  mean: 0.77,
  sd: 0.58,
  targetDays: 182,
  citation: 'Arora et al., J Periodontol 2013;84:934–940',
} as const;

/** Lines to draw: one per subgroup when grouped, else the cohort shown, named `cohortName` (see `cohortLabel`). */
export function driftSeries(results: AuditResults, cohortName: string = WHOLE_COHORT_LABEL): DriftSeries[] {
  const lines = results.groups.length > 0 ? results.groups.map((group) => ({ name: group.label, summary: group.summary })) : [{ name: cohortName, summary: results.summary }];
  return lines.map((line) => ({
    name: line.name,
    intervals: results.schedule.map((interval) => line.summary.intervals.find((found) => found.intervalKey === interval.key) ?? null),
  }));
}

/** The interval the 6-month reference belongs to: `6m`, else one due within a month of 182 days; null if none. */
export function referenceInterval(schedule: readonly RecallInterval[]): RecallInterval | null {
  const exact = schedule.find((interval) => interval.key === '6m');
  if (exact) return exact;
  const near = schedule.filter((interval) => Math.abs(interval.targetDays - ARORA_2013.targetDays) <= 30);
  return near.sort((a, b) => Math.abs(a.targetDays - ARORA_2013.targetDays) - Math.abs(b.targetDays - ARORA_2013.targetDays))[0] ?? null;
}
