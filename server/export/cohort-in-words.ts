import type { CohortDefinition } from '@tidemark/shared';
import { DIABETES_LABELS, INDICATION_LABELS, PHENOTYPE_LABELS, PROCEDURE_LABELS, REGION_LABELS, SMOKING_LABELS } from '@tidemark/shared';

const DAY_FORMAT = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'long', year: 'numeric', timeZone: 'UTC' });

/** `2024-01-05` → "5 January 2024" (no ISO form, so nothing looks like a record date). */
export function dayInWords(isoDate: string): string {
  return DAY_FORMAT.format(new Date(`${isoDate}T00:00:00Z`));
}

function listOf(keys: readonly string[], labels: Readonly<Record<string, string>>): string {
  return keys.map((key) => labels[key] ?? key).join('; ');
}

/**
 * The cohort definition in words for the front page: every filter that narrows it, or "every
 * operated case". Operators are named by their letter in this pack; one without cases in the
 * cohort has no letter and is counted instead.
 */
export function cohortInWords(cohort: CohortDefinition, operatorLetter: (operatorId: number) => string | null): string {
  const parts: string[] = [];
  if (cohort.surgeryFrom && cohort.surgeryTo) parts.push(`surgery from ${dayInWords(cohort.surgeryFrom)} to ${dayInWords(cohort.surgeryTo)}`);
  else if (cohort.surgeryFrom) parts.push(`surgery from ${dayInWords(cohort.surgeryFrom)}`);
  else if (cohort.surgeryTo) parts.push(`surgery until ${dayInWords(cohort.surgeryTo)}`);
  if (cohort.procedures.length) parts.push(`procedure: ${listOf(cohort.procedures, PROCEDURE_LABELS)}`);
  if (cohort.operatorIds.length) {
    const letters = cohort.operatorIds.map(operatorLetter).filter((letter): letter is string => letter !== null);
    const without = cohort.operatorIds.length - letters.length;
    const named = letters.map((letter) => `Operator ${letter}`).join(', ');
    parts.push(`operators: ${[named, without ? `${without} more without cases in the cohort` : ''].filter(Boolean).join('; ')}`);
  }
  if (cohort.phenotypes.length) parts.push(`phenotype: ${listOf(cohort.phenotypes, PHENOTYPE_LABELS)}`);
  if (cohort.indications.length) parts.push(`indication: ${listOf(cohort.indications, INDICATION_LABELS)}`);
  if (cohort.smoking.length) parts.push(`smoking: ${listOf(cohort.smoking, SMOKING_LABELS)}`);
  if (cohort.diabetes.length) parts.push(`diabetes: ${listOf(cohort.diabetes, DIABETES_LABELS)}`);
  if (cohort.regions.length) parts.push(`region: ${listOf(cohort.regions, REGION_LABELS)}`);
  if (cohort.teeth.length) parts.push(`teeth (FDI): ${[...cohort.teeth].sort((a, b) => a - b).join(', ')}`);
  const scope = 'Operated cases (planned cases never count; withdrawn cases count for complications and are left out of recall completion)';
  return parts.length ? `${scope}, limited to ${parts.join('; ')}.` : `${scope}: every operator, procedure and tooth.`;
}
