import type { AuditCaseRecord, AuditDataset, OutcomeRecord, ResultsNarrowing } from '@tidemark/shared';
import { HttpError } from '../http-error';
import type { AuditSnapshot } from './audit-cycle.service';

/**
 * Who may narrow results to one operator (DESIGN.md §2): the audit lead and partners see every
 * operator by name, so any operator; a clinician sees peers only as letters, so only their own
 * cases; governance sees de-identified results, so no operator at all. Phenotype is open to every
 * reader. Call before anything is read from a cache shared between viewers.
 *
 * @throws {HttpError} 403 when the viewer may not narrow to the operator asked for
 */
export function assertMayNarrow(user: Express.User, narrowing: ResultsNarrowing): void {
  const { operatorId } = narrowing;
  if (operatorId === undefined || user.role === 'audit_lead' || user.role === 'partner') return;
  if (user.role === 'governance') throw HttpError.forbidden('Governance results are de-identified, so they cannot be narrowed to one operator.');
  if (operatorId !== user.id) throw HttpError.forbidden('Clinicians can narrow results to their own cases only.');
}

/** True when the narrowing leaves the cohort as it is. */
export function isWholeCohort(narrowing: ResultsNarrowing): boolean {
  return narrowing.phenotype === undefined && narrowing.operatorId === undefined;
}

/**
 * The part of a results-cache variant that names the narrowing: empty for the whole cohort, so
 * the cache keys of un-narrowed results stay as they were.
 */
export function narrowingVariant(narrowing: ResultsNarrowing): string {
  if (isWholeCohort(narrowing)) return '';
  return `|phenotype=${narrowing.phenotype ?? '*'}|operator=${narrowing.operatorId ?? '*'}`;
}

/**
 * The snapshot restricted to the cases that match. A case matches on its own phenotype and
 * operator; a row follows its case, or its own fields when its case is not in the dataset (the
 * rule groupDataset uses, so a narrowed view equals that group of a grouped one). Calibration
 * pairs are kept for the sites of the rows kept. Standards are unchanged: they are then evaluated
 * on the narrowed cohort.
 */
export function narrowSnapshot(snapshot: AuditSnapshot, narrowing: ResultsNarrowing): AuditSnapshot {
  if (isWholeCohort(narrowing)) return snapshot;
  const dataset = narrowDataset(snapshot.dataset, narrowing);
  const keptSites = new Set(dataset.records.map((record) => record.siteId));
  return { ...snapshot, dataset, calibrationPairs: snapshot.calibrationPairs.filter((pair) => keptSites.has(pair.siteId)) };
}

/** The dataset restricted to matching cases and their rows; asOf, schedule and thresholds stay. */
export function narrowDataset(dataset: AuditDataset, narrowing: ResultsNarrowing): AuditDataset {
  const matches = (row: Pick<AuditCaseRecord | OutcomeRecord, 'phenotype' | 'operatorId'>): boolean =>
    (narrowing.phenotype === undefined || row.phenotype === narrowing.phenotype) && (narrowing.operatorId === undefined || row.operatorId === narrowing.operatorId);
  const caseMatches = new Map(dataset.cases.map((found) => [found.caseId, matches(found)]));
  return {
    ...dataset,
    cases: dataset.cases.filter((found) => caseMatches.get(found.caseId)),
    records: dataset.records.filter((record) => caseMatches.get(record.caseId) ?? matches(record)),
  };
}

/** Every operator of a dataset, so operator letters follow the whole cohort whatever the narrowing. */
export function operatorIdsOf(dataset: AuditDataset): number[] {
  return [...new Set(dataset.cases.map((found) => found.operatorId))];
}
