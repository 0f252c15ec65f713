import type { OutcomeRecord } from '../shared/types/outcome-record';
import { AnalyticsInputError } from './analytics-input-error';
import { isoDateToDayNumber } from './iso-date-to-day-number';

/**
 * The records of one recall interval that carry the measurement asked for, one per
 * site: when a site was measured twice for the same interval, the earlier visit
 * counts (ties: the first row), as in recall completion ("the first visit for an
 * interval is the one that counts", {@link summariseRecallCompletion}). Keeps the
 * order in which sites first appear.
 *
 * @param records one row per site per visit
 * @param intervalKey the interval kept
 * @param isMeasured whether a row carries the measurement (e.g. post-op and recall REF→GM)
 * @param label name of the calling function, used in the error message
 * @returns at most one record per site
 * @throws {AnalyticsInputError} when a kept row is not an object or has an invalid visit date
 */
export function firstRecordPerSite(
  records: readonly OutcomeRecord[],
  intervalKey: string,
  isMeasured: (record: OutcomeRecord) => boolean,
  label: string,
): OutcomeRecord[] {
  const bySite = new Map<number, OutcomeRecord>();
  records.forEach((record, i) => {
    if (record === null || typeof record !== 'object') {
      throw new AnalyticsInputError(`${label}: records[${i}] must be a record object`);
    }
    if (record.intervalKey !== intervalKey || !isMeasured(record)) return;
    isoDateToDayNumber(record.visitDate, `${label}: records[${i}].visitDate`);
    const kept = bySite.get(record.siteId);
    // ISO dates compare correctly as text.
    if (kept === undefined || record.visitDate < kept.visitDate) bySite.set(record.siteId, record);
  });
  return [...bySite.values()];
}
