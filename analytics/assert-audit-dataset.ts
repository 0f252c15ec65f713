import type { AuditDataset } from '../shared/types/audit-dataset';
import { AnalyticsInputError } from './analytics-input-error';
import { assertArray } from './assert-array';
import { assertRecallSchedule } from './assert-recall-schedule';
import { isoDateToDayNumber } from './iso-date-to-day-number';
import { assertStabilityThresholds } from './stability-class';

/**
 * Checks the frame of an audit dataset: an object with an ISO `asOf` date, a valid
 * recall schedule ({@link assertRecallSchedule}), valid stability thresholds and
 * `records` / `cases` arrays. Rows are checked by the functions that read them, where
 * the message can name the field that is wrong.
 *
 * @param dataset the dataset to check
 * @param label name of the calling function, used in the error message
 * @throws {AnalyticsInputError} when any part of the frame is missing or malformed
 */
export function assertAuditDataset(dataset: AuditDataset, label: string): void {
  if (dataset === null || typeof dataset !== 'object') {
    throw new AnalyticsInputError(`${label}: dataset must be an object { asOf, schedule, thresholds, records, cases }`);
  }
  isoDateToDayNumber(dataset.asOf, `${label}: dataset.asOf`);
  assertRecallSchedule(dataset.schedule);
  assertStabilityThresholds(dataset.thresholds);
  assertArray(dataset.records, `${label}: dataset.records`);
  assertArray(dataset.cases, `${label}: dataset.cases`);
}
