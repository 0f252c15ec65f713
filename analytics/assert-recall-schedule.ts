import type { RecallInterval } from '../shared/types/outcome-record';
import { AnalyticsInputError } from './analytics-input-error';
import { assertArray } from './assert-array';

/**
 * Checks a recall schedule: at least one interval, unique non-empty keys, and
 * non-negative integer target and window days.
 *
 * @param schedule the intervals
 * @throws {AnalyticsInputError} when the schedule is empty or an interval is malformed
 */
export function assertRecallSchedule(schedule: readonly RecallInterval[]): void {
  assertArray(schedule, 'recall schedule');
  if (schedule.length === 0) {
    throw new AnalyticsInputError('recall schedule must list at least one interval');
  }
  const keys = new Set<string>();
  schedule.forEach((interval, i) => {
    const { key, targetDays, windowBeforeDays, windowAfterDays } = interval ?? {};
    if (typeof key !== 'string' || key.length === 0) {
      throw new AnalyticsInputError(`recall schedule[${i}].key must be a non-empty string`);
    }
    if (keys.has(key)) throw new AnalyticsInputError(`recall schedule has the key '${key}' twice`);
    keys.add(key);
    for (const [name, days] of Object.entries({ targetDays, windowBeforeDays, windowAfterDays })) {
      if (typeof days !== 'number' || !Number.isInteger(days) || days < 0) {
        throw new AnalyticsInputError(`recall schedule '${key}': ${name} must be a non-negative integer, got ${String(days)}`);
      }
    }
  });
}
