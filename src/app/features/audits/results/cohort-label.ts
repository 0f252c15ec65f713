import { PHENOTYPE_LABELS, type Phenotype } from '@tidemark/shared';
import type { OperatorChoice } from './operator-choices';

/** The cohort's name when the results are not narrowed. */
export const WHOLE_COHORT_LABEL = 'All cases';
/** The cohort's name when it is narrowed but the operator's name is not known yet. */
export const NARROWED_COHORT_LABEL = 'Narrowed cohort';

/**
 * Names the cohort the results show, in the narrowing filters' own wording: "All cases" when not
 * narrowed, else the chosen phenotype and/or operator joined by " · " (for example
 * "Thin (≤ 1 mm) · Wren Adeyemi"). While the operator's name is unknown the phenotype alone
 * would overstate the cohort, so it reads "Narrowed cohort" instead.
 */
export function cohortLabel(phenotype: Phenotype | null, operatorId: number | null, operatorChoices: readonly OperatorChoice[]): string {
  const operator = operatorId === null ? null : (operatorChoices.find((choice) => choice.id === operatorId)?.label ?? NARROWED_COHORT_LABEL);
  if (operator === NARROWED_COHORT_LABEL) return NARROWED_COHORT_LABEL;
  const parts = [phenotype === null ? null : PHENOTYPE_LABELS[phenotype], operator].filter((part): part is string => part !== null);
  return parts.length > 0 ? parts.join(' · ') : WHOLE_COHORT_LABEL;
}
