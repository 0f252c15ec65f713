import { describe, expect, it } from 'vitest';
import type { CaseOutcome } from '../shared/types/outcome-record';
import { AnalyticsInputError } from './analytics-input-error';
import { summariseComplications } from './summarise-complications';

function caseOutcome(caseId: number, complications: CaseOutcome['complications'], isWithdrawn = false): CaseOutcome {
  return { caseId, patientId: caseId, operatorId: 1, surgeryDate: '2024-01-10', isWithdrawn, complications, visits: [] };
}

// Invented test cases (not demo data); expected values computed by hand in the comments.
// Grades: Clavien–Dindo (Dindo D, Demartines N, Clavien PA, Ann Surg 2004;240:205–213).
const CASES: CaseOutcome[] = [
  caseOutcome(101, [{ type: 'pain beyond expected', grade: 'I' }, { type: 'bleeding', grade: 'II' }]),
  caseOutcome(102, []),
  caseOutcome(103, [{ type: 'infection', grade: 'II' }, { type: 'infection', grade: 'II' }]),
  caseOutcome(104, [{ type: 'bleeding', grade: 'I' }], true),
  caseOutcome(105, []),
  caseOutcome(106, []),
];

describe('summariseComplications', () => {
  it('rate per case: 3 of 6 cases (withdrawn included), Wilson interval', () => {
    const summary = summariseComplications(CASES);
    expect(summary.nCases).toBe(6);
    expect(summary.casesWithComplication).toMatchObject({ count: 3, n: 6, p: 0.5 });
    // Computed (hand calculation): Wilson 3/6, z = 1.959964: (6 + 3.841459 ± 1.959964·√(3.841459 + 6)) / (2·9.841459)
    // = (9.841459 ± 1.959964·3.137110)/19.682918 = (9.841459 ± 6.148637)/19.682918 → 0.187616 to 0.812384.
    expect(summary.casesWithComplication.lower).toBeCloseTo(0.187616, 5);
    expect(summary.casesWithComplication.upper).toBeCloseTo(0.812384, 5);
  });

  it('by grade: complications counted each, cases counted once', () => {
    const byGrade = summariseComplications(CASES).byGrade;
    expect(byGrade.map((g) => g.grade)).toEqual(['I', 'II', 'IIIa', 'IIIb', 'IVa', 'IVb', 'V']);
    expect(byGrade[0]).toMatchObject({ grade: 'I', complications: 2, cases: { count: 2, n: 6 } });
    expect(byGrade[1]).toMatchObject({ grade: 'II', complications: 3, cases: { count: 2, n: 6 } });
    expect(byGrade[2]).toMatchObject({ complications: 0, cases: { count: 0, n: 6, p: 0, lower: 0 } });
  });

  it('by type, most frequent first, then by name', () => {
    expect(summariseComplications(CASES).byType).toEqual([
      { type: 'bleeding', complications: 2, cases: 2 },
      { type: 'infection', complications: 2, cases: 1 },
      { type: 'pain beyond expected', complications: 1, cases: 1 },
    ]);
  });

  it('no cases: empty estimates rather than an error', () => {
    const summary = summariseComplications([]);
    expect(summary.casesWithComplication).toEqual({ count: 0, n: 0, p: null, lower: null, upper: null });
  });

  it('throws on an unknown grade or an empty type', () => {
    const badGrade: CaseOutcome[] = JSON.parse(
      '[{"caseId":1,"patientId":1,"operatorId":1,"surgeryDate":"2024-01-01","isWithdrawn":false,"visits":[],"complications":[{"type":"bleeding","grade":"VI"}]}]',
    );
    expect(() => summariseComplications(badGrade)).toThrow(/grade must be one of/);
    expect(() => summariseComplications([caseOutcome(1, [{ type: '', grade: 'I' }])])).toThrow(AnalyticsInputError);
  });
});
