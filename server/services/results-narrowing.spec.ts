import { groupDataset } from '@tidemark/analytics';
import { SMALL_AUDIT, auditCase, siteRecord } from '../../analytics/small-audit-dataset.fixture';
import type { AuditSnapshot } from './audit-cycle.service';
import { assertMayNarrow, narrowDataset, narrowSnapshot, narrowingVariant, operatorIdsOf } from './results-narrowing';

/*
 * SMALL_AUDIT (analytics/small-audit-dataset.fixture.ts): operator 7 has cases 11, 12 (thin) and
 * 41 (thick); operator 9 has cases 21 and 31 (thick). Rows: 111 ×2, 112 ×2, 113, 121 (operator 7,
 * thin); 211 ×2, 212 ×2, 213, 214 (case 21); 311, 313 (case 31).
 */

const viewer = (role: Express.User['role'], id = 7): Express.User => ({ id, role, email: `${role}@example.org`, displayName: role });
const caseIds = (narrowed: { cases: readonly { caseId: number }[] }) => narrowed.cases.map((found) => found.caseId);
const siteIds = (narrowed: { records: readonly { siteId: number }[] }) => [...new Set(narrowed.records.map((record) => record.siteId))];

describe('narrowDataset', () => {
  it('keeps the cases of one phenotype, one operator, or both, with their rows', () => {
    expect(caseIds(narrowDataset(SMALL_AUDIT, { phenotype: 'thin' }))).toEqual([11, 12]);
    expect(caseIds(narrowDataset(SMALL_AUDIT, { operatorId: 9 }))).toEqual([21, 31]);
    const thick7 = narrowDataset(SMALL_AUDIT, { phenotype: 'thick', operatorId: 7 });
    // Case 41 is withdrawn without visits: the case stays (it counts for recall and complications), no rows.
    expect([caseIds(thick7), thick7.records.length]).toEqual([[41], 0]);
    expect(siteIds(narrowDataset(SMALL_AUDIT, { operatorId: 9 })).sort()).toEqual([211, 212, 213, 214, 311, 313]);
  });

  it('equals the matching group of groupDataset for every phenotype and operator', () => {
    for (const group of groupDataset(SMALL_AUDIT, 'phenotype')) {
      expect(narrowDataset(SMALL_AUDIT, { phenotype: group.key === 'thin' ? 'thin' : 'thick' })).toEqual(group.dataset);
    }
    for (const group of groupDataset(SMALL_AUDIT, 'operator')) {
      expect(narrowDataset(SMALL_AUDIT, { operatorId: Number(group.key) })).toEqual(group.dataset);
    }
  });

  it('lets a row follow its case, and a row without its case its own fields', () => {
    const owner = SMALL_AUDIT.cases[0];
    const stray = auditCase({ caseId: 500, patientId: 50, operatorId: 3, surgeryDate: '2024-01-01', procedure: 'other', phenotype: 'thin', smoking: 'never' });
    const reading = { intervalKey: '6m', visitDate: '2024-07-01', baselineRefGm: 8, postOpRefGm: 10, recallRefGm: 9 };
    const records = [{ ...siteRecord(owner, { siteId: 1, ...reading }), operatorId: 3 }, siteRecord(stray, { siteId: 2, ...reading })];
    const narrowed = narrowDataset({ ...SMALL_AUDIT, cases: [owner], records }, { operatorId: 3 });
    expect([caseIds(narrowed), siteIds(narrowed)]).toEqual([[], [2]]);
  });

  it('keeps asOf, schedule and thresholds, and returns the snapshot itself when nothing narrows', () => {
    expect(narrowDataset(SMALL_AUDIT, { phenotype: 'thin' })).toMatchObject({ asOf: SMALL_AUDIT.asOf, schedule: SMALL_AUDIT.schedule, thresholds: SMALL_AUDIT.thresholds });
    const snapshot: AuditSnapshot = { dataset: SMALL_AUDIT, standards: [], calibrationPairs: [] };
    expect(narrowSnapshot(snapshot, {})).toBe(snapshot);
  });
});

describe('narrowSnapshot', () => {
  it('keeps calibration pairs of the kept sites only', () => {
    const pair = (siteId: number) => ({ siteId, measuredOn: '2024-07-15', first: 9, second: 9.5, isSameExaminer: false });
    const snapshot: AuditSnapshot = { dataset: SMALL_AUDIT, standards: [], calibrationPairs: [pair(111), pair(211), pair(311)] };
    expect(narrowSnapshot(snapshot, { operatorId: 9 }).calibrationPairs.map((kept) => kept.siteId)).toEqual([211, 311]);
  });
});

describe('assertMayNarrow (DESIGN.md §2)', () => {
  it('lets the audit lead and partners narrow to any operator', () => {
    expect(() => assertMayNarrow(viewer('audit_lead'), { operatorId: 9 })).not.toThrow();
    expect(() => assertMayNarrow(viewer('partner'), { operatorId: 9, phenotype: 'thin' })).not.toThrow();
  });

  it('lets a clinician narrow to their own cases only, and governance to no operator', () => {
    expect(() => assertMayNarrow(viewer('clinician', 7), { operatorId: 7 })).not.toThrow();
    expect(() => assertMayNarrow(viewer('clinician', 7), { operatorId: 9 })).toThrow(expect.objectContaining({ status: 403, message: expect.stringMatching(/own cases/) }));
    expect(() => assertMayNarrow(viewer('governance'), { operatorId: 9 })).toThrow(expect.objectContaining({ status: 403, message: expect.stringMatching(/de-identified/) }));
  });

  it('lets every reader narrow by phenotype', () => {
    for (const role of ['clinician', 'governance', 'partner', 'audit_lead'] as const) expect(() => assertMayNarrow(viewer(role), { phenotype: 'thick' })).not.toThrow();
  });
});

describe('narrowingVariant and operatorIdsOf', () => {
  it('adds nothing to the cache key for the whole cohort, and names both filters otherwise', () => {
    expect(narrowingVariant({})).toBe('');
    expect(narrowingVariant({ phenotype: 'thin' })).toBe('|phenotype=thin|operator=*');
    expect(narrowingVariant({ operatorId: 9 })).toBe('|phenotype=*|operator=9');
  });

  it('lists every operator once', () => {
    expect(operatorIdsOf(SMALL_AUDIT)).toEqual([7, 9]);
  });
});
