import { describe, expect, it } from 'vitest';
import type { AuditDataset } from '../shared/types/audit-dataset';
import { AnalyticsInputError } from './analytics-input-error';
import { assertAuditDataset } from './assert-audit-dataset';
import { SMALL_AUDIT } from './small-audit-dataset.fixture';

describe('assertAuditDataset', () => {
  it('accepts a well-formed dataset', () => {
    expect(() => assertAuditDataset(SMALL_AUDIT, 'test')).not.toThrow();
  });

  it.each<[string, AuditDataset]>([
    ['an invalid asOf', { ...SMALL_AUDIT, asOf: '2024-02-30' }],
    ['an empty schedule', { ...SMALL_AUDIT, schedule: [] }],
    ['thresholds with relapse below stable', { ...SMALL_AUDIT, thresholds: { stable: 1, relapse: 0.5 } }],
  ])('rejects %s', (_, dataset) => {
    expect(() => assertAuditDataset(dataset, 'test')).toThrow(AnalyticsInputError);
  });

  it('rejects a dataset that is not an object and records that are not an array, naming the caller', () => {
    const parsed: AuditDataset = JSON.parse(JSON.stringify({ ...SMALL_AUDIT, records: 'none' }));
    expect(() => assertAuditDataset(parsed, 'monthlyTrend')).toThrow('monthlyTrend: dataset.records must be an array');
    const missing: AuditDataset = JSON.parse('null');
    expect(() => assertAuditDataset(missing, 'monthlyTrend')).toThrow(/monthlyTrend: dataset must be an object/);
  });
});
