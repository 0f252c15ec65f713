import type { AuditCaseRecord, AuditDataset } from '../shared/types/audit-dataset';
import { GROUP_BY_OPTIONS, type GroupBy } from '../shared/types/audit-results';
import type { OutcomeRecord } from '../shared/types/outcome-record';
import { AnalyticsInputError } from './analytics-input-error';
import { assertAuditDataset } from './assert-audit-dataset';

/** One subgroup of an audit dataset. */
export interface AuditDatasetGroup {
  /** operatorId as text, or the procedure / phenotype / indication / smoking key. */
  readonly key: string;
  readonly dataset: AuditDataset;
}

/** Key of rows whose own subgroup field is empty and whose case is not in the dataset. */
export const NOT_RECORDED_KEY = 'not-recorded';

/**
 * Splits an audit dataset into subgroups by operator, procedure, phenotype, indication
 * or smoking status (DESIGN.md §1.5: review by operator, phenotype and procedure).
 * A case's key comes from the case; a record takes its case's key (so the case and its
 * rows never part), or its own field when its case is not in `cases`. Each group keeps
 * the dataset's asOf, schedule and thresholds, and its rows and cases in input order.
 * Groups are sorted by key: numerically when both keys are whole numbers (operator ids),
 * otherwise by code unit; groups with no case or row do not appear.
 *
 * @param dataset the audit dataset
 * @param groupBy 'operator' | 'procedure' | 'phenotype' | 'indication' | 'smoking'
 * @returns [{ key, dataset }] sorted by key
 * @throws {AnalyticsInputError} on an unknown groupBy, a case id listed twice or a case without its group field
 * @example
 * groupDataset(dataset, 'operator').map((group) => group.key); // ['7', '9', '12']
 */
export function groupDataset(dataset: AuditDataset, groupBy: GroupBy): AuditDatasetGroup[] {
  assertAuditDataset(dataset, 'groupDataset');
  if (!GROUP_BY_OPTIONS.includes(groupBy)) {
    throw new AnalyticsInputError(`groupDataset: groupBy must be one of ${GROUP_BY_OPTIONS.join(', ')}, got ${String(groupBy)}`);
  }
  const keyOfCase = new Map<number, string>();
  const groups = new Map<string, { records: OutcomeRecord[]; cases: AuditCaseRecord[] }>();
  const groupFor = (key: string) => {
    let group = groups.get(key);
    if (group === undefined) {
      group = { records: [], cases: [] };
      groups.set(key, group);
    }
    return group;
  };
  dataset.cases.forEach((outcome, i) => {
    if (keyOfCase.has(outcome.caseId)) throw new AnalyticsInputError(`groupDataset: case ${outcome.caseId} appears twice`);
    const key = fieldKey(outcome, groupBy);
    if (key === null) throw new AnalyticsInputError(`groupDataset: cases[${i}] (case ${outcome.caseId}) has no ${groupBy}`);
    keyOfCase.set(outcome.caseId, key);
    groupFor(key).cases.push(outcome);
  });
  for (const record of dataset.records) {
    groupFor(keyOfCase.get(record.caseId) ?? fieldKey(record, groupBy) ?? NOT_RECORDED_KEY).records.push(record);
  }
  const { asOf, schedule, thresholds } = dataset;
  return [...groups.entries()]
    .sort(([a], [b]) => compareKeys(a, b))
    .map(([key, group]) => ({ key, dataset: { asOf, schedule, thresholds, records: group.records, cases: group.cases } }));
}

/** The subgroup field of a case or a row as text; null when it is empty. */
function fieldKey(row: OutcomeRecord | AuditCaseRecord, groupBy: GroupBy): string | null {
  const value = groupBy === 'operator' ? row.operatorId : row[groupBy];
  if (typeof value === 'number' && Number.isFinite(value)) return String(value);
  return typeof value === 'string' && value.length > 0 ? value : null;
}

const WHOLE_NUMBER = /^-?\d+$/;

/** Whole numbers numerically ('7' < '12'), anything else by code unit. */
function compareKeys(a: string, b: string): number {
  if (WHOLE_NUMBER.test(a) && WHOLE_NUMBER.test(b)) return Number(a) - Number(b);
  return a < b ? -1 : a > b ? 1 : 0;
}
