import type { AuditResults, AuditDataset, StandardResult, StandardView } from '@tidemark/shared';
import { STANDARD_METRIC_INFO } from '@tidemark/shared';
import { cohortCounts, reboundHistogram, standardResult, summariseOutcomes } from '@tidemark/analytics';
import type { AuditSnapshot } from '../services/audit-cycle.service';

/** Where a snapshot came from, as the results report it. */
export interface SnapshotOrigin {
  auditId: number;
  cycleId: number | null;
  frozenAt: string | null;
}

/** A dataset's whole-cohort outcome summary, exactly as AuditResultsService summarises. */
export function summariseDataset(dataset: AuditDataset) {
  return summariseOutcomes(dataset.records, { cases: dataset.cases, schedule: dataset.schedule, thresholds: dataset.thresholds, asOf: dataset.asOf });
}

/**
 * The headline results of one snapshot, composed from the same analytics functions and in the
 * same way as AuditResultsService.results (without subgroups). The workbook computes everything
 * from one snapshot so that every sheet describes the same data; the export spec checks the
 * result equals `GET /api/audits/:id/results`.
 */
export function snapshotResults(snapshot: AuditSnapshot, origin: SnapshotOrigin): AuditResults {
  const { dataset } = snapshot;
  return {
    auditId: origin.auditId,
    cycleId: origin.cycleId,
    frozenAt: origin.frozenAt,
    asOf: dataset.asOf,
    cohort: cohortCounts(dataset),
    thresholds: dataset.thresholds,
    schedule: dataset.schedule,
    summary: summariseDataset(dataset),
    groupBy: null,
    groups: [],
    standards: snapshot.standards.map((standard) => measuredStandard(standard, dataset)),
    reboundHistograms: dataset.schedule.map((interval) => reboundHistogram(dataset, interval.key)),
  };
}

/** As the results service: a standard whose interval left the schedule has no data rather than an error. */
function measuredStandard(standard: StandardView, dataset: AuditDataset): StandardResult {
  const isMeasurable = standard.intervalKey === null || dataset.schedule.some((interval) => interval.key === standard.intervalKey);
  if (!isMeasurable) return { standard, unit: STANDARD_METRIC_INFO[standard.metric].unit, observed: null, verdict: 'no-data' };
  return standardResult(standard, dataset);
}
