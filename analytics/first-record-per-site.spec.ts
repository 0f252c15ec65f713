import { describe, expect, it } from 'vitest';
import type { OutcomeRecord } from '../shared/types/outcome-record';
import { AnalyticsInputError } from './analytics-input-error';
import { firstRecordPerSite } from './first-record-per-site';
import { auditCase, siteRecord } from './small-audit-dataset.fixture';

const OWNER = auditCase({ caseId: 1, patientId: 1, operatorId: 1, surgeryDate: '2024-01-01', procedure: 'gingivectomy', phenotype: 'thin', smoking: 'never' });
const row = (siteId: number, intervalKey: string, visitDate: string, recallRefGm: number | null) =>
  siteRecord(OWNER, { siteId, intervalKey, visitDate, baselineRefGm: 8, postOpRefGm: 10, recallRefGm });
const hasRecall = (record: OutcomeRecord) => record.recallRefGm !== null;

describe('firstRecordPerSite', () => {
  it('keeps one row per site at the interval: the earlier visit, skipping unmeasured rows and other intervals', () => {
    const records = [
      row(1, '6m', '2024-07-10', 9.5),
      row(1, '6m', '2024-07-01', 9), // earlier visit of site 1: this one counts
      row(2, '6m', '2024-07-01', null), // not measured: left out
      row(2, '6m', '2024-07-20', 8.5),
      row(3, '6w', '2024-02-12', 9), // another interval
    ];
    const kept = firstRecordPerSite(records, '6m', hasRecall, 'test');
    expect(kept.map((record) => [record.siteId, record.visitDate])).toEqual([[1, '2024-07-01'], [2, '2024-07-20']]);
  });

  it('keeps the first row when two visits share a date', () => {
    const kept = firstRecordPerSite([row(1, '6m', '2024-07-01', 9), row(1, '6m', '2024-07-01', 8)], '6m', hasRecall, 'test');
    expect(kept.map((record) => record.recallRefGm)).toEqual([9]);
  });

  it('rejects an invalid visit date of a kept row', () => {
    expect(() => firstRecordPerSite([row(1, '6m', '2024-13-01', 9)], '6m', hasRecall, 'test')).toThrow(AnalyticsInputError);
  });
});
