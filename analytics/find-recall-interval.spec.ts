import { describe, expect, it } from 'vitest';
import { DEFAULT_RECALL_SCHEDULE } from '../shared/types/recall-schedule';
import { AnalyticsInputError } from './analytics-input-error';
import { findRecallInterval } from './find-recall-interval';

describe('findRecallInterval', () => {
  it('finds an interval by key (DEFAULT_RECALL_SCHEDULE: 6 months = 182 days)', () => {
    expect(findRecallInterval(DEFAULT_RECALL_SCHEDULE, '6m', 'test')).toMatchObject({ key: '6m', targetDays: 182 });
  });

  it('rejects an unknown key, listing the schedule', () => {
    expect(() => findRecallInterval(DEFAULT_RECALL_SCHEDULE, '9m', 'monthlyTrend')).toThrow(
      "monthlyTrend: unknown interval key '9m'; the schedule has '2w', '6w', '3m', '6m', '12m'",
    );
  });

  it('rejects an empty key', () => {
    expect(() => findRecallInterval(DEFAULT_RECALL_SCHEDULE, '', 'test')).toThrow(AnalyticsInputError);
  });
});
