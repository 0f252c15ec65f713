import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { AuditCaseRecord } from '../shared/types/audit-dataset';
import { GROUP_BY_OPTIONS, type GroupBy } from '../shared/types/audit-results';
import { AnalyticsInputError } from './analytics-input-error';
import { NOT_RECORDED_KEY, groupDataset } from './group-dataset';
import { SMALL_AUDIT, auditCase, siteRecord } from './small-audit-dataset.fixture';

const keysAndSizes = (groupBy: GroupBy) =>
  groupDataset(SMALL_AUDIT, groupBy).map(({ key, dataset }) => [key, dataset.cases.map((outcome) => outcome.caseId), dataset.records.length]);

describe('groupDataset', () => {
  /*
   * Fixture table: operator 7 has cases 11, 12, 41 (rows: 111 ×2, 112 ×2, 121, 113 = 6);
   * operator 9 has cases 21, 31 (rows: 211 ×2, 212 ×2, 311, 213, 214, 313 = 8).
   */
  it('by operator: keys are operator ids as text, each case with its own rows', () => {
    expect(keysAndSizes('operator')).toEqual([['7', [11, 12, 41], 6], ['9', [21, 31], 8]]);
  });

  it('by phenotype, procedure and smoking: keys are the stored vocabulary, sorted', () => {
    expect(keysAndSizes('phenotype')).toEqual([['thick', [21, 31, 41], 8], ['thin', [11, 12], 6]]);
    expect(keysAndSizes('procedure')).toEqual([
      ['apf-osseous-recontouring', [12], 1],
      ['apically-positioned-flap', [21], 6],
      ['gingivectomy', [11, 31, 41], 7],
    ]);
    expect(keysAndSizes('smoking')).toEqual([['current', [21], 6], ['former', [31, 41], 2], ['never', [11, 12], 6]]);
  });

  it('sorts operator ids numerically (12 after 9), keeps asOf, schedule and thresholds', () => {
    const owner = auditCase({ caseId: 99, patientId: 9, operatorId: 12, surgeryDate: '2024-05-01', procedure: 'gingivectomy', phenotype: 'thin', smoking: 'never' });
    const groups = groupDataset({ ...SMALL_AUDIT, cases: [...SMALL_AUDIT.cases, owner] }, 'operator');
    expect(groups.map((group) => group.key)).toEqual(['7', '9', '12']);
    expect(groups[2].dataset).toMatchObject({ asOf: SMALL_AUDIT.asOf, schedule: SMALL_AUDIT.schedule, thresholds: SMALL_AUDIT.thresholds });
  });

  it('a row follows its case even when its own field disagrees; a row without a case uses its own field', () => {
    const owner = SMALL_AUDIT.cases[0];
    const stray = auditCase({ caseId: 500, patientId: 50, operatorId: 3, surgeryDate: '2024-01-01', procedure: 'other', phenotype: 'thin', smoking: 'never' });
    const records = [
      { ...siteRecord(owner, { siteId: 1, intervalKey: '6m', visitDate: '2024-07-15', baselineRefGm: 8, postOpRefGm: 10, recallRefGm: 9 }), operatorId: 99 },
      siteRecord(stray, { siteId: 2, intervalKey: '6m', visitDate: '2024-07-01', baselineRefGm: 8, postOpRefGm: 10, recallRefGm: 9 }),
      { ...siteRecord(stray, { siteId: 3, intervalKey: '6m', visitDate: '2024-07-01', baselineRefGm: 8, postOpRefGm: 10, recallRefGm: 9 }), smoking: null },
    ];
    const dataset = { ...SMALL_AUDIT, records, cases: [owner] };
    expect(groupDataset(dataset, 'operator').map((group) => [group.key, group.dataset.records.map((record) => record.siteId)])).toEqual([['3', [2, 3]], ['7', [1]]]);
    expect(groupDataset(dataset, 'smoking').map((group) => group.key)).toEqual(['never', NOT_RECORDED_KEY]);
  });

  it('partitions: every case and row lands in exactly one group (property, any grouping)', () => {
    const caseArbitrary = fc.record({
      operatorId: fc.integer({ min: 1, max: 12 }),
      phenotype: fc.constantFrom<AuditCaseRecord['phenotype']>('thin', 'thick'),
      smoking: fc.constantFrom<AuditCaseRecord['smoking']>('never', 'former', 'current'),
      procedure: fc.constantFrom<AuditCaseRecord['procedure']>('gingivectomy', 'apically-positioned-flap', 'other'),
      sites: fc.integer({ min: 0, max: 3 }),
    });
    fc.assert(
      fc.property(fc.array(caseArbitrary, { maxLength: 12 }), fc.constantFrom(...GROUP_BY_OPTIONS), (drawn, groupBy) => {
        const cases = drawn.map((fields, i) => auditCase({ ...fields, caseId: i + 1, patientId: i + 1, surgeryDate: '2024-01-01' }));
        const records = cases.flatMap((owner, i) =>
          Array.from({ length: drawn[i].sites }, (_, s) =>
            siteRecord(owner, { siteId: owner.caseId * 10 + s, intervalKey: '6m', visitDate: '2024-07-01', baselineRefGm: 8, postOpRefGm: 10, recallRefGm: 9 }),
          ),
        );
        const groups = groupDataset({ ...SMALL_AUDIT, cases, records }, groupBy);
        const groupedCases = groups.flatMap((group) => group.dataset.cases.map((outcome) => outcome.caseId));
        const groupedRows = groups.flatMap((group) => group.dataset.records.map((record) => record.siteId));
        expect([...groupedCases].sort((a, b) => a - b)).toEqual(cases.map((outcome) => outcome.caseId));
        expect([...groupedRows].sort((a, b) => a - b)).toEqual(records.map((record) => record.siteId).sort((a, b) => a - b));
        expect(new Set(groups.map((group) => group.key)).size).toBe(groups.length);
        for (const group of groups) {
          const caseIds = new Set(group.dataset.cases.map((outcome) => outcome.caseId));
          expect(group.dataset.records.every((record) => caseIds.has(record.caseId))).toBe(true);
        }
      }),
    );
  });

  it('rejects an unknown grouping and a case listed twice', () => {
    expect(() => groupDataset(SMALL_AUDIT, JSON.parse('"tooth"'))).toThrow(/groupBy must be one of operator, procedure/);
    expect(() => groupDataset({ ...SMALL_AUDIT, cases: [SMALL_AUDIT.cases[0], SMALL_AUDIT.cases[0]] }, 'operator')).toThrow(AnalyticsInputError);
  });
});
