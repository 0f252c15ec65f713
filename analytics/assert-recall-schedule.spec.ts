import { describe, expect, it } from 'vitest';
import { DEFAULT_RECALL_SCHEDULE } from '../shared/types/recall-schedule';
import { AnalyticsInputError } from './analytics-input-error';
import { assertRecallSchedule } from './assert-recall-schedule';

describe('assertRecallSchedule', () => {
  it('accepts the default schedule', () => {
    expect(() => assertRecallSchedule(DEFAULT_RECALL_SCHEDULE)).not.toThrow();
  });

  it('rejects empty schedules, duplicate keys and bad day counts', () => {
    const interval = { key: '6w', label: '6 weeks', targetDays: 42, windowBeforeDays: 7, windowAfterDays: 14 };
    expect(() => assertRecallSchedule([])).toThrow(/at least one interval/);
    expect(() => assertRecallSchedule([interval, interval])).toThrow(/'6w' twice/);
    expect(() => assertRecallSchedule([{ ...interval, key: '' }])).toThrow(AnalyticsInputError);
    expect(() => assertRecallSchedule([{ ...interval, targetDays: -1 }])).toThrow(/targetDays must be a non-negative integer/);
    expect(() => assertRecallSchedule([{ ...interval, windowAfterDays: 1.5 }])).toThrow(/windowAfterDays/);
  });
});
