import { describe, expect, it } from 'vitest';
import { AnalyticsInputError } from './analytics-input-error';
import { cohortCounts } from './cohort-counts';
import { groupDataset } from './group-dataset';
import { SMALL_AUDIT } from './small-audit-dataset.fixture';

describe('cohortCounts', () => {
  it('fixture: 5 cases (withdrawn 41 included), 3 patients, 10 sites (6 REF→GM + 4 papilla)', () => {
    expect(cohortCounts(SMALL_AUDIT)).toEqual({ cases: 5, patients: 3, sites: 10 });
  });

  it('counts distinct sites, not rows (site 111 has two visits)', () => {
    const firstTwoRowsOfSite111 = SMALL_AUDIT.records.filter((record) => record.siteId === 111);
    expect(firstTwoRowsOfSite111).toHaveLength(2);
    expect(cohortCounts({ ...SMALL_AUDIT, records: firstTwoRowsOfSite111 }).sites).toBe(1);
  });

  it('operator groups: cases and sites add up to the whole; a patient treated by two operators counts in both', () => {
    // Patient 3 has case 31 with operator 9 and case 41 with operator 7, so patients add to 4, not 3.
    const groups = groupDataset(SMALL_AUDIT, 'operator').map((group) => cohortCounts(group.dataset));
    expect(groups.reduce((sum, counts) => sum + counts.cases, 0)).toBe(5);
    expect(groups.reduce((sum, counts) => sum + counts.sites, 0)).toBe(10);
    expect(groups.reduce((sum, counts) => sum + counts.patients, 0)).toBe(4);
  });

  it('counts the patient of a row whose case is missing from cases', () => {
    const orphan = { ...SMALL_AUDIT.records[0], caseId: 900, patientId: 90, siteId: 9001 };
    expect(cohortCounts({ ...SMALL_AUDIT, records: [...SMALL_AUDIT.records, orphan] })).toEqual({ cases: 5, patients: 4, sites: 11 });
  });

  it('rejects a malformed dataset', () => {
    expect(() => cohortCounts({ ...SMALL_AUDIT, cases: JSON.parse('{}') })).toThrow(AnalyticsInputError);
  });
});
