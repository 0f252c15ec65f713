import {
  DIABETES_LABELS,
  INDICATION_LABELS,
  PHENOTYPE_LABELS,
  PROCEDURE_LABELS,
  REGION_LABELS,
  SMOKING_LABELS,
  type CohortDefinition,
} from '@tidemark/shared';
import { formatLocalDate } from '../../shared/dates/local-date';

/** One filter of a cohort in words: what it is about, and what it keeps. */
export interface CohortClause {
  readonly dimension: string;
  readonly words: string;
}

/**
 * How operators are named in a cohort description: by name for those who may see names,
 * else only counted (governance sees de-identified results; clinicians see peers anonymised).
 */
export type OperatorNaming = { readonly names: ReadonlyMap<number, string> } | { readonly selfId: number | null };

/**
 * A cohort definition in words, one clause per filter in use (an empty filter means "any").
 * No clause at all means every case in the practice.
 */
export function describeCohort(cohort: CohortDefinition, naming: OperatorNaming, locale: string): CohortClause[] {
  const date = (value: string): string => formatLocalDate(value, 'date', locale);
  const list = (words: readonly string[]): string => words.join(', ');
  const clauses: CohortClause[] = [];
  if (cohort.surgeryFrom && cohort.surgeryTo) {
    clauses.push({ dimension: 'Surgery dates', words: `${date(cohort.surgeryFrom)} to ${date(cohort.surgeryTo)}` });
  } else if (cohort.surgeryFrom) {
    clauses.push({ dimension: 'Surgery dates', words: `from ${date(cohort.surgeryFrom)}` });
  } else if (cohort.surgeryTo) {
    clauses.push({ dimension: 'Surgery dates', words: `until ${date(cohort.surgeryTo)}` });
  }
  if (cohort.procedures.length) clauses.push({ dimension: 'Procedure', words: list(cohort.procedures.map((key) => PROCEDURE_LABELS[key])) });
  if (cohort.operatorIds.length) clauses.push({ dimension: 'Operators', words: operatorWords(cohort.operatorIds, naming) });
  if (cohort.phenotypes.length) clauses.push({ dimension: 'Phenotype', words: list(cohort.phenotypes.map((key) => PHENOTYPE_LABELS[key])) });
  if (cohort.indications.length) clauses.push({ dimension: 'Indication', words: list(cohort.indications.map((key) => INDICATION_LABELS[key])) });
  if (cohort.smoking.length) clauses.push({ dimension: 'Smoking', words: list(cohort.smoking.map((key) => SMOKING_LABELS[key])) });
  if (cohort.diabetes.length) clauses.push({ dimension: 'Diabetes', words: list(cohort.diabetes.map((key) => DIABETES_LABELS[key])) });
  if (cohort.regions.length) clauses.push({ dimension: 'Region', words: list(cohort.regions.map((key) => REGION_LABELS[key])) });
  if (cohort.teeth.length) clauses.push({ dimension: 'Teeth (FDI)', words: list([...cohort.teeth].sort((a, b) => a - b).map(String)) });
  return clauses;
}

/** The whole cohort in one line, for lists and cards. */
export function cohortSentence(clauses: readonly CohortClause[]): string {
  return clauses.length === 0 ? 'Every case in the practice' : clauses.map((clause) => `${clause.dimension}: ${clause.words}`).join(' · ');
}

function operatorWords(ids: readonly number[], naming: OperatorNaming): string {
  if ('names' in naming) {
    return ids.map((id) => naming.names.get(id) ?? `Operator #${id}`).join(', ');
  }
  const count = ids.length === 1 ? '1 operator' : `${ids.length} operators`;
  return naming.selfId !== null && ids.includes(naming.selfId) ? `${count}, including you` : count;
}
