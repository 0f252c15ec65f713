import type { RecallInterval } from './outcome-record';

/**
 * Default recall schedule (DESIGN.md §1.3): 2 weeks, 6 weeks, 3, 6 and 12 months,
 * each with a tolerance window in days before and after the target.
 */
export const DEFAULT_RECALL_SCHEDULE: readonly RecallInterval[] = [
  { key: '2w', label: '2 weeks', targetDays: 14, windowBeforeDays: 3, windowAfterDays: 7 },
  { key: '6w', label: '6 weeks', targetDays: 42, windowBeforeDays: 7, windowAfterDays: 14 },
  { key: '3m', label: '3 months', targetDays: 91, windowBeforeDays: 14, windowAfterDays: 21 },
  { key: '6m', label: '6 months', targetDays: 182, windowBeforeDays: 21, windowAfterDays: 30 },
  { key: '12m', label: '12 months', targetDays: 365, windowBeforeDays: 30, windowAfterDays: 60 },
];
