import type { AuditDataset } from '../shared/types/audit-dataset';
import type { CohortPreview } from '../shared/types/audit-results';
import { assertAuditDataset } from './assert-audit-dataset';

/**
 * Size of an audit's cohort: distinct cases (withdrawn ones included), distinct
 * patients (of the cases, and of any row whose case is missing from `cases`) and
 * distinct sites with at least one recall row.
 *
 * @param dataset the audit dataset
 * @returns { cases, patients, sites }
 * @throws {AnalyticsInputError} when the dataset frame is malformed
 * @example
 * cohortCounts(dataset); // { cases: 5, patients: 3, sites: 10 }
 */
export function cohortCounts(dataset: AuditDataset): CohortPreview {
  assertAuditDataset(dataset, 'cohortCounts');
  const caseIds = new Set<number>();
  const patientIds = new Set<number>();
  const siteIds = new Set<number>();
  for (const outcome of dataset.cases) {
    caseIds.add(outcome.caseId);
    patientIds.add(outcome.patientId);
  }
  for (const record of dataset.records) {
    patientIds.add(record.patientId);
    siteIds.add(record.siteId);
  }
  return { cases: caseIds.size, patients: patientIds.size, sites: siteIds.size };
}
