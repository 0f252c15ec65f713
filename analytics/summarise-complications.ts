import type { CaseOutcome, ClavienDindoGrade, ComplicationSummary } from '../shared/types/outcome-record';
import { AnalyticsInputError } from './analytics-input-error';
import { proportionEstimate } from './proportion-estimate';
import { assertArray } from './assert-array';

/** Clavien–Dindo grades in order of severity (Dindo D et al., Ann Surg 2004;240:205–213). */
const GRADES: readonly ClavienDindoGrade[] = ['I', 'II', 'IIIa', 'IIIb', 'IVa', 'IVb', 'V'];

/**
 * Complication rate per case with its Wilson 95% interval, and by Clavien–Dindo grade
 * and by type. A case counts once in a rate however many complications it had; the
 * denominator is every case in the cohort, withdrawn ones included (their surgery
 * happened). Rates per case rather than per site: complications belong to the operation.
 *
 * @param cases case-level outcomes
 * @returns { nCases, casesWithComplication, byGrade, byType } (byType sorted by count, then name)
 * @throws {AnalyticsInputError} on an unknown grade or a complication without a type
 */
export function summariseComplications(cases: readonly CaseOutcome[]): ComplicationSummary {
  assertArray(cases, 'summariseComplications: cases');
  let casesWithComplication = 0;
  const gradeComplications = new Map<ClavienDindoGrade, number>(GRADES.map((grade) => [grade, 0]));
  const gradeCases = new Map<ClavienDindoGrade, number>(GRADES.map((grade) => [grade, 0]));
  const byType = new Map<string, { complications: number; cases: number }>();
  cases.forEach((outcome, i) => {
    const complications = outcome.complications;
    assertArray(complications, `summariseComplications: cases[${i}].complications`);
    if (complications.length > 0) casesWithComplication++;
    const gradesInCase = new Set<ClavienDindoGrade>();
    const typesInCase = new Set<string>();
    complications.forEach(({ type, grade }, j) => {
      const gradeCount = gradeComplications.get(grade);
      if (gradeCount === undefined) {
        throw new AnalyticsInputError(
          `summariseComplications: cases[${i}].complications[${j}].grade must be one of ${GRADES.join(', ')}, got ${String(grade)}`,
        );
      }
      if (typeof type !== 'string' || type.length === 0) {
        throw new AnalyticsInputError(`summariseComplications: cases[${i}].complications[${j}].type must be a non-empty string`);
      }
      gradeComplications.set(grade, gradeCount + 1);
      gradesInCase.add(grade);
      const typeCounts = byType.get(type) ?? { complications: 0, cases: 0 };
      typeCounts.complications++;
      if (!typesInCase.has(type)) typeCounts.cases++;
      typesInCase.add(type);
      byType.set(type, typeCounts);
    });
    for (const grade of gradesInCase) gradeCases.set(grade, (gradeCases.get(grade) ?? 0) + 1);
  });
  return {
    nCases: cases.length,
    casesWithComplication: proportionEstimate(casesWithComplication, cases.length),
    byGrade: GRADES.map((grade) => ({
      grade,
      complications: gradeComplications.get(grade) ?? 0,
      cases: proportionEstimate(gradeCases.get(grade) ?? 0, cases.length),
    })),
    byType: [...byType.entries()]
      .map(([type, counts]) => ({ type, ...counts }))
      .sort((x, y) => y.complications - x.complications || x.type.localeCompare(y.type)),
  };
}
