import type { RecallInterval } from '../shared/types/outcome-record';
import { AnalyticsInputError } from './analytics-input-error';

/**
 * The interval of a recall schedule with the given key.
 *
 * @param schedule the audit's recall schedule (already validated)
 * @param intervalKey the key asked for, e.g. '6m'
 * @param label name of the calling function, used in the error message
 * @returns the matching {@link RecallInterval}
 * @throws {AnalyticsInputError} when the key is not a non-empty string or is not in the schedule
 * @example
 * findRecallInterval(DEFAULT_RECALL_SCHEDULE, '6m', 'monthlyTrend').targetDays; // 182
 */
export function findRecallInterval(schedule: readonly RecallInterval[], intervalKey: string, label: string): RecallInterval {
  if (typeof intervalKey !== 'string' || intervalKey.length === 0) {
    throw new AnalyticsInputError(`${label}: an interval key is needed, got ${String(intervalKey)}`);
  }
  const interval = schedule.find((candidate) => candidate.key === intervalKey);
  if (interval === undefined) {
    const known = schedule.map((candidate) => `'${candidate.key}'`).join(', ');
    throw new AnalyticsInputError(`${label}: unknown interval key '${intervalKey}'; the schedule has ${known}`);
  }
  return interval;
}
